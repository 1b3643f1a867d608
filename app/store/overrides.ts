/**
 * Planner decisions (tables overrides, order_edits): a forced model, forecast adjustments, a safety
 * stock fixed by hand, the reviewed mark, and order quantity edits. Every change is written together
 * with its audit-log entry in one transaction, so no decision exists without its record.
 */
import type { ForecastAdjustment, PlanningOverrides } from '../../core/plan/types';
import { appendAudit } from './audit';
import { nowIso, type Store } from './store';

export type ItemOverrides = Required<PlanningOverrides> & {
  reviewedAt: string | null;
  reviewedBy: string | null;
  reviewedRunId: number | null;
};

export interface Decision {
  actor: string;
  reason?: string | null;
}

interface OverrideRow {
  forced_model_json: string | null;
  adjustments_json: string;
  safety_stock: number | null;
  reviewed_at: string | null;
  reviewed_by: string | null;
  reviewed_run_id: number | null;
}

const NONE: ItemOverrides = {
  forcedModel: null,
  adjustments: [],
  safetyStock: null,
  reviewedAt: null,
  reviewedBy: null,
  reviewedRunId: null,
};

function fromRow(r: OverrideRow | undefined): ItemOverrides {
  if (!r) return structuredClone(NONE);
  return {
    forcedModel: r.forced_model_json === null ? null : JSON.parse(r.forced_model_json),
    adjustments: JSON.parse(r.adjustments_json) as ForecastAdjustment[],
    safetyStock: r.safety_stock,
    reviewedAt: r.reviewed_at,
    reviewedBy: r.reviewed_by,
    reviewedRunId: r.reviewed_run_id,
  };
}

function itemId(store: Store, sku: string): number {
  const r = store.db.prepare('SELECT id FROM items WHERE sku = ?').get(sku) as { id: number } | undefined;
  if (!r) throw new Error(`unknown SKU '${sku}'`);
  return r.id;
}

/** The overrides of one SKU (none set: empty). */
export function getOverrides(store: Store, sku: string): ItemOverrides {
  return fromRow(
    store.db
      .prepare(
        'SELECT o.forced_model_json, o.adjustments_json, o.safety_stock, o.reviewed_at, o.reviewed_by, o.reviewed_run_id FROM overrides o JOIN items i ON i.id = o.item_id WHERE i.sku = ?',
      )
      .get(sku) as OverrideRow | undefined,
  );
}

/** SKU → overrides of every item that has any (the planning run's bulk read). */
export function getAllOverrides(store: Store): Map<string, ItemOverrides> {
  const out = new Map<string, ItemOverrides>();
  const rows = store.db
    .prepare(
      'SELECT i.sku, o.forced_model_json, o.adjustments_json, o.safety_stock, o.reviewed_at, o.reviewed_by, o.reviewed_run_id FROM overrides o JOIN items i ON i.id = o.item_id',
    )
    .iterate() as Iterable<OverrideRow & { sku: string }>;
  for (const r of rows) out.set(r.sku, fromRow(r));
  return out;
}

/** The part of the overrides the planning engine takes. */
export function toPlanningOverrides(o: ItemOverrides): PlanningOverrides {
  return { forcedModel: o.forcedModel, adjustments: o.adjustments, safetyStock: o.safetyStock };
}

function change(
  store: Store,
  sku: string,
  action: string,
  d: Decision,
  apply: (o: ItemOverrides) => unknown,
  pick: (o: ItemOverrides) => unknown,
): ItemOverrides {
  return store.transaction(() => {
    const id = itemId(store, sku);
    const before = getOverrides(store, sku);
    const after = structuredClone(before);
    apply(after);
    const now = nowIso();
    store.db
      .prepare(
        `INSERT INTO overrides (item_id, forced_model_json, adjustments_json, safety_stock, reviewed_at, reviewed_by, reviewed_run_id, updated_at)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?)
         ON CONFLICT (item_id) DO UPDATE SET forced_model_json = excluded.forced_model_json,
           adjustments_json = excluded.adjustments_json, safety_stock = excluded.safety_stock,
           reviewed_at = excluded.reviewed_at, reviewed_by = excluded.reviewed_by,
           reviewed_run_id = excluded.reviewed_run_id, updated_at = excluded.updated_at`,
      )
      .run(
        id,
        after.forcedModel ? JSON.stringify(after.forcedModel) : null,
        JSON.stringify(after.adjustments),
        after.safetyStock,
        after.reviewedAt,
        after.reviewedBy,
        after.reviewedRunId,
        now,
      );
    appendAudit(store, {
      at: now,
      actor: d.actor,
      sku,
      action,
      before: pick(before),
      after: pick(after),
      reason: d.reason,
    });
    return after;
  });
}

/** Fit exactly this model on the next runs (null: let the selection choose again). */
export function setForcedModel(
  store: Store,
  sku: string,
  model: PlanningOverrides['forcedModel'],
  d: Decision,
): ItemOverrides {
  return change(
    store,
    sku,
    model ? 'force-model' : 'clear-forced-model',
    d,
    (o) => {
      o.forcedModel = model ?? null;
    },
    (o) => o.forcedModel,
  );
}

