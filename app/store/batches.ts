/**
 * Import batches (table import_batches): one row per import that was written — file name, SHA-256
 * of its bytes, rows read, who and when, outcome and the JSON summary. A rejected or skipped import
 * writes no row (it leaves the store exactly as it was).
 */
import type { Store } from './store';

export type ImportKind = 'sales' | 'items' | 'stock';

export interface ImportBatch {
  id: number;
  kind: ImportKind;
  fileName: string;
  sha256: string;
  rowsRead: number;
  actor: string;
  startedAt: string;
  finishedAt: string;
  outcome: string;
  summary: unknown;
}

interface BatchRow {
  id: number;
  kind: ImportKind;
  file_name: string;
  sha256: string;
  rows_read: number;
  actor: string;
  started_at: string;
  finished_at: string;
  outcome: string;
  summary_json: string;
}

function fromRow(r: BatchRow): ImportBatch {
  return {
    id: r.id,
    kind: r.kind,
    fileName: r.file_name,
    sha256: r.sha256,
    rowsRead: r.rows_read,
    actor: r.actor,
    startedAt: r.started_at,
    finishedAt: r.finished_at,
    outcome: r.outcome,
    summary: JSON.parse(r.summary_json),
  };
}

/** The latest batch that imported a file with these bytes, if any. */
export function findBatchBySha(store: Store, sha256: string, kind?: ImportKind): ImportBatch | null {
  const r = (
    kind
      ? store.db
          .prepare('SELECT * FROM import_batches WHERE sha256 = ? AND kind = ? ORDER BY id DESC LIMIT 1')
          .get(sha256, kind)
      : store.db.prepare('SELECT * FROM import_batches WHERE sha256 = ? ORDER BY id DESC LIMIT 1').get(sha256)
  ) as BatchRow | undefined;
  return r ? fromRow(r) : null;
}

/** Start a batch row (finished_at and summary are filled by finishBatch in the same transaction). */
export function insertBatch(
  store: Store,
  b: {
    kind: ImportKind;
    fileName: string;
    sha256: string;
    rowsRead: number;
    actor: string;
    startedAt: string;
  },
): number {
  return Number(
    store.db
      .prepare(
        "INSERT INTO import_batches (kind, file_name, sha256, rows_read, actor, started_at, finished_at, outcome, summary_json) VALUES (?, ?, ?, ?, ?, ?, ?, 'writing', '{}')",
      )
      .run(b.kind, b.fileName, b.sha256, b.rowsRead, b.actor, b.startedAt, b.startedAt).lastInsertRowid,
  );
}

export function finishBatch(
  store: Store,
  id: number,
  outcome: string,
  finishedAt: string,
  summary: unknown,
): void {
  store.db
    .prepare('UPDATE import_batches SET outcome = ?, finished_at = ?, summary_json = ? WHERE id = ?')
    .run(outcome, finishedAt, JSON.stringify(summary), id);
}

export function listBatches(store: Store, limit = 100): ImportBatch[] {
  return (
    store.db.prepare('SELECT * FROM import_batches ORDER BY id DESC LIMIT ?').all(limit) as BatchRow[]
  ).map(fromRow);
}
