/**
 * Importing one export into a store: sniff, map columns, read and validate every row (streaming),
 * and only when the whole file is clean write it in one transaction, with its batch row and audit
 * entry. Any error writes nothing; a file already imported (same SHA-256) is skipped unless forced.
 * A rejected or skipped import leaves every table of the store as it was.
 */
import { userInfo } from 'node:os';
import { basename } from 'node:path';
import { DEFAULT_WORKSPACE, type WorkspaceSettings } from '../../core/plan/types';
import { appendAudit } from '../store/audit';
import { findBatchBySha, finishBatch, type ImportKind, insertBatch } from '../store/batches';
import { demandWriter } from '../store/demand';
import { createPlaceholderItems, itemIdsBySku, listStoredItems, upsertItems } from '../store/items';
import { getWorkspaceSettings } from '../store/settings';
import { putPosition } from '../store/stock';
import { nowIso, type Store, withoutForeignKeys } from '../store/store';
import { NeedDateOrder, RowContext } from './context';
import { DateOrderEvidence } from './dateOrder';
import type { DateOrder } from './dates';
import { type ColumnMapping, resolveMapping } from './fields';
import { ItemsCollector } from './itemsFile';
import type { DecimalMark } from './numbers';
import { type Delimiter, FileProblem, readRecords, sha256OfFile, sniffFile } from './read';
import { type ImportProblem, Report } from './report';
import { SalesCollector } from './sales';
import { StockCollector } from './stockFile';

export type { ImportProblem } from './report';

export interface ImportOptions {
  kind: ImportKind;
  /** Header column → canonical field (or 'ignore'). */
  map?: Record<string, string>;
  dateOrder?: DateOrder;
  /** Decimal mark of the numbers; by default '.' for comma- and tab-separated files, ',' for semicolons. */
  decimal?: 'dot' | 'comma';
  /** Import even when a file with the same bytes was imported before. */
  force?: boolean;
  actor?: string;
  /** Week start day (1 = Monday … 7 = Sunday); default the workspace's. */
  weekStartDay?: number;
  /** Told when the file has been read and validated and the write transaction starts. */
  onWriting?: (info: { rowsRead: number; items: number }) => void;
}

export interface ImportSummary {
  status: 'imported' | 'skipped' | 'rejected';
  rowsRead: number;
  items: number;
  weeks: number;
  warnings: string[];
  errors: ImportProblem[];
  mapping: Record<string, string | null>;
}

export interface ImportPreview {
  status: 'ok' | 'rejected';
  file: string;
  kind: ImportKind;
  delimiter: Delimiter | null;
  decimal: DecimalMark | null;
  dateOrder: DateOrder | null;
  header: string[];
  /** The first data rows as read (trimmed cells), with their physical line numbers. */
  rows: { line: number; cells: string[] }[];
  mapping: Record<string, string | null>;
  rowsRead: number;
  items: number;
  weeks: number;
  warnings: string[];
  errors: ImportProblem[];
  /** How many errors there are in all (the list is capped). */
  errorsTotal: number;
  /** When a store was given: SKUs of the file the store does not know (capped at 100). */
  unknownSkus: string[];
  /** When a store was given: the batch that already imported these bytes, if any. */
  alreadyImported: { batchId: number; at: string } | null;
}

interface Analysis {
  report: Report;
  mappingEcho: Record<string, string | null>;
  header: string[];
  firstRows: { line: number; cells: string[] }[];
  rowsRead: number;
  delimiter: Delimiter | null;
  decimal: DecimalMark | null;
  dateOrder: DateOrder | null;
  sales: SalesCollector | null;
  items: ItemsCollector | null;
  stock: StockCollector | null;
}

function echo(mapping: ColumnMapping | null): Record<string, string | null> {
  const out: Record<string, string | null> = {};
  if (!mapping) return out;
  mapping.headers.forEach((h, i) => {
    out[h === '' ? `(column ${i + 1})` : h] = mapping.fieldOf[i];
  });
  return out;
}

/** Decimal mark: the option, else from the delimiter, checked against the first bytes' numbers. */
function chooseDecimal(delimiter: Delimiter, sample: string, option?: 'dot' | 'comma'): DecimalMark {
  if (option) return option === 'comma' ? ',' : '.';
  if (delimiter === ',') return '.';
  const d = delimiter === ';' ? ';' : '\t';
  const commaDecimals = new RegExp(`(^|${d})"?-?\\d+,\\d{1,2}"?(${d}|\\r?\\n|$)`, 'm').test(sample);
  const dotDecimals = new RegExp(`(^|${d})"?-?\\d+\\.\\d{1,2}"?(${d}|\\r?\\n|$)`, 'm').test(sample);
  if (delimiter === ';') return dotDecimals && !commaDecimals ? '.' : ',';
  return commaDecimals && !dotDecimals ? ',' : '.';
}

