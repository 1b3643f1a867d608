/**
 * The shell's side of the service host: start it on a store, send calls, match the answers by id,
 * and fail every pending call clearly when the host exits. No Electron here; the shell passes in
 * how to start the process, so this is tested under plain Node.
 */
import type { ApiMethod } from '../api/contract';
import type { FromHost, HostChannel } from './host-protocol';

export class HostCallError extends Error {
  constructor(
    message: string,
    /** True for a refused call (bad argument, a planner-facing service error), false for a fault. */
    readonly known: boolean,
  ) {
    super(message);
    this.name = 'HostCallError';
  }
}

export interface HostClient {
  readonly storePath: string;
  call(method: ApiMethod, args: unknown[]): Promise<unknown>;
  close(): Promise<void>;
}

export function connectHost(
  channel: HostChannel,
  storePath: string,
  timeoutMs = 60_000,
): Promise<HostClient> {
  return new Promise((ok, ko) => {
    let nextId = 1;
    let exited = false;
    const pending = new Map<number, { resolve: (v: unknown) => void; reject: (e: Error) => void }>();
    const exitWaiters: (() => void)[] = [];
    const timer = setTimeout(() => {
      channel.kill();
      ko(new Error(`the service host did not open ${storePath} within ${timeoutMs / 1000} s`));
    }, timeoutMs);

    const client: HostClient = {
      storePath,
      call(method, args) {
        if (exited)
          return Promise.reject(new HostCallError('the service host has stopped; reopen the store', false));
        const id = nextId++;
        return new Promise((resolve, reject) => {
          pending.set(id, { resolve, reject });
          channel.send({ type: 'call', id, method, args });
        });
      },
      close() {
        if (exited) return Promise.resolve();
        return new Promise<void>((done) => {
          exitWaiters.push(done);
          channel.send({ type: 'close' });
          setTimeout(() => channel.kill(), 5000);
        });
      },
    };

    channel.onMessage((raw) => {
      const m = raw as FromHost;
      if (m.type === 'ready') {
        clearTimeout(timer);
        ok(client);
      } else if (m.type === 'failed') {
        clearTimeout(timer);
        ko(new Error(m.message));
      } else if (m.type === 'result') {
        const p = pending.get(m.id);
        if (!p) return;
        pending.delete(m.id);
        if (m.ok) p.resolve(m.value);
        else p.reject(new HostCallError(m.message, m.known));
      }
    });
    channel.onExit((code) => {
      exited = true;
      clearTimeout(timer);
      for (const p of pending.values())
        p.reject(new HostCallError(`the service host stopped (exit code ${code})`, false));
      pending.clear();
      for (const w of exitWaiters) w();
      ko(new Error(`the service host stopped before opening ${storePath} (exit code ${code})`));
    });
  });
}
