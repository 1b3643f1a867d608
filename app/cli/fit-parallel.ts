/**
 * The `fit` command over many files on every core: the command's own thread and one worker thread
 * per further core take the next file from a shared counter (Atomics on a SharedArrayBuffer), so
 * no thread waits for a hand-out and the command's thread is fitting while the workers start (from
 * a bundle of their code: fit-worker-entry.ts). Lines
 * are written in the order the files were given, each as soon as every earlier file is done. A file
 * a worker could not finish (the thread died) is fitted again by the command's own thread.
 */
import { availableParallelism } from 'node:os';
import { MessageChannel, type MessagePort, receiveMessageOnPort, type Worker } from 'node:worker_threads';
import { startTsWorker } from '../run/tsWorker';
import type { FitCommandOptions } from './fit';
import { type FitFileOutcome, fitFile } from './fit-file';
import { fitWorkerEntry } from './fit-worker-entry';

export interface FitOutput {
  line(text: string): void;
  error(text: string): void;
}

export interface FitWorkerData {
  counter: SharedArrayBuffer;
  /** Where the worker posts its outcomes (read synchronously by the command's thread). */
  port: MessagePort;
  files: string[];
  options: FitCommandOptions;
}

export type FitWorkerMessage = { index: number; outcome: FitFileOutcome } | { index: number; crash: string };

/** Below this many files the workers' start-up (≈ 0.3 s each) costs more than it saves. */
export const PARALLEL_FROM = 64;

export function fitThreads(files: number): number {
  return files < PARALLEL_FROM ? 1 : Math.max(1, Math.min(availableParallelism(), 8));
}

/** Fits every file, writing lines in file order; resolves to the number of files that failed. */
export async function fitFilesOnCores(
  files: string[],
  options: FitCommandOptions,
  out: FitOutput,
  threads = fitThreads(files.length),
  /** The workers' module (tests put a stand-in here); default the bundled fit-worker. */
  workerEntry?: URL,
): Promise<number> {
  const n = files.length;
  const counter = new SharedArrayBuffer(4);
  const next = new Int32Array(counter);
  const results: (FitFileOutcome | undefined)[] = new Array(n);
  let written = 0;
  let failed = 0;
  const write = (): void => {
    for (let r = results[written]; r !== undefined; r = results[written]) {
      if ('line' in r) out.line(r.line);
      else {
        out.error(r.error);
        failed++;
      }
      results[written] = undefined;
      written++;
    }
  };
  const workers: Worker[] = [];
  const ports: MessagePort[] = [];
  const take = (msg: FitWorkerMessage): void => {
    results[msg.index] =
      'outcome' in msg ? msg.outcome : { error: `${files[msg.index]}: the fit failed (${msg.crash})` };
  };
  const entry = threads > 1 ? (workerEntry ?? (await fitWorkerEntry())) : null;
  for (let w = 1; entry && w < threads; w++) {
    const { port1, port2 } = new MessageChannel();
    const data: FitWorkerData = { counter, port: port2, files, options };
    const worker = startTsWorker(entry, {
      workerData: data,
      transferList: [port2],
    });
    workers.push(worker);
    ports.push(port1);
  }
  const drain = (): void => {
    for (const port of ports) {
      for (let m = receiveMessageOnPort(port); m; m = receiveMessageOnPort(port)) take(m.message);
    }
  };
  // This thread's share: whatever it takes from the counter.
  for (let i = Atomics.add(next, 0, 1); i < n; i = Atomics.add(next, 0, 1)) {
    results[i] = fitFile({ file: files[i], options });
    drain();
    write();
  }
  // Wait for the workers to finish their last files (or to die), then fit anything left over.
  await Promise.all(
    workers.map(
      (worker) =>
        new Promise<void>((resolve) => {
          worker.once('exit', () => resolve());
          worker.once('error', () => undefined);
        }),
    ),
  );
  drain();
  for (const port of ports) port.close();
  for (let i = written; i < n; i++)
    if (results[i] === undefined) results[i] = fitFile({ file: files[i], options });
  write();
  return failed;
}