const PREVIEW_ROWS = 20;

async function analyse(path: string, options: ImportOptions, ws: WorkspaceSettings): Promise<Analysis> {
  const fileName = basename(path);
  const a: Analysis = {
    report: new Report(fileName),
    mappingEcho: {},
    header: [],
    firstRows: [],
    rowsRead: 0,
    delimiter: null,
    decimal: null,
    dateOrder: options.dateOrder ?? null,
    sales: null,
    items: null,
    stock: null,
  };
  let sniff: { delimiter: Delimiter; sample: string; sepLine: boolean };
  try {
    const s = sniffFile(path);
    sniff = { delimiter: s.delimiter, sample: s.sample, sepLine: s.sepLine };
  } catch (err) {
    if (err instanceof FileProblem) {
      a.report.error(err.line, null, null, err.message);
      return a;
    }
    throw err;
  }
  a.delimiter = sniff.delimiter;
  a.decimal = chooseDecimal(sniff.delimiter, sniff.sample, options.decimal);
  const weekStartDay = options.weekStartDay ?? ws.weekStartDay;

  const pass = async (order: DateOrder | null, trim = false): Promise<'done' | 'need-order'> => {
    const report = new Report(fileName);
    a.report = report;
    a.firstRows = [];
    a.sales = a.items = a.stock = null;
    let mapping: ColumnMapping | null = null;
    let ctx: RowContext | null = null;
    let collect: ((cells: string[], line: number) => void) | null = null;
    let width = 0;
    try {
      a.rowsRead = await readRecords(
        path,
        sniff.delimiter,
        {
          header(cells, headerLine) {
            a.header = cells.map((c) => c.trim());
            width = cells.length;
            const m = resolveMapping(options.kind, cells, options.map);
            mapping = m.mapping;
            a.mappingEcho = echo(mapping);
            for (const p of m.problems) report.error(headerLine, p.column, null, p.message);
            if (m.problems.length) throw new FileProblem('mapping');
            ctx = new RowContext(mapping, report, a.decimal!, order, weekStartDay);
            if (options.kind === 'sales') {
              const s = new SalesCollector(ctx);
              a.sales = s;
              collect = (c, l) => s.row(c, l);
            } else if (options.kind === 'items') {
              const s = new ItemsCollector(ctx);
              a.items = s;
              collect = (c, l) => s.row(c, l);
            } else {
              const s = new StockCollector(ctx);
              a.stock = s;
              collect = (c, l) => s.row(c, l);
            }
          },
          row(cells, line) {
            if (a.firstRows.length < PREVIEW_ROWS)
              a.firstRows.push({ line, cells: cells.map((c) => c.trim()) });
            // Some systems end every data line with a delimiter the header lacks: an empty extra cell.
            if (cells.length === width + 1 && cells[width].trim() === '') cells.length = width;
            if (cells.length !== width) {
              report.error(
                line,
                null,
                null,
                `has ${cells.length} fields, the header has ${width}; check for an unquoted '${sniff.delimiter === '\t' ? 'tab' : sniff.delimiter}' inside a value`,
              );
              return;
            }
            collect!(cells, line);
          },
        },
        sniff.sepLine,
        trim,
      );
    } catch (err) {
      if (err instanceof NeedDateOrder) return 'need-order';
      // Spaces around quoted fields break the untrimmed parse: read again, trimming.
      if (err instanceof FileProblem && err.syntax && !trim) return pass(order, true);
      if (err instanceof FileProblem) {
        if (err.message !== 'mapping') report.error(err.line, null, null, err.message);
        return 'done';
      }
      throw err;
    }
    (a.sales as SalesCollector | null)?.finish();
    if (a.rowsRead === 0) report.error(null, null, null, 'has a header but no data rows');
    return 'done';
  };

  if ((await pass(a.dateOrder)) === 'need-order') {
    // Some dates are day/month or month/day: scan the date column alone, decide, then read again.
    const evidence = new DateOrderEvidence();
    let dateCol = -1;
    try {
      await readRecords(
        path,
        sniff.delimiter,
        {
          header(cells) {
            const m = resolveMapping(options.kind, cells, options.map).mapping;
            dateCol = m.columnOf.get('date') ?? m.columnOf.get('week') ?? m.columnOf.get('as_of') ?? -1;
          },
          row(cells, line) {
            const t = cells[dateCol]?.trim();
            if (t) evidence.see(t, line);
          },
        },
        sniff.sepLine,
        true,
      );
    } catch (err) {
      if (!(err instanceof FileProblem)) throw err;
      a.report = new Report(fileName);
      a.report.error(err.line, null, null, err.message);
      a.sales = a.items = a.stock = null;
      return a;
    }
    const decision = evidence.decide();
    if ('problem' in decision) {
      a.report = new Report(fileName);
      a.report.error(decision.line, a.header[dateCol] ?? null, decision.value, decision.problem);
      a.sales = a.items = a.stock = null;
      return a;
    }
    a.dateOrder = decision.order;
    await pass(decision.order);
  }
  return a;
}

