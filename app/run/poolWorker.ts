/**
 * A pool worker: loads the per-item function named in its workerData, then plans the batches the
 * pool sends, one item at a time. An item whose function throws is answered with the error and the
 * worker goes on with the next; only a crash of the thread itself (exit, out of memory) stops it,
 * and the pool replaces it.
 */
import { parentPort, workerData } from 'node:worker_threads';
import type { FromWorker, PoolWorkerData, ToWorker } from './poolProtocol';

type TaskFn = (input: unknown) => unknown;

function describe(err: unknown): string {
  if (err instanceof Error) return err.stack ?? `${err.name}: ${err.message}`;
  return String(err);
}

async function main(): Promise<void> {
  const port = parentPort;
  if (!port) throw new Error('poolWorker.ts must run in a worker thread');
  const data = workerData as PoolWorkerData;
  const mod = (await import(data.taskModule)) as Record<string, unknown>;
  const fn = mod[data.taskExport];
  if (typeof fn !== 'function') {
    throw new Error(`pool worker: ${data.taskModule} has no function export '${data.taskExport}'`);
  }
  const task = fn as TaskFn;
  const post = (m: FromWorker<unknown>) => port.postMessage(m);
  // One item at a time, in arrival order, even when the function is async.
  const queue: { index: number; input: unknown }[] = [];
  let draining = false;
  const drain = async () => {
    draining = true;
    for (let next = queue.shift(); next; next = queue.shift()) {
      const t0 = performance.now();
      try {
        let value = task(next.input);
        if (value instanceof Promise) value = await value;
        post({ type: 'item', index: next.index, ok: true, value, ms: performance.now() - t0 });
      } catch (err) {
        post({
          type: 'item',
          index: next.index,
          ok: false,
          error: describe(err),
          ms: performance.now() - t0,
        });
      }
    }
    draining = false;
  };
  port.on('message', (msg: ToWorker<unknown>) => {
    if (msg.type !== 'batch') return;
    for (const item of msg.items) queue.push(item);
    if (!draining) void drain();
  });
  post({ type: 'ready' });
}

main().catch((err) => {
  // A load failure is fatal for this worker; rethrowing outside the promise makes it an 'error' event.
  setImmediate(() => {
    throw err;
  });
});
