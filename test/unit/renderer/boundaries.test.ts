/**
 * Two rules of the house for the app's layers (ARCHITECTURE.md): the screens import from app/ only
 * types (`import type`, erased at build), and only the Electron shell's two files import
 * 'electron' (under plain Node, `require('electron')` looks for the binary and fails, so a test or
 * the CLI must never load it).
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = join(import.meta.dirname, '..', '..', '..');

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) return name === 'node_modules' ? [] : files(p);
    return /\.(ts|tsx)$/.test(name) ? [p] : [];
  });
}

/** Every import statement of a file: its text and its module specifier. */
function imports(source: string): { text: string; spec: string }[] {
  const out: { text: string; spec: string }[] = [];
  const re = /^\s*(import|export)\s[^;]*?from\s*['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)/gms;
  for (const m of source.matchAll(re)) out.push({ text: m[0].trim(), spec: m[2] ?? m[3] });
  return out;
}

describe('layer boundaries of the app', () => {
  it('the renderer imports app/ as types only', () => {
    const bad: string[] = [];
    for (const f of files(join(ROOT, 'renderer'))) {
      for (const i of imports(readFileSync(f, 'utf8'))) {
        if (/(^|\/)app\//.test(i.spec) && !/^(import|export)\s+type\s/.test(i.text))
          bad.push(`${relative(ROOT, f)}: ${i.text}`);
      }
    }
    expect(bad).toEqual([]);
  });

  it("only app/main.ts and app/preload.ts import 'electron'", () => {
    const importers: string[] = [];
    for (const dir of ['app', 'core', 'renderer', 'demo-store', 'test']) {
      for (const f of files(join(ROOT, dir))) {
        if (f.endsWith('boundaries.test.ts')) continue;
        if (
          imports(readFileSync(f, 'utf8')).some(
            (i) => i.spec === 'electron' || i.spec.startsWith('electron/'),
          )
        )
          importers.push(relative(ROOT, f));
      }
    }
    expect(importers.sort()).toEqual(['app/main.ts', 'app/preload.ts']);
  });

  it('the checker sees type-only and value imports apart', () => {
    expect(imports("import type { A } from '../../app/api/contract';")[0].text).toMatch(/^import type/);
    expect(imports("import { A } from '../../app/api/service';")[0]).toEqual({
      text: "import { A } from '../../app/api/service'",
      spec: '../../app/api/service',
    });
    expect(imports("const e = await import('electron');")[0].spec).toBe('electron');
  });
});
