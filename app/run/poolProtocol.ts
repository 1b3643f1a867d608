/**
 * The messages between the pool (main thread) and a pool worker. Inputs travel in batches to keep
 * the number of messages low; outcomes come back one per item so the pool always knows which item
 * a worker is on (the one to blame when the worker dies or hangs) and progress moves item by item.
 */

/** Given to each worker at start: which module and export hold the per-item function. */
export interface PoolWorkerData {
  taskModule: string;
  taskExport: string;
}

export type ToWorker<TIn> = { type: 'batch'; items: { index: number; input: TIn }[] };

export type FromWorker<TOut> =
  | { type: 'ready' }
  | { type: 'item'; index: number; ok: true; value: TOut; ms: number }
  | { type: 'item'; index: number; ok: false; error: string; ms: number };