function checkAdjustment(a: ForecastAdjustment): void {
  if (!/^\d{4}-\d{2}-\d{2}$/.test(a.from) || !/^\d{4}-\d{2}-\d{2}$/.test(a.to) || a.to < a.from) {
    throw new Error(`adjustment: the range ${a.from} – ${a.to} is not two ISO dates in order`);
  }
  if (!Number.isFinite(a.value)) throw new Error(`adjustment: value ${a.value} is not a number`);
  if (a.kind === 'percent' && a.value <= -100) throw new Error('adjustment: a percentage must be above -100');
  if (!a.reason?.trim()) throw new Error('adjustment: a reason is required');
}

/** Add a manual forecast adjustment. */
export function addAdjustment(store: Store, sku: string, a: ForecastAdjustment, d: Decision): ItemOverrides {
  checkAdjustment(a);
  return change(
    store,
    sku,
    'add-adjustment',
    { actor: d.actor, reason: d.reason ?? a.reason },
    (o) => {
      o.adjustments.push(a);
    },
    (o) => o.adjustments,
  );
}

/** Remove the adjustment at `index` (as listed by getOverrides). */
export function removeAdjustment(store: Store, sku: string, index: number, d: Decision): ItemOverrides {
  return change(
    store,
    sku,
    'remove-adjustment',
    d,
    (o) => {
      if (index < 0 || index >= o.adjustments.length)
        throw new Error(`no adjustment number ${index} for ${sku}`);
      o.adjustments.splice(index, 1);
    },
    (o) => o.adjustments,
  );
}

/** Fix the safety stock by hand (null: computed again). */
export function setSafetyStock(store: Store, sku: string, units: number | null, d: Decision): ItemOverrides {
  if (units !== null && !(Number.isFinite(units) && units >= 0)) {
    throw new Error(`safety stock must be a number of units ≥ 0, got ${units}`);
  }
  return change(
    store,
    sku,
    units === null ? 'clear-safety-stock' : 'fix-safety-stock',
    d,
    (o) => {
      o.safetyStock = units;
    },
    (o) => o.safetyStock,
  );
}

/** Mark the item reviewed (by the actor, now, optionally against a run); `reviewed: false` clears it. */
export function markReviewed(
  store: Store,
  sku: string,
  d: Decision & { runId?: number | null; reviewed?: boolean },
): ItemOverrides {
  const on = d.reviewed !== false;
  return change(
    store,
    sku,
    on ? 'mark-reviewed' : 'clear-reviewed',
    d,
    (o) => {
      o.reviewedAt = on ? nowIso() : null;
      o.reviewedBy = on ? d.actor : null;
      o.reviewedRunId = on ? (d.runId ?? null) : null;
    },
    (o) => ({ reviewedAt: o.reviewedAt, reviewedBy: o.reviewedBy, runId: o.reviewedRunId }),
  );
}

/** Planner's edit of a run's suggested order quantity (null removes the edit). */
export function editOrderQty(
  store: Store,
  sku: string,
  runId: number,
  qty: number | null,
  d: Decision,
): void {
  if (qty !== null && !(Number.isFinite(qty) && qty >= 0))
    throw new Error(`order quantity must be ≥ 0, got ${qty}`);
  store.transaction(() => {
    const id = itemId(store, sku);
    const prev = store.db
      .prepare('SELECT order_qty FROM order_edits WHERE run_id = ? AND item_id = ?')
      .get(runId, id) as { order_qty: number } | undefined;
    const suggested = store.db
      .prepare('SELECT order_qty FROM order_lines WHERE run_id = ? AND item_id = ?')
      .get(runId, id) as { order_qty: number } | undefined;
    const now = nowIso();
    if (qty === null)
      store.db.prepare('DELETE FROM order_edits WHERE run_id = ? AND item_id = ?').run(runId, id);
    else {
      store.db
        .prepare(
          `INSERT INTO order_edits (run_id, item_id, order_qty, reason, actor, at) VALUES (?, ?, ?, ?, ?, ?)
           ON CONFLICT (run_id, item_id) DO UPDATE SET order_qty = excluded.order_qty, reason = excluded.reason,
             actor = excluded.actor, at = excluded.at`,
        )
        .run(runId, id, qty, d.reason ?? '', d.actor, now);
    }
    appendAudit(store, {
      at: now,
      actor: d.actor,
      sku,
      action: qty === null ? 'clear-order-edit' : 'edit-order-qty',
      before: { runId, orderQty: prev?.order_qty ?? suggested?.order_qty ?? null },
      after: { runId, orderQty: qty ?? suggested?.order_qty ?? null },
      reason: d.reason,
    });
  });
}

/** SKU → edited quantity for one run. */
export function getOrderEdits(
  store: Store,
  runId: number,
): Map<string, { orderQty: number; reason: string; actor: string; at: string }> {
  const out = new Map<string, { orderQty: number; reason: string; actor: string; at: string }>();
  const rows = store.db
    .prepare(
      'SELECT i.sku, e.order_qty, e.reason, e.actor, e.at FROM order_edits e JOIN items i ON i.id = e.item_id WHERE e.run_id = ?',
    )
    .iterate(runId) as Iterable<{
    sku: string;
    order_qty: number;
    reason: string;
    actor: string;
    at: string;
  }>;
  for (const r of rows) out.set(r.sku, { orderQty: r.order_qty, reason: r.reason, actor: r.actor, at: r.at });
  return out;
}
