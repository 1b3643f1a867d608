/**
 * Planning runs and their results (tables planning_runs, run_items, run_models, run_forecasts,
 * run_flags, order_lines; order_edits and overrides are read here for the order list).
 *
 * A run is written whole, in one transaction, after all its items are planned (`writeRun`): a run
 * that fails, is cancelled or is killed before that leaves the previous run as it was. Only runs
 * with status 'complete' are ever read back as "the latest run". Items whose inputs did not change
 * are carried into the new run by copying their rows (`reused` in writeRun), so every complete run
 * holds a full set of results and keeps its forecasts for later error tracking. A planner's edit
 * of a reused item's order quantity is carried with it (same line, same decision); an item planned
 * afresh gets a new suggestion and no edit.
 */
import type { Flag, ForecastPoint, ServiceKind } from '../../core/plan/types';
import { nowIso, type Store } from './store';

export interface ModelRecord {
  p: number;
  d: number;
  q: number;
  seasonalHarmonics: number;
  includeMean: boolean;
  aicc: number | null;
  chosen: boolean;
  /** JSON of the fitted model's detail (coefficients, σ², …). */
  detailJson: string;
}

/** The figures of an order line, as written by a run and as read back. */
export interface OrderLineFigures {
  orderQty: number;
  casePacks: number;
  reorderPoint: number;
  orderUpTo: number;
  safetyStock: number;
  intervalForecast: number;
  intervalSd: number;
  serviceLevel: number;
  serviceKind: ServiceKind;
  explanation: string;
}

export interface OrderLineRecord extends OrderLineFigures {
  /** JSON of the full order line as the engine returned it. */
  detailJson: string | null;
}

/** One item's results in the form the store keeps them (built in the worker, inserted by writeRun). */
export interface ItemRunRecord {
  /** planned: the engine's own result; fallback: the engine fell back itself; failed: the run's stand-in line. */
  status: 'planned' | 'fallback' | 'failed';
  models: ModelRecord[];
  forecasts: ForecastPoint[];
  flags: Flag[];
  order: OrderLineRecord | null;
  /** JSON of everything else the item screen shows (fitted values, residual ACF, roots, diagnostics). */
  diagnosticsJson: string | null;
  error: string | null;
}

export type RunStatus = 'running' | 'complete' | 'failed' | 'cancelled';

export interface RunRow {
  id: number;
  startedAt: string;
  finishedAt: string | null;
  status: RunStatus;
  itemsTotal: number;
  itemsPlanned: number;
  itemsReused: number;
  itemsFailed: number;
  actor: string | null;
  settings: unknown;
  note: string | null;
}

interface RunDbRow {
  id: number;
  started_at: string;
  finished_at: string | null;
  status: RunStatus;
  items_total: number;
  items_planned: number;
  items_reused: number;
  items_failed: number;
  actor: string | null;
  settings_json: string;
  note: string | null;
}

function runFromRow(r: RunDbRow): RunRow {
  return {
    id: r.id,
    startedAt: r.started_at,
    finishedAt: r.finished_at,
    status: r.status,
    itemsTotal: r.items_total,
    itemsPlanned: r.items_planned,
    itemsReused: r.items_reused,
    itemsFailed: r.items_failed,
    actor: r.actor,
    settings: JSON.parse(r.settings_json),
    note: r.note,
  };
}

/** The latest complete run, or null before the first one. */
export function getLatestRun(store: Store): RunRow | null {
  const r = store.db
    .prepare("SELECT * FROM planning_runs WHERE status = 'complete' ORDER BY id DESC LIMIT 1")
    .get() as RunDbRow | undefined;
  return r ? runFromRow(r) : null;
}

export function getRun(store: Store, runId: number): RunRow | null {
  const r = store.db.prepare('SELECT * FROM planning_runs WHERE id = ?').get(runId) as RunDbRow | undefined;
  return r ? runFromRow(r) : null;
}

/** Every run (complete, cancelled, failed), newest first. */
export function listRuns(store: Store, limit = 50): RunRow[] {
  return (
    store.db.prepare('SELECT * FROM planning_runs ORDER BY id DESC LIMIT ?').all(limit) as RunDbRow[]
  ).map(runFromRow);
}