function skuCount(a: Analysis): number {
  if (a.sales) return a.sales.skus.length;
  if (a.items) return a.items.patches.length;
  if (a.stock) return a.stock.positions.size;
  return 0;
}

function fileSkus(a: Analysis): string[] {
  if (a.sales) return a.sales.skus;
  if (a.stock) return [...a.stock.positions.keys()];
  return [];
}

function summaryOf(
  a: Analysis,
  status: ImportSummary['status'],
  extraWarnings: string[] = [],
): ImportSummary {
  const rejected = status === 'rejected';
  return {
    status,
    rowsRead: a.rowsRead,
    items: rejected ? 0 : skuCount(a),
    weeks: rejected ? 0 : (a.sales?.weekCount ?? 0),
    warnings: [...a.report.warningList(), ...extraWarnings],
    errors: a.report.errorList(),
    mapping: a.mappingEcho,
  };
}

function defaultActor(): string {
  try {
    return userInfo().username || 'planner';
  } catch {
    return 'planner';
  }
}

function wsFor(store: Store | null): WorkspaceSettings {
  return store ? getWorkspaceSettings(store) : DEFAULT_WORKSPACE;
}

/** The summary of an import refused before any row was read (no file, no store): one message. */
export function rejectedImport(message: string): ImportSummary {
  return {
    status: 'rejected',
    rowsRead: 0,
    items: 0,
    weeks: 0,
    warnings: [],
    errors: [{ line: null, column: null, value: null, message }],
    mapping: {},
  };
}

/**
 * Read, validate and (when clean) write one file. Never throws for a bad file: the summary says
 * `rejected` with the errors. Throws only for faults of the machine (I/O, a store that broke).
 */
