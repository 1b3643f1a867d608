/**
 * A pool of worker threads over one per-item function (`export function f(input): output` in a
 * module of its own). The main thread hands out batches of item indices and gathers one outcome per
 * item; it never runs the function itself.
 *
 * Isolation, item by item:
 * - the function throws on an item → that item's outcome is `{ ok: false, kind: 'threw' }`, the
 *   worker goes on with its next item;
 * - the worker thread dies on an item (exit, out of memory, an uncaught async error) → that item is
 *   `kind: 'worker-died'`, the rest of its batches go back to the queue, and a new worker replaces it;
 * - the worker stays silent on one item longer than `itemTimeoutMs` → it is terminated, the item is
 *   `kind: 'timeout'`, and likewise replaced.
 * A worker that fails to load its module, or more replacements than `maxWorkerRestarts`, fails the
 * whole pool (the error is systemic, not the item's). `cancel()` terminates every worker at once.
 */
import { availableParallelism } from 'node:os';
import type { Worker } from 'node:worker_threads';
import type { FromWorker, PoolWorkerData, ToWorker } from './poolProtocol';
import { siblingModule, startTsWorker } from './tsWorker';

export type PoolOutcome<TOut> =
  | { index: number; ok: true; value: TOut; ms: number }
  | { index: number; ok: false; kind: 'threw' | 'worker-died' | 'timeout'; error: string; ms: number };

export interface PoolOptions<TIn, TOut> {
  /** Module holding the per-item function (a .ts file is loaded through tsx inside the worker). */
  taskModule: URL;
  taskExport: string;
  /** Number of items. */
  count: number;
  /** The input of item `index`, built when it is dispatched (so inputs need not all sit in memory). */
  input: (index: number) => TIn;
  onOutcome: (outcome: PoolOutcome<TOut>) => void;
  /** Default: the machine's cores (at least 1). */
  workers?: number;
  /** Items per message; default from the count so that each worker gets about 20 batches, 1–50. */
  batchSize?: number;
  /** Default 120 s: a single item taking this long is treated as hung. */
  itemTimeoutMs?: number;
  /** Default 8 + count / 100. */
  maxWorkerRestarts?: number;
}

export interface PoolHandle {
  /** Resolves when every item has its outcome ('done') or after cancel ('cancelled'); rejects on a systemic failure. */
  done: Promise<'done' | 'cancelled'>;
  cancel(): void;
  /** Workers started so far, replacements included. */
  readonly workersStarted: number;
}

interface Slot {
  worker: Worker;
  ready: boolean;
  /** Indices sent and not yet answered, in the order the worker will take them. */
  pending: number[];
  /** Batches sent and not fully answered. */
  batches: number[];
  lastActivity: number;
  lastError: string | null;
  retired: boolean;
}

const IN_FLIGHT_BATCHES = 2;

