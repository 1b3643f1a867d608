/**
 * The service host: a process of its own that opens one store, runs the service and answers the
 * shell's calls (./host-protocol). Started by the Electron shell as a Node child (development) or
 * utility process (packaged) with `--store FILE`. Calls are validated again here: the host trusts
 * no one. Exits when the shell closes the channel.
 */
import { existsSync } from 'node:fs';
import { createAppService } from '../api/app-service';
import type { ProvisionService } from '../api/service';
import { ServiceError } from '../api/service-error';
import type { FromHost, ToHost } from './host-protocol';
import { ApiArgumentError, validateCall } from './validate-call';

type Port = { postMessage(m: unknown): void; on(ev: 'message', l: (e: unknown) => void): void };

function channel(): { post: (m: FromHost) => void; listen: (l: (m: ToHost) => void) => void } {
  // Electron utility process: process.parentPort; Node child: process.send.
  const parentPort = (process as unknown as { parentPort?: Port }).parentPort;
  if (parentPort) {
    return {
      post: (m) => parentPort.postMessage(m),
      listen: (l) => parentPort.on('message', (e) => l((e as { data: ToHost }).data)),
    };
  }
  if (!process.send) throw new Error('service-host: start me with an IPC channel (fork or utilityProcess)');
  return {
    post: (m) => process.send?.(m),
    listen: (l) => process.on('message', (m) => l(m as ToHost)),
  };
}

export async function runServiceHost(storePath: string): Promise<void> {
  const { post, listen } = channel();
  let service: ProvisionService;
  try {
    service = createAppService(storePath);
  } catch (err) {
    post({ type: 'failed', message: err instanceof Error ? err.message : String(err) });
    setTimeout(() => process.exit(1), 50);
    return;
  }
  listen(async (m) => {
    if (m.type === 'close') {
      await service.close();
      process.exit(0);
    }
    if (m.type !== 'call') return;
    try {
      const call = validateCall(m.method, m.args);
      const fn = service[call.method] as (...a: unknown[]) => Promise<unknown>;
      post({ type: 'result', id: m.id, ok: true, value: await fn.apply(service, call.args) });
    } catch (err) {
      const known = err instanceof ApiArgumentError || err instanceof ServiceError;
      post({
        type: 'result',
        id: m.id,
        ok: false,
        message: err instanceof Error ? err.message : String(err),
        known,
      });
    }
  });
  post({ type: 'ready', storePath });
}

/** Command-line entry: `service-host --store FILE [--build-demo]` (build the demo store there first when missing). */
export async function hostMain(argv: string[]): Promise<void> {
  const i = argv.indexOf('--store');
  const store = i >= 0 ? argv[i + 1] : undefined;
  if (!store) {
    process.stderr.write('usage: service-host --store FILE [--build-demo]\n');
    process.exit(2);
  }
  if (argv.includes('--build-demo') && !existsSync(store)) {
    const { buildDemoStore } = await import('../../demo-store/build');
    await buildDemoStore(store);
  }
  await runServiceHost(store);
}
