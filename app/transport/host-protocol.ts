/**
 * The messages between the Electron shell and the service host, the process that opens the store
 * and runs the service. The shell keeps the store out of its own process so better-sqlite3 never
 * has to be rebuilt for Electron's ABI in development (the host is plain Node there); packaged, the
 * host is Electron's utility process with the module rebuilt for it at packaging time only.
 */
import type { ApiMethod } from '../api/contract';

export type ToHost = { type: 'call'; id: number; method: ApiMethod; args: unknown[] } | { type: 'close' };

export type FromHost =
  | { type: 'ready'; storePath: string }
  | { type: 'failed'; message: string }
  | { type: 'result'; id: number; ok: true; value: unknown }
  | { type: 'result'; id: number; ok: false; message: string; known: boolean };

/** The channel both ends speak over: a forked Node child's process.send, or an Electron MessagePort-like object. */
export interface HostChannel {
  send(message: unknown): void;
  onMessage(listener: (message: unknown) => void): void;
  onExit(listener: (code: number | null) => void): void;
  kill(): void;
}
