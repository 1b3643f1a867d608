import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

// The rule of the house (see DEVELOPERS.md): core/ is pure computation. It never imports the
// upper layers, the platform (Electron, SQLite, React) or Node's I/O modules.
const FORBIDDEN = [
  /^(\.\.\/)+(app|renderer)(\/|$)/,
  /^electron(\/|$)/,
  /^better-sqlite3$/,
  /^react(-dom)?(\/|$)/,
  /^(node:)?(fs|fs\/promises|child_process|net|http|https|worker_threads|dgram|tls|readline|os|cluster)$/,
];

function sourceFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return sourceFiles(path);
    return /\.(ts|tsx)$/.test(name) ? [path] : [];
  });
}

function importsOf(source: string): string[] {
  const found: string[] = [];
  const re =
    /(?:import|export)[^'"`]*?from\s*['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)|require\(\s*['"]([^'"]+)['"]\s*\)|^\s*import\s+['"]([^'"]+)['"]/gm;
  for (const m of source.matchAll(re)) found.push(m[1] ?? m[2] ?? m[3] ?? m[4]);
  return found;
}

function violations(files: { path: string; source: string }[]): string[] {
  const bad: string[] = [];
  for (const { path, source } of files) {
    for (const spec of importsOf(source)) {
      if (FORBIDDEN.some((re) => re.test(spec))) bad.push(`${path} imports '${spec}'`);
    }
  }
  return bad;
}

describe('layering', () => {
  it('core/ imports nothing from app/, renderer/, the platform or I/O', () => {
    const root = join(import.meta.dirname, '..', '..');
    const files = sourceFiles(join(root, 'core')).map((path) => ({
      path: relative(root, path),
      source: readFileSync(path, 'utf8'),
    }));
    expect(files.length).toBeGreaterThan(0);
    expect(violations(files)).toEqual([]);
  });

  it('the checker itself catches each kind of forbidden import', () => {
    const cases = [
      "import { openStore } from '../../app/store/open';",
      "import Database from 'better-sqlite3';",
      "import { app } from 'electron';",
      "import { useState } from 'react';",
      "import { readFileSync } from 'node:fs';",
      "import fs from 'fs';",
      "const cp = require('child_process');",
      "const m = await import('../renderer/x');",
    ];
    for (const source of cases) expect(violations([{ path: 'core/x.ts', source }])).toHaveLength(1);
    expect(violations([{ path: 'core/x.ts', source: "import { Matrix } from 'ml-matrix';" }])).toEqual([]);
  });
});
