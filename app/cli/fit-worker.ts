/**
 * A worker thread of the `fit` command (fit-parallel.ts): takes file indices from the shared
 * counter until none are left, and posts each file's outcome back. A fit that throws (a bug, not
 * bad input: fitFile turns input errors into outcomes) is posted as a crash and the worker goes on.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { fitFile } from './fit-file';
import type { FitWorkerData, FitWorkerMessage } from './fit-parallel';

if (!parentPort) throw new Error('fit-worker.ts must run in a worker thread');
const { counter, port, files, options } = workerData as FitWorkerData;
const next = new Int32Array(counter);
for (let i = Atomics.add(next, 0, 1); i < files.length; i = Atomics.add(next, 0, 1)) {
  let msg: FitWorkerMessage;
  try {
    msg = { index: i, outcome: fitFile({ file: files[i], options }) };
  } catch (err) {
    msg = { index: i, crash: err instanceof Error ? err.message : String(err) };
  }
  port.postMessage(msg);
}
port.close();