export async function importFile(store: Store, path: string, options: ImportOptions): Promise<ImportSummary> {
  const startedAt = nowIso();
  const fileName = basename(path);
  let sha: string;
  try {
    sha = await sha256OfFile(path);
  } catch (err) {
    const code = (err as { code?: string }).code;
    const why =
      code === 'ENOENT'
        ? 'no such file'
        : code === 'EISDIR'
          ? 'is a folder, not a file'
          : (err as Error).message;
    return rejectedImport(`${path}: ${why}`);
  }
  const earlier = options.force ? null : findBatchBySha(store, sha, options.kind);
  if (earlier) {
    const prev = earlier.summary as Partial<ImportSummary>;
    return {
      status: 'skipped',
      rowsRead: earlier.rowsRead,
      items: prev.items ?? 0,
      weeks: prev.weeks ?? 0,
      warnings: [
        `${fileName}: the same file (SHA-256 ${sha.slice(0, 12)}…) was imported on ${earlier.finishedAt} as batch ${earlier.id} ('${earlier.fileName}'); skipped. Use --force to import it again.`,
      ],
      errors: [],
      mapping: (prev.mapping as Record<string, string | null>) ?? {},
    };
  }
  const ws = wsFor(store);
  const a = await analyse(path, options, ws);
  if (a.report.hasErrors) return summaryOf(a, 'rejected');

  const actor = options.actor ?? defaultActor();
  const extra: string[] = [];
  options.onWriting?.({ rowsRead: a.rowsRead, items: skuCount(a) });
  // Every id written below comes from this transaction (items looked up or created, the new
  // batch), so the per-row foreign-key lookups are skipped for the bulk write (withoutForeignKeys).
  withoutForeignKeys(store, () => {
    const batchId = insertBatch(store, {
      kind: options.kind,
      fileName,
      sha256: sha,
      rowsRead: a.rowsRead,
      actor,
      startedAt,
    });
    const ids = itemIdsBySku(store);
    const known = new Set(ids.keys());
    const unknown = fileSkus(a).filter((s) => !ids.has(s));
    if (unknown.length) {
      for (const [sku, id] of createPlaceholderItems(store, unknown, batchId)) ids.set(sku, id);
      const shown = unknown.slice(0, 5).join(', ') + (unknown.length > 5 ? ', …' : '');
      extra.push(
        `${unknown.length} SKUs were not in the item master and were added as placeholder items on the workspace defaults (lead time ${ws.leadTimeWeeks} weeks, service level of the ABC class or ${ws.serviceLevel}, case pack 1, no MOQ) with a zero inventory position until a stock file says otherwise: ${shown}`,
      );
    }
    let detail: Record<string, unknown> = {};
    if (a.sales) {
      const activeKnown = new Map<string, number>();
      for (const it of listStoredItems(store, { activeOnly: true }))
        if (known.has(it.sku)) activeKnown.set(it.sku, it.id);
      const st = a.sales.write(ids, known, demandWriter(store), batchId, activeKnown);
      detail = {
        inserted: st.inserted,
        replaced: st.replaced,
        changed: st.changed,
        zeroFilled: st.zeroFilled,
        silentItems: st.silentItems,
        changes: st.changes,
      };
      if (st.replaced > 0) {
        extra.push(
          `${st.replaced} item-weeks were already in the store and were replaced; ${st.changed} of them changed${st.changes.length ? ` (${st.changes.slice(0, 5).join('; ')}${st.changed > 5 ? '; …' : ''})` : ''}`,
        );
      }
      if (st.zeroFilled > 0) {
        extra.push(
          `${st.zeroFilled} item-weeks within the file's span had no lines and were stored as 0 sales${st.silentItems ? ` (${st.silentItems} of the items had no line in this file at all)` : ''}`,
        );
      }
    } else if (a.items) {
      detail = upsertItems(store, a.items.patches, batchId);
    } else if (a.stock) {
      for (const [sku, p] of a.stock.positions) putPosition(store, ids.get(sku)!, p, batchId);
      detail = { positions: a.stock.positions.size };
    }
    const summary = summaryOf(a, 'imported', extra);
    const finishedAt = nowIso();
    finishBatch(store, batchId, summary.warnings.length ? 'imported with warnings' : 'imported', finishedAt, {
      ...summary,
      detail,
    });
    appendAudit(store, {
      at: finishedAt,
      actor,
      sku: null,
      action: `import-${options.kind}`,
      after: {
        batchId,
        file: fileName,
        sha256: sha,
        rowsRead: a.rowsRead,
        items: summary.items,
        weeks: summary.weeks,
        ...detail,
        changes: undefined,
      },
      reason: null,
    });
  });
  return summaryOf(a, 'imported', extra);
}

/** Everything the import screen shows before the planner confirms; writes nothing. */
export async function previewImport(
  path: string,
  options: ImportOptions & { store?: Store | null },
): Promise<ImportPreview> {
  const store = options.store ?? null;
  const a = await analyse(path, options, wsFor(store));
  let unknownSkus: string[] = [];
  let alreadyImported: ImportPreview['alreadyImported'] = null;
  if (store) {
    const ids = itemIdsBySku(store);
    unknownSkus = fileSkus(a)
      .filter((s) => !ids.has(s))
      .slice(0, 100);
    if (!options.force) {
      try {
        const b = findBatchBySha(store, await sha256OfFile(path), options.kind);
        if (b) alreadyImported = { batchId: b.id, at: b.finishedAt };
      } catch {
        // the analysis already reported an unreadable file
      }
    }
  }
  const s = summaryOf(a, a.report.hasErrors ? 'rejected' : 'imported');
  return {
    status: a.report.hasErrors ? 'rejected' : 'ok',
    file: basename(path),
    kind: options.kind,
    delimiter: a.delimiter,
    decimal: a.decimal,
    dateOrder: a.dateOrder,
    header: a.header,
    rows: a.firstRows,
    mapping: s.mapping,
    rowsRead: s.rowsRead,
    items: s.items,
    weeks: s.weeks,
    warnings: s.warnings,
    errors: s.errors,
    errorsTotal: a.report.errorCount,
    unknownSkus,
    alreadyImported,
  };
}