/** item id → input fingerprint and item status in a run. */
export function getRunFingerprints(
  store: Store,
  runId: number,
): Map<number, { fingerprint: string; status: ItemRunResult['status'] }> {
  const out = new Map<number, { fingerprint: string; status: ItemRunResult['status'] }>();
  for (const r of store.db
    .prepare('SELECT item_id, fingerprint, status FROM run_items WHERE run_id = ?')
    .iterate(runId) as Iterable<{ item_id: number; fingerprint: string; status: ItemRunResult['status'] }>) {
    out.set(r.item_id, { fingerprint: r.fingerprint, status: r.status });
  }
  return out;
}

/** A forecast an earlier complete run made for a week that has since been observed. */
export interface PastForecastRow {
  weekStart: string;
  mean: number;
  se: number;
  step: number;
  runId: number;
}

/**
 * item id → the earlier forecasts for weeks up to `through` (inclusive), one per week: the one made
 * closest to the week (smallest step; the newer run on a tie), in week order. These are the
 * forecasts whose realised errors the engine tracks (bias, Trigg's tracking signal).
 */
export function getPastForecasts(store: Store, through: string): Map<number, PastForecastRow[]> {
  const out = new Map<number, PastForecastRow[]>();
  const rows = store.db
    .prepare(
      `SELECT f.item_id, f.week_start, f.mean, f.se, f.step, f.run_id
       FROM run_forecasts f JOIN planning_runs r ON r.id = f.run_id AND r.status = 'complete'
       WHERE f.week_start <= ?
       ORDER BY f.item_id, f.week_start, f.step, f.run_id DESC`,
    )
    .raw()
    .iterate(through) as Iterable<[number, string, number, number, number, number]>;
  let lastItem = -1;
  let lastWeek = '';
  let list: PastForecastRow[] = [];
  for (const [itemId, week, mean, se, step, runId] of rows) {
    if (itemId !== lastItem) {
      list = [];
      out.set(itemId, list);
      lastItem = itemId;
      lastWeek = '';
    }
    if (week === lastWeek) continue;
    lastWeek = week;
    list.push({ weekStart: week, mean, se, step, runId });
  }
  return out;
}

export interface RunHeader {
  startedAt: string;
  finishedAt?: string;
  actor: string | null;
  settings: unknown;
  note: string | null;
}

export interface PlannedEntry {
  itemId: number;
  fingerprint: string;
  record: ItemRunRecord;
}

export interface ReusedEntry {
  itemId: number;
  /** The run whose rows are copied. */
  fromRunId: number;
}

/**
 * Write a complete run in ONE transaction: the run row, every planned item's rows, and a copy of
 * the rows of every reused item. Returns the new run's id. Throws (and writes nothing) on error.
 */