export function runPool<TIn, TOut>(options: PoolOptions<TIn, TOut>): PoolHandle {
  const count = options.count;
  const workers = Math.max(1, Math.min(options.workers ?? availableParallelism(), Math.max(1, count)));
  const batchSize = options.batchSize ?? Math.max(1, Math.min(50, Math.ceil(count / (workers * 20))));
  const itemTimeoutMs = options.itemTimeoutMs ?? 120_000;
  const maxRestarts = options.maxWorkerRestarts ?? 8 + Math.floor(count / 100);
  const data: PoolWorkerData = { taskModule: options.taskModule.href, taskExport: options.taskExport };
  const workerEntry = siblingModule('poolWorker', import.meta.url);

  /** Indices waiting to be sent: retried ones first (a stack at the front), then the rest in order. */
  const retry: number[] = [];
  let nextFresh = 0;
  let answered = 0;
  let started = 0;
  let restarts = 0;
  let finished = false;
  const slots = new Set<Slot>();
  let watchdog: NodeJS.Timeout | null = null;

  let resolveDone!: (v: 'done' | 'cancelled') => void;
  let rejectDone!: (e: Error) => void;
  const done = new Promise<'done' | 'cancelled'>((res, rej) => {
    resolveDone = res;
    rejectDone = rej;
  });

  const finish = (result: 'done' | 'cancelled' | Error) => {
    if (finished) return;
    finished = true;
    if (watchdog) clearInterval(watchdog);
    for (const s of slots) {
      s.retired = true;
      void s.worker.terminate();
    }
    slots.clear();
    if (result instanceof Error) rejectDone(result);
    else resolveDone(result);
  };

  const takeBatch = (): number[] => {
    // A retried item goes alone, so that a second death points at exactly one item.
    if (retry.length > 0) return [retry.pop()!];
    const batch: number[] = [];
    while (batch.length < batchSize && nextFresh < count) batch.push(nextFresh++);
    return batch;
  };

  const feed = (slot: Slot) => {
    while (!finished && slot.ready && !slot.retired && slot.batches.length < IN_FLIGHT_BATCHES) {
      const indices = takeBatch();
      if (indices.length === 0) return;
      let items: { index: number; input: TIn }[];
      try {
        items = indices.map((index) => ({ index, input: options.input(index) }));
      } catch (err) {
        finish(err instanceof Error ? err : new Error(String(err)));
        return;
      }
      if (slot.pending.length === 0) slot.lastActivity = Date.now();
      slot.pending.push(...indices);
      slot.batches.push(indices.length);
      slot.worker.postMessage({ type: 'batch', items } satisfies ToWorker<TIn>);
    }
  };

  const record = (outcome: PoolOutcome<TOut>) => {
    answered++;
    try {
      options.onOutcome(outcome);
    } catch (err) {
      finish(err instanceof Error ? err : new Error(String(err)));
      return;
    }
    if (answered === count) finish('done');
  };

  /** The slot's worker is gone (died or killed for hanging): blame its current item, requeue the rest. */
  const lose = (slot: Slot, kind: 'worker-died' | 'timeout', error: string) => {
    if (slot.retired || finished) return;
    slot.retired = true;
    slots.delete(slot);
    if (!slot.ready) {
      finish(new Error(`planning worker failed to start: ${error}`));
      return;
    }
    const [culprit, ...rest] = slot.pending;
    for (let i = rest.length - 1; i >= 0; i--) retry.push(rest[i]);
    if (culprit !== undefined)
      record({ index: culprit, ok: false, kind, error, ms: Date.now() - slot.lastActivity });
    if (finished) return;
    restarts++;
    if (restarts > maxRestarts) {
      finish(new Error(`planning workers failed ${restarts} times (last: ${error}); the run is stopped`));
      return;
    }
    spawn();
  };

  const spawn = () => {
    started++;
    const worker = startTsWorker(workerEntry, { workerData: data });
    const slot: Slot = {
      worker,
      ready: false,
      pending: [],
      batches: [],
      lastActivity: Date.now(),
      lastError: null,
      retired: false,
    };
    slots.add(slot);
    worker.on('message', (msg: FromWorker<TOut>) => {
      if (slot.retired || finished) return;
      slot.lastActivity = Date.now();
      if (msg.type === 'ready') {
        slot.ready = true;
        feed(slot);
        return;
      }
      const at = slot.pending.indexOf(msg.index);
      if (at < 0) return;
      slot.pending.splice(at, 1);
      // Batches are answered in order; drop the front batch once all its items are in.
      slot.batches[0]--;
      if (slot.batches[0] === 0) slot.batches.shift();
      if (msg.ok) record({ index: msg.index, ok: true, value: msg.value, ms: msg.ms });
      else record({ index: msg.index, ok: false, kind: 'threw', error: msg.error, ms: msg.ms });
      feed(slot);
    });
    worker.on('error', (err) => {
      slot.lastError = err instanceof Error ? (err.stack ?? err.message) : String(err);
    });
    worker.on('exit', (code) => {
      lose(slot, 'worker-died', slot.lastError ?? `the worker thread exited with code ${code}`);
    });
  };

  if (count === 0) {
    finished = true;
    resolveDone('done');
  } else {
    for (let i = 0; i < workers; i++) spawn();
    watchdog = setInterval(
      () => {
        const now = Date.now();
        for (const slot of slots) {
          if (slot.ready && slot.pending.length > 0 && now - slot.lastActivity > itemTimeoutMs) {
            const item = slot.pending[0];
            lose(slot, 'timeout', `item ${item} took longer than ${Math.round(itemTimeoutMs / 1000)} s`);
            void slot.worker.terminate();
          }
        }
      },
      Math.min(1000, Math.max(50, itemTimeoutMs / 4)),
    );
    watchdog.unref();
  }

  return {
    done,
    cancel: () => finish('cancelled'),
    get workersStarted() {
      return started;
    },
  };
}
