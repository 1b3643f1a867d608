/**
 * The command-line entry: `npm run -s cli -- <command> …`. Each command lives in its own module
 * beside this one and is loaded only when asked for, so one command's dependencies never slow
 * another's start.
 */
import { fileURLToPath } from 'node:url';
import { importBundled } from './bundledImport';

/** `bundled`: loaded as one esbuild bundle (bundledImport.ts), for the command that fits thousands of files. */
const COMMANDS: Record<string, { file: string; summary: string; bundled?: true }> = {
  fit: { file: './fit.ts', summary: 'fit models to weekly CSV series and print JSON lines', bundled: true },
  import: { file: './import.ts', summary: 'import a sales, items or stock CSV into a store' },
  demo: { file: './demo.ts', summary: 'build the demo bakery-supply store' },
  run: { file: './run.ts', summary: 'plan every active item of a store' },
  plan: { file: './plan.ts', summary: "export the latest run's order lines as CSV" },
};

function usage(): string {
  const lines = Object.entries(COMMANDS).map(([name, c]) => `  ${name.padEnd(8)} ${c.summary}`);
  return `usage: npm run -s cli -- <command> [options]\n\ncommands:\n${lines.join('\n')}\n`;
}

async function main(argv: string[]): Promise<number> {
  const [name, ...rest] = argv;
  if (!name || name === '--help' || name === '-h') {
    process.stdout.write(usage());
    return name ? 0 : 2;
  }
  const command = COMMANDS[name];
  if (!command) {
    process.stderr.write(`unknown command '${name}'\n${usage()}`);
    return 2;
  }
  const mod = (
    command.bundled
      ? await importBundled(fileURLToPath(new URL(command.file, import.meta.url)))
      : await import(command.file)
  ) as { default: (args: string[]) => Promise<number> };
  return mod.default(rest);
}

main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (err: unknown) => {
    process.stderr.write(`${err instanceof Error ? (err.stack ?? err.message) : String(err)}\n`);
    process.exitCode = 1;
  },
);