export function writeRun(
  store: Store,
  header: RunHeader,
  planned: Iterable<PlannedEntry>,
  reused: readonly ReusedEntry[],
  /** A stand-in record for an item whose rows the store refused (none given: the write fails). */
  onItemError?: (itemId: number, err: unknown) => ItemRunRecord | null,
): number {
  const db = store.db;
  const insRun = db.prepare(
    `INSERT INTO planning_runs (started_at, finished_at, status, items_total, items_planned, items_reused, items_failed, actor, settings_json, note)
     VALUES (?, NULL, 'running', 0, 0, 0, 0, ?, ?, ?)`,
  );
  const insItem = db.prepare(
    `INSERT INTO run_items (run_id, item_id, fingerprint, status, reused_from_run_id, diagnostics_json, error)
     VALUES (?, ?, ?, ?, NULL, ?, ?)`,
  );
  const insModel = db.prepare(
    `INSERT OR IGNORE INTO run_models (run_id, item_id, p, d, q, seasonal_harmonics, include_mean, aicc, chosen, detail_json)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
  );
  const insForecast = db.prepare(
    `INSERT INTO run_forecasts (run_id, item_id, step, week_start, mean, se, lower80, upper80, lower95, upper95)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
  );
  const insFlag = db.prepare(
    'INSERT INTO run_flags (run_id, item_id, seq, code, severity, reason, action) VALUES (?, ?, ?, ?, ?, ?, ?)',
  );
  const insOrder = db.prepare(
    `INSERT INTO order_lines (run_id, item_id, order_qty, case_packs, reorder_point, order_up_to, safety_stock,
       interval_forecast, interval_sd, service_level, service_kind, explanation, detail_json)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
  );
  const copyItem = db.prepare(
    `INSERT INTO run_items (run_id, item_id, fingerprint, status, reused_from_run_id, diagnostics_json, error)
     SELECT ?, item_id, fingerprint, 'reused', CASE WHEN status = 'reused' THEN coalesce(reused_from_run_id, run_id) ELSE run_id END,
            diagnostics_json, error
     FROM run_items WHERE run_id = ? AND item_id = ?`,
  );
  const copyModels = db.prepare(
    `INSERT INTO run_models (run_id, item_id, p, d, q, seasonal_harmonics, include_mean, aicc, chosen, detail_json)
     SELECT ?, item_id, p, d, q, seasonal_harmonics, include_mean, aicc, chosen, detail_json
     FROM run_models WHERE run_id = ? AND item_id = ?`,
  );
  const copyForecasts = db.prepare(
    `INSERT INTO run_forecasts (run_id, item_id, step, week_start, mean, se, lower80, upper80, lower95, upper95)
     SELECT ?, item_id, step, week_start, mean, se, lower80, upper80, lower95, upper95
     FROM run_forecasts WHERE run_id = ? AND item_id = ?`,
  );
  const copyFlags = db.prepare(
    `INSERT INTO run_flags (run_id, item_id, seq, code, severity, reason, action)
     SELECT ?, item_id, seq, code, severity, reason, action FROM run_flags WHERE run_id = ? AND item_id = ?`,
  );
  const copyOrder = db.prepare(
    `INSERT INTO order_lines (run_id, item_id, order_qty, case_packs, reorder_point, order_up_to, safety_stock,
       interval_forecast, interval_sd, service_level, service_kind, explanation, detail_json)
     SELECT ?, item_id, order_qty, case_packs, reorder_point, order_up_to, safety_stock,
       interval_forecast, interval_sd, service_level, service_kind, explanation, detail_json
     FROM order_lines WHERE run_id = ? AND item_id = ?`,
  );
  // A planner's edit of a reused line stays with it: the line is the same suggestion as before.
  const copyEdit = db.prepare(
    `INSERT INTO order_edits (run_id, item_id, order_qty, reason, actor, at)
     SELECT ?, item_id, order_qty, reason, actor, at FROM order_edits WHERE run_id = ? AND item_id = ?`,
  );
  const finish = db.prepare(
    `UPDATE planning_runs SET status = 'complete', finished_at = ?, items_total = ?, items_planned = ?,
       items_reused = ?, items_failed = ? WHERE id = ?`,
  );

  return store.transaction(() => {
    const runId = Number(
      insRun.run(header.startedAt, header.actor, JSON.stringify(header.settings ?? null), header.note)
        .lastInsertRowid,
    );
    let nPlanned = 0;
    let nFailed = 0;
    const insertPlanned = (itemId: number, fingerprint: string, r: ItemRunRecord) => {
      insItem.run(runId, itemId, fingerprint, r.status, r.diagnosticsJson, r.error);
      for (const m of r.models) {
        insModel.run(
          runId,
          itemId,
          m.p,
          m.d,
          m.q,
          m.seasonalHarmonics,
          m.includeMean ? 1 : 0,
          finiteOrNull(m.aicc),
          m.chosen ? 1 : 0,
          m.detailJson,
        );
      }
      for (const f of r.forecasts) {
        insForecast.run(
          runId,
          itemId,
          f.step,
          f.week,
          f.mean,
          f.se,
          f.lower80,
          f.upper80,
          f.lower95,
          f.upper95,
        );
      }
      r.flags.forEach((f, seq) => {
        insFlag.run(runId, itemId, seq, f.code, f.severity, f.reason, f.action);
      });
      const o = r.order;
      if (o) {
        insOrder.run(
          runId,
          itemId,
          o.orderQty,
          o.casePacks,
          o.reorderPoint,
          o.orderUpTo,
          o.safetyStock,
          o.intervalForecast,
          o.intervalSd,
          o.serviceLevel,
          o.serviceKind,
          o.explanation,
          o.detailJson,
        );
      }
    };
    const itemExists = db.prepare('SELECT 1 FROM items WHERE id = ?');
    const list = [...planned];
    try {
      // Fast path: all items in one savepoint.
      store.transaction(() => {
        for (const { itemId, fingerprint, record } of list) insertPlanned(itemId, fingerprint, record);
      });
      nPlanned = list.length;
      nFailed = list.filter((p) => p.record.status === 'failed').length;
    } catch {
      // Some item's rows were refused: again item by item, each in its own savepoint, so that
      // item pays for it and the run does not.
      for (const { itemId, fingerprint, record } of list) {
        try {
          store.transaction(() => insertPlanned(itemId, fingerprint, record));
          if (record.status === 'failed') nFailed++;
        } catch (err) {
          if (!itemExists.get(itemId)) continue; // deleted while the run was planning: nothing to keep
          const replacement = onItemError?.(itemId, err);
          if (!replacement) throw err;
          store.transaction(() => insertPlanned(itemId, fingerprint, replacement));
          nFailed++;
        }
        nPlanned++;
      }
    }
    for (const { itemId, fromRunId } of reused) {
      if (copyItem.run(runId, fromRunId, itemId).changes !== 1) {
        throw new Error(`planning run: item ${itemId} has no result in run ${fromRunId} to reuse`);
      }
      copyModels.run(runId, fromRunId, itemId);
      copyForecasts.run(runId, fromRunId, itemId);
      copyFlags.run(runId, fromRunId, itemId);
      copyOrder.run(runId, fromRunId, itemId);
      copyEdit.run(runId, fromRunId, itemId);
    }
    finish.run(
      header.finishedAt ?? nowIso(),
      nPlanned + reused.length,
      nPlanned,
      reused.length,
      nFailed,
      runId,
    );
    return runId;
  });
}

function finiteOrNull(x: number | null): number | null {
  return x !== null && Number.isFinite(x) ? x : null;
}

/** Record a run that did not complete (cancelled or failed) with no results, for the run history. */
export function recordUnfinishedRun(
  store: Store,
  header: RunHeader & { status: 'cancelled' | 'failed'; itemsTotal: number },
): number {
  return Number(
    store.db
      .prepare(
        `INSERT INTO planning_runs (started_at, finished_at, status, items_total, actor, settings_json, note)
         VALUES (?, ?, ?, ?, ?, ?, ?)`,
      )
      .run(
        header.startedAt,
        header.finishedAt ?? nowIso(),
        header.status,
        header.itemsTotal,
        header.actor,
        JSON.stringify(header.settings ?? null),
        header.note,
      ).lastInsertRowid,
  );
}

// ---------------------------------------------------------------------------------------------
// Reading a run's results (the latest complete run unless a run id is given).

export interface ChosenModel {
  p: number;
  d: number;
  q: number;
  seasonalHarmonics: number;
  includeMean: boolean;
  aicc: number | null;
  detail: unknown;
}

export interface StoredOrderLine extends OrderLineFigures {
  sku: string;
  description: string;
  supplier: string | null;
  /** The quantity to order: the planner's edit when there is one, else the suggestion. */
  orderQty: number;
  suggestedQty: number;
  flags: string[];
  edit: { qty: number; reason: string; actor: string; at: string } | null;
  detail: unknown;
}

export interface ItemRunResult {
  runId: number;
  sku: string;
  status: 'planned' | 'reused' | 'fallback' | 'failed';
  reusedFromRunId: number | null;
  fingerprint: string;
  model: ChosenModel | null;
  candidates: (ChosenModel & { chosen: boolean })[];
  forecast: ForecastPoint[];
  flags: Flag[];
  diagnostics: unknown;
  order: StoredOrderLine | null;
  error: string | null;
}

function resolveRunId(store: Store, runId: number | undefined): number | null {
  if (runId !== undefined) return runId;
  return getLatestRun(store)?.id ?? null;
}

interface OrderDbRow {
  item_id: number;
  sku: string;
  description: string;
  supplier: string | null;
  order_qty: number | null;
  case_packs: number | null;
  reorder_point: number | null;
  order_up_to: number | null;
  safety_stock: number | null;
  interval_forecast: number | null;
  interval_sd: number | null;
  service_level: number | null;
  service_kind: ServiceKind | null;
  explanation: string | null;
  detail_json: string | null;
  edit_qty: number | null;
  edit_reason: string | null;
  edit_actor: string | null;
  edit_at: string | null;
  flag_codes: string | null;
}

const ORDER_SELECT = `
SELECT i.id AS item_id, i.sku, i.description, s.name AS supplier, o.order_qty, o.case_packs, o.reorder_point,
       o.order_up_to, o.safety_stock, o.interval_forecast, o.interval_sd, o.service_level, o.service_kind,
       o.explanation, o.detail_json, e.order_qty AS edit_qty, e.reason AS edit_reason, e.actor AS edit_actor,
       e.at AS edit_at,
       (SELECT group_concat(f.code, ';' ORDER BY f.seq) FROM run_flags f WHERE f.run_id = @run AND f.item_id = i.id) AS flag_codes
FROM items i
LEFT JOIN suppliers s ON s.id = i.supplier_id
LEFT JOIN order_lines o ON o.run_id = @run AND o.item_id = i.id
LEFT JOIN order_edits e ON e.run_id = @run AND e.item_id = i.id`;

function orderFromRow(r: OrderDbRow, withDetail = true): StoredOrderLine | null {
  if (r.order_qty === null) return null;
  const edit =
    r.edit_qty === null
      ? null
      : { qty: r.edit_qty, reason: r.edit_reason ?? '', actor: r.edit_actor ?? '', at: r.edit_at ?? '' };
  return {
    sku: r.sku,
    description: r.description,
    supplier: r.supplier,
    orderQty: edit ? edit.qty : r.order_qty,
    suggestedQty: r.order_qty,
    casePacks: r.case_packs ?? 0,
    reorderPoint: r.reorder_point ?? 0,
    orderUpTo: r.order_up_to ?? 0,
    safetyStock: r.safety_stock ?? 0,
    intervalForecast: r.interval_forecast ?? 0,
    intervalSd: r.interval_sd ?? 0,
    serviceLevel: r.service_level ?? 0,
    serviceKind: r.service_kind ?? 'cycle',
    flags: r.flag_codes ? r.flag_codes.split(';') : [],
    explanation: r.explanation ?? '',
    edit,
    detail: withDetail && r.detail_json ? JSON.parse(r.detail_json) : null,
  };
}

/** One item's results in a run (default: the latest complete run); null when the run has none for it. */
export function getItemRunResult(store: Store, sku: string, runId?: number): ItemRunResult | null {
  const run = resolveRunId(store, runId);
  if (run === null) return null;
  const item = store.db
    .prepare(
      `SELECT ri.item_id, ri.fingerprint, ri.status, ri.reused_from_run_id, ri.diagnostics_json, ri.error
       FROM run_items ri JOIN items i ON i.id = ri.item_id WHERE ri.run_id = ? AND i.sku = ?`,
    )
    .get(run, sku) as
    | {
        item_id: number;
        fingerprint: string;
        status: ItemRunResult['status'];
        reused_from_run_id: number | null;
        diagnostics_json: string | null;
        error: string | null;
      }
    | undefined;
  if (!item) return null;
  const models = (
    store.db
      .prepare(
        'SELECT p, d, q, seasonal_harmonics, include_mean, aicc, chosen, detail_json FROM run_models WHERE run_id = ? AND item_id = ? ORDER BY aicc IS NULL, aicc',
      )
      .all(run, item.item_id) as {
      p: number;
      d: number;
      q: number;
      seasonal_harmonics: number;
      include_mean: number;
      aicc: number | null;
      chosen: number;
      detail_json: string;
    }[]
  ).map((m) => ({
    p: m.p,
    d: m.d,
    q: m.q,
    seasonalHarmonics: m.seasonal_harmonics,
    includeMean: m.include_mean === 1,
    aicc: m.aicc,
    chosen: m.chosen === 1,
    detail: JSON.parse(m.detail_json),
  }));
  const chosen = models.find((m) => m.chosen) ?? null;
  const forecast = (
    store.db
      .prepare(
        'SELECT step, week_start AS week, mean, se, lower80, upper80, lower95, upper95 FROM run_forecasts WHERE run_id = ? AND item_id = ? ORDER BY step',
      )
      .all(run, item.item_id) as ForecastPoint[]
  ).map((f) => ({ ...f }));
  const flags = store.db
    .prepare(
      'SELECT code, severity, reason, action FROM run_flags WHERE run_id = ? AND item_id = ? ORDER BY seq',
    )
    .all(run, item.item_id) as Flag[];
  const orderRow = store.db.prepare(`${ORDER_SELECT} WHERE i.id = @item`).get({ run, item: item.item_id }) as
    | OrderDbRow
    | undefined;
  return {
    runId: run,
    sku,
    status: item.status,
    reusedFromRunId: item.reused_from_run_id,
    fingerprint: item.fingerprint,
    model: chosen
      ? {
          p: chosen.p,
          d: chosen.d,
          q: chosen.q,
          seasonalHarmonics: chosen.seasonalHarmonics,
          includeMean: chosen.includeMean,
          aicc: chosen.aicc,
          detail: chosen.detail,
        }
      : null,
    candidates: models,
    forecast,
    flags,
    diagnostics: item.diagnostics_json ? JSON.parse(item.diagnostics_json) : null,
    order: orderRow ? orderFromRow(orderRow) : null,
    error: item.error,
  };
}

const SEVERITY_WEIGHT = { critical: 100, warning: 10, info: 1 } as const;

export interface ReviewQueueEntry {
  sku: string;
  description: string;
  supplier: string | null;
  /** Σ over the item's flags of critical 100, warning 10, info 1: higher is worse (our own scale). */
  score: number;
  flags: Flag[];
  /** The planner marked the item reviewed (against this run, or without naming a run). */
  reviewed: boolean;
}

/** Flagged items of a run (default: the latest complete run), worst first; ties by SKU. */
export function getReviewQueue(store: Store, runId?: number): ReviewQueueEntry[] {
  const run = resolveRunId(store, runId);
  if (run === null) return [];
  const rows = store.db
    .prepare(
      `SELECT i.sku, i.description, s.name AS supplier, f.code, f.severity, f.reason, f.action,
              o.reviewed_at, o.reviewed_run_id
       FROM run_flags f JOIN items i ON i.id = f.item_id
       LEFT JOIN suppliers s ON s.id = i.supplier_id
       LEFT JOIN overrides o ON o.item_id = i.id
       WHERE f.run_id = ? AND i.active = 1
       ORDER BY i.sku, f.seq`,
    )
    .all(run) as (Flag & {
    sku: string;
    description: string;
    supplier: string | null;
    reviewed_at: string | null;
    reviewed_run_id: number | null;
  })[];
  const bySku = new Map<string, ReviewQueueEntry>();
  for (const r of rows) {
    let e = bySku.get(r.sku);
    if (!e) {
      e = {
        sku: r.sku,
        description: r.description,
        supplier: r.supplier,
        score: 0,
        flags: [],
        reviewed: r.reviewed_at !== null && (r.reviewed_run_id === null || r.reviewed_run_id === run),
      };
      bySku.set(r.sku, e);
    }
    e.flags.push({ code: r.code, severity: r.severity, reason: r.reason, action: r.action });
    e.score += SEVERITY_WEIGHT[r.severity] ?? 0;
  }
  return [...bySku.values()].sort(
    (a, b) => b.score - a.score || (a.sku < b.sku ? -1 : a.sku > b.sku ? 1 : 0),
  );
}

export interface SupplierOrderGroup<L extends StoredOrderLine = StoredOrderLine> {
  /** Null for items without a supplier (listed last). */
  supplier: string | null;
  lines: L[];
  totalUnits: number;
}

/** A line of the order list: `planned` false for an active item the run has no line for. */
export interface PlannedOrderLine extends StoredOrderLine {
  planned: boolean;
}

/**
 * The order list of a run (default: the latest complete run): one line per ACTIVE item, grouped by
 * supplier (by name, items without a supplier last), SKUs in order within a group. An active item
 * the run has no line for (it arrived after the run) comes with `planned: false` and zeros.
 * `detail` stays null unless `withDetail` (parsing it for 10,000 lines costs more than the rest).
 */
export function getOrderLinesBySupplier(
  store: Store,
  options: {
    runId?: number;
    supplier?: string /** Parse each line's full engine detail (default false). */;
    withDetail?: boolean;
  } = {},
): {
  runId: number | null;
  groups: SupplierOrderGroup<PlannedOrderLine>[];
} {
  const run = resolveRunId(store, options.runId);
  const where = options.supplier !== undefined ? ' AND s.name = @supplier' : '';
  const rows = store.db
    .prepare(`${ORDER_SELECT} WHERE i.active = 1${where} ORDER BY s.name IS NULL, s.name, i.sku`)
    .all({ run: run ?? -1, supplier: options.supplier }) as OrderDbRow[];
  const groups: SupplierOrderGroup<PlannedOrderLine>[] = [];
  for (const r of rows) {
    const line = orderFromRow(r, options.withDetail === true);
    const full =
      line !== null
        ? { ...line, planned: true }
        : {
            sku: r.sku,
            description: r.description,
            supplier: r.supplier,
            orderQty: 0,
            suggestedQty: 0,
            casePacks: 0,
            reorderPoint: 0,
            orderUpTo: 0,
            safetyStock: 0,
            intervalForecast: 0,
            intervalSd: 0,
            serviceLevel: 0,
            serviceKind: 'cycle' as ServiceKind,
            flags: ['not-planned'],
            explanation:
              'Not planned yet: the item came in after the latest planning run. Run the planning again.',
            edit: null,
            detail: null,
            planned: false,
          };
    let g = groups[groups.length - 1];
    if (!g || g.supplier !== r.supplier) {
      g = { supplier: r.supplier, lines: [], totalUnits: 0 };
      groups.push(g);
    }
    g.lines.push(full);
    g.totalUnits += full.orderQty;
  }
  return { runId: run, groups };
}

/** An item's chosen order and its status in a run, as the items overview lists them. */
export interface ChosenOrder {
  p: number;
  d: number;
  q: number;
  seasonalHarmonics: number;
  includeMean: boolean;
  status: ItemRunResult['status'];
}

/** SKU → the chosen model and item status of every item in a run (default: latest), in one query. */
export function getChosenModels(store: Store, runId?: number): Map<string, ChosenOrder | null> {
  const out = new Map<string, ChosenOrder | null>();
  const run = resolveRunId(store, runId);
  if (run === null) return out;
  const rows = store.db
    .prepare(
      `SELECT i.sku, ri.status, m.p, m.d, m.q, m.seasonal_harmonics, m.include_mean
       FROM run_items ri JOIN items i ON i.id = ri.item_id
       LEFT JOIN run_models m ON m.run_id = ri.run_id AND m.item_id = ri.item_id AND m.chosen = 1
       WHERE ri.run_id = ?`,
    )
    .all(run) as {
    sku: string;
    status: ItemRunResult['status'];
    p: number | null;
    d: number | null;
    q: number | null;
    seasonal_harmonics: number | null;
    include_mean: number | null;
  }[];
  for (const r of rows) {
    out.set(
      r.sku,
      r.p === null
        ? null
        : {
            p: r.p,
            d: r.d ?? 0,
            q: r.q ?? 0,
            seasonalHarmonics: r.seasonal_harmonics ?? 0,
            includeMean: r.include_mean === 1,
            status: r.status,
          },
    );
  }
  return out;
}
