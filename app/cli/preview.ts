/**
 * `npm run preview -- --store FILE [--port N]`: the planner's screens in a browser, served on
 * 127.0.0.1 only. Prints one line, the address with this start's token, and serves until stopped.
 */
import { servePreview } from './serve-preview';

export function parsePreviewArgs(argv: string[]): { storePath: string; port: number } {
  let storePath: string | null = null;
  let port = 0;
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--store') storePath = argv[++i] ?? null;
    else if (a === '--port') {
      const v = argv[++i];
      port = Number(v);
      if (!Number.isInteger(port) || port < 0 || port > 65535)
        throw new Error(`--port: not a port number: '${v}'`);
    } else if (a === '--help' || a === '-h') {
      throw new Error('usage: npm run preview -- --store FILE [--port N]');
    } else throw new Error(`unknown option '${a}'\nusage: npm run preview -- --store FILE [--port N]`);
  }
  if (!storePath)
    throw new Error('usage: npm run preview -- --store FILE [--port N] (the store file is required)');
  return { storePath, port };
}

const isMain = process.argv[1] && import.meta.filename === process.argv[1];
if (isMain) {
  try {
    await servePreview(parsePreviewArgs(process.argv.slice(2)));
  } catch (err) {
    process.stderr.write(`${err instanceof Error ? err.message : String(err)}\n`);
    process.exit(1);
  }
}
