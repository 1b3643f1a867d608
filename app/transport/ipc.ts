/**
 * The IPC transport of the Electron shell: one channel, `provision:call`, carrying a method name and
 * its argument list from the preload's API object. Every call is checked before it goes on — the
 * sender must be our own page (app://provision/…), the method and arguments must pass
 * validate-call — then forwarded to the service host. No Electron import: the shell passes in the
 * sender's URL and gets back a plain answer, so this is tested under Node.
 */
import type { HostClient } from './host-client';
import { HostCallError } from './host-client';
import { ApiArgumentError, validateCall } from './validate-call';

export const IPC_CHANNEL = 'provision:call';
export const APP_ORIGIN = 'app://provision';

/** What crosses back to the renderer: Electron would strip an Error's class, so answer plain data. */
export type IpcAnswer = { ok: true; value: unknown } | { ok: false; message: string };

export function isOwnPage(senderUrl: string): boolean {
  try {
    const u = new URL(senderUrl);
    return u.protocol === 'app:' && u.host === 'provision';
  } catch {
    return false;
  }
}

export async function handleIpcCall(
  host: HostClient | null,
  senderUrl: string,
  method: unknown,
  args: unknown,
): Promise<IpcAnswer> {
  if (!isOwnPage(senderUrl))
    return { ok: false, message: 'refused: the call did not come from Provision’s own page' };
  try {
    const call = validateCall(method, args);
    if (!host) return { ok: false, message: 'no store is open: use File → Open store…' };
    return { ok: true, value: await host.call(call.method, call.args) };
  } catch (err) {
    if (err instanceof ApiArgumentError || err instanceof HostCallError)
      return { ok: false, message: err.message };
    return { ok: false, message: `internal error: ${err instanceof Error ? err.message : String(err)}` };
  }
}
