/** The audit log (table audit_log): every planner decision with time, actor, SKU, before, after, reason. */
import { nowIso, type Store } from './store';

export interface AuditEntry {
  id: number;
  at: string;
  actor: string;
  sku: string | null;
  action: string;
  before: unknown;
  after: unknown;
  reason: string | null;
}

export interface AuditInput {
  actor: string;
  sku: string | null;
  action: string;
  before?: unknown;
  after?: unknown;
  reason?: string | null;
  at?: string;
}

/** Append one entry; call inside the transaction that makes the change it records. */
export function appendAudit(store: Store, e: AuditInput): number {
  const r = store.db
    .prepare(
      'INSERT INTO audit_log (at, actor, sku, action, before_json, after_json, reason) VALUES (?, ?, ?, ?, ?, ?, ?)',
    )
    .run(
      e.at ?? nowIso(),
      e.actor,
      e.sku,
      e.action,
      e.before === undefined ? null : JSON.stringify(e.before),
      e.after === undefined ? null : JSON.stringify(e.after),
      e.reason ?? null,
    );
  return Number(r.lastInsertRowid);
}

interface AuditRow {
  id: number;
  at: string;
  actor: string;
  sku: string | null;
  action: string;
  before_json: string | null;
  after_json: string | null;
  reason: string | null;
}

/** Entries newest first, optionally of one SKU. */
export function listAudit(store: Store, options: { sku?: string; limit?: number } = {}): AuditEntry[] {
  const limit = options.limit ?? 1000;
  const rows = (
    options.sku === undefined
      ? store.db.prepare('SELECT * FROM audit_log ORDER BY id DESC LIMIT ?').all(limit)
      : store.db
          .prepare('SELECT * FROM audit_log WHERE sku = ? ORDER BY id DESC LIMIT ?')
          .all(options.sku, limit)
  ) as AuditRow[];
  return rows.map((r) => ({
    id: r.id,
    at: r.at,
    actor: r.actor,
    sku: r.sku,
    action: r.action,
    before: r.before_json === null ? null : JSON.parse(r.before_json),
    after: r.after_json === null ? null : JSON.parse(r.after_json),
    reason: r.reason,
  }));
}
