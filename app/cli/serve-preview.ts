/**
 * Serve the browser preview of one store: build the screens if needed, open the service, start the
 * loopback HTTP transport and print its address (token included) as ONE line of stdout. Used by
 * `npm run preview` and by `npm start` where Electron's binary is missing.
 */
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { createAppService } from '../api/app-service';
import { startHttpTransport } from '../transport/http';
import { ensureRendererBuilt, RENDERER_OUT } from './renderer-build';

export async function servePreview(options: { storePath: string; port?: number }): Promise<void> {
  if (!existsSync(options.storePath)) {
    throw new Error(
      `${options.storePath}: no such store. Build the demo one with \`npm run -s cli -- demo --store ${options.storePath}\`, or import a file into it with \`npm run -s cli -- import\`.`,
    );
  }
  await ensureRendererBuilt();
  const service = createAppService(resolve(options.storePath));
  // Ready means ready: build the overview before printing the address, so it opens at once.
  await service.listItems();
  const http = await startHttpTransport({ service, staticDir: RENDERER_OUT, port: options.port ?? 0 });
  process.stdout.write(`${http.openUrl}\n`);
  let closing = false;
  const stop = async () => {
    if (closing) return;
    closing = true;
    await http.close();
    await service.close();
    process.exit(0);
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}
