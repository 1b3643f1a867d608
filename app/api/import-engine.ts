/** The import (app/import) as the service drives it: preview without writing, then commit. */
import { FIELDS, IGNORE } from '../import/fields';
import { type ImportOptions, importFile, previewImport } from '../import/import';
import type { Store } from '../store/store';
import type { ImportProblem, ImportRequest } from './contract';
import type { ImportEngine } from './service';

function optionsOf(request: ImportRequest, actor: string): ImportOptions {
  const map: Record<string, string> = {};
  for (const [column, field] of Object.entries(request.mapping)) map[column] = field === '' ? IGNORE : field;
  return {
    kind: request.kind,
    map: Object.keys(map).length > 0 ? map : undefined,
    dateOrder: request.dateOrder ?? undefined,
    force: request.force,
    actor,
  };
}

function echo(mapping: Record<string, string | null>): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [column, field] of Object.entries(mapping)) out[column] = field ?? IGNORE;
  return out;
}

/** The import speaks to the command line ("--map COLUMN=qty"); on the screen the planner picks the field above. */
function forScreen(message: string): string {
  return message.replace(/name one with --map \S+=(\w+)/g, 'choose the column for $1 in the mapping above');
}

function problems(
  list: { line: number | null; column: string | null; value: string | null; message: string }[],
): ImportProblem[] {
  return list.map((p) => ({ line: p.line, column: p.column, value: p.value, message: forScreen(p.message) }));
}

/** "…and N more" is how the import reports errors beyond its cap; recover the total from it. */
function totalOf(errors: ImportProblem[], warnings: string[]): number {
  for (const text of [...errors.map((e) => e.message), ...warnings]) {
    const m = /\((\d+) in total\)/.exec(text);
    if (m) return Number(m[1]);
  }
  return errors.length;
}

export function storeImportEngine(actor: string): ImportEngine {
  return {
    async preview(store: Store, path: string, request: ImportRequest) {
      const p = await previewImport(path, { ...optionsOf(request, actor), store });
      const errors = problems(p.errors);
      return {
        kind: p.kind,
        header: p.header,
        rows: p.rows.map((r) => r.cells),
        rowLines: p.rows.map((r) => r.line),
        mapping: echo(p.mapping),
        fields: FIELDS[p.kind].map((f) => f.field),
        rowsRead: p.rowsRead,
        problems: errors,
        totalProblems: totalOf(errors, p.warnings),
        warnings: p.warnings,
        format: { delimiter: p.delimiter ?? '', decimal: p.decimal ?? '', dateOrder: p.dateOrder ?? '' },
        items: p.items,
        weeks: p.weeks,
        unknownSkus: p.unknownSkus,
        alreadyImported: p.alreadyImported ? { at: p.alreadyImported.at } : null,
      };
    },
    async commit(store: Store, path: string, request: ImportRequest) {
      const s = await importFile(store, path, optionsOf(request, actor));
      return {
        status: s.status,
        rowsRead: s.rowsRead,
        items: s.items,
        weeks: s.weeks,
        warnings: s.warnings,
        errors: problems(s.errors),
        mapping: echo(s.mapping),
      };
    },
  };
}
