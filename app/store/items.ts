/**
 * Suppliers and items (tables suppliers, items). An item setting stored as NULL takes the workspace
 * default when read; `placeholder` marks an item created by a sales or stock import for an SKU the
 * item master did not know yet.
 */
import type Database from 'better-sqlite3';
import type { ItemSettings, ServiceKind, WorkspaceSettings } from '../../core/plan/types';
import { getWorkspaceSettings } from './settings';
import { nowIso, type Store } from './store';

/** An item as stored: NULL = "workspace default". */
export interface StoredItem {
  id: number;
  sku: string;
  description: string;
  supplier: string | null;
  unit: string | null;
  casePack: number | null;
  moq: number | null;
  leadTimeWeeks: number | null;
  leadTimeSdWeeks: number | null;
  reviewPeriodWeeks: number | null;
  serviceLevel: number | null;
  serviceKind: ServiceKind | null;
  unitCost: number | null;
  holdingRate: number | null;
  orderCost: number | null;
  shelfLifeWeeks: number | null;
  active: boolean;
  placeholder: boolean;
}

/** The settable fields of an item, as an item-master import gives them. */
export type ItemPatch = { sku: string } & Partial<Omit<StoredItem, 'id' | 'sku' | 'placeholder'>>;

export type PlannedItem = ItemSettings & { id: number; placeholder: boolean };

const SELECT_ITEM = `
SELECT i.id, i.sku, i.description, s.name AS supplier, i.unit, i.case_pack, i.moq, i.lead_time_weeks,
       i.lead_time_sd_weeks, i.review_period_weeks, i.service_level, i.service_kind, i.unit_cost,
       i.holding_rate, i.order_cost, i.shelf_life_weeks, i.active, i.placeholder
FROM items i LEFT JOIN suppliers s ON s.id = i.supplier_id`;

interface ItemRow {
  id: number;
  sku: string;
  description: string;
  supplier: string | null;
  unit: string | null;
  case_pack: number | null;
  moq: number | null;
  lead_time_weeks: number | null;
  lead_time_sd_weeks: number | null;
  review_period_weeks: number | null;
  service_level: number | null;
  service_kind: ServiceKind | null;
  unit_cost: number | null;
  holding_rate: number | null;
  order_cost: number | null;
  shelf_life_weeks: number | null;
  active: number;
  placeholder: number;
}

function fromRow(r: ItemRow): StoredItem {
  return {
    id: r.id,
    sku: r.sku,
    description: r.description,
    supplier: r.supplier,
    unit: r.unit,
    casePack: r.case_pack,
    moq: r.moq,
    leadTimeWeeks: r.lead_time_weeks,
    leadTimeSdWeeks: r.lead_time_sd_weeks,
    reviewPeriodWeeks: r.review_period_weeks,
    serviceLevel: r.service_level,
    serviceKind: r.service_kind,
    unitCost: r.unit_cost,
    holdingRate: r.holding_rate,
    orderCost: r.order_cost,
    shelfLifeWeeks: r.shelf_life_weeks,
    active: r.active === 1,
    placeholder: r.placeholder === 1,
  };
}

/** ItemSettings of a stored item, NULLs resolved against the workspace defaults. */
export function resolveItemSettings(item: StoredItem, ws: WorkspaceSettings): ItemSettings {
  return {
    sku: item.sku,
    description: item.description,
    supplier: item.supplier,
    unit: item.unit ?? 'unit',
    casePack: item.casePack ?? 1,
    moq: item.moq ?? 0,
    leadTimeWeeks: item.leadTimeWeeks ?? ws.leadTimeWeeks,
    leadTimeSdWeeks: item.leadTimeSdWeeks ?? 0,
    reviewPeriodWeeks: item.reviewPeriodWeeks ?? ws.reviewPeriodWeeks,
    // null stays null: the planning run applies the ABC class default, then the workspace default.
    serviceLevel: item.serviceLevel,
    serviceKind: item.serviceKind ?? ws.serviceKind,
    unitCost: item.unitCost,
    holdingRate: item.holdingRate,
    orderCost: item.orderCost,
    shelfLifeWeeks: item.shelfLifeWeeks,
    active: item.active,
  };
}

export function getStoredItem(store: Store, sku: string): StoredItem | null {
  const r = store.db.prepare(`${SELECT_ITEM} WHERE i.sku = ?`).get(sku) as ItemRow | undefined;
  return r ? fromRow(r) : null;
}

/** Settings of one SKU with workspace defaults applied, or null when the SKU is unknown. */
export function getItemSettings(
  store: Store,
  sku: string,
  ws = getWorkspaceSettings(store),
): ItemSettings | null {
  const item = getStoredItem(store, sku);
  return item ? resolveItemSettings(item, ws) : null;
}

/** Every stored item (as stored), ordered by SKU. */
export function listStoredItems(store: Store, options: { activeOnly?: boolean } = {}): StoredItem[] {
  const where = options.activeOnly ? ' WHERE i.active = 1' : '';
  return (store.db.prepare(`${SELECT_ITEM}${where} ORDER BY i.sku`).all() as ItemRow[]).map(fromRow);
}

/** Every active item with its resolved settings, ordered by SKU: the planning run's work list. */
export function listActiveItems(store: Store, ws = getWorkspaceSettings(store)): PlannedItem[] {
  return listStoredItems(store, { activeOnly: true }).map((it) => ({
    ...resolveItemSettings(it, ws),
    id: it.id,
    placeholder: it.placeholder,
  }));
}

/** SKU → item id of every stored item. */
export function itemIdsBySku(store: Store): Map<string, number> {
  const out = new Map<string, number>();
  for (const r of store.db.prepare('SELECT id, sku FROM items').iterate() as Iterable<{
    id: number;
    sku: string;
  }>) {
    out.set(r.sku, r.id);
  }
  return out;
}

export function countItems(store: Store): number {
  return (store.db.prepare('SELECT count(*) AS n FROM items').get() as { n: number }).n;
}

/** Id of the supplier of this name, created when new. */
export function ensureSupplier(store: Store, name: string): number {
  const found = store.db.prepare('SELECT id FROM suppliers WHERE name = ?').get(name) as
    | { id: number }
    | undefined;
  if (found) return found.id;
  return Number(
    store.db.prepare('INSERT INTO suppliers (name, created_at) VALUES (?, ?)').run(name, nowIso())
      .lastInsertRowid,
  );
}

export function listSuppliers(store: Store): { id: number; name: string; items: number }[] {
  return store.db
    .prepare(
      'SELECT s.id, s.name, count(i.id) AS items FROM suppliers s LEFT JOIN items i ON i.supplier_id = s.id GROUP BY s.id ORDER BY s.name',
    )
    .all() as { id: number; name: string; items: number }[];
}

/**
 * Create active placeholder items (all settings on the workspace defaults) with a zero inventory
 * position, for SKUs not yet known. Returns SKU → new id. Call inside the import's transaction.
 */
export function createPlaceholderItems(
  store: Store,
  skus: Iterable<string>,
  batchId: number | null,
): Map<string, number> {
  const now = nowIso();
  const insert = store.db.prepare(
    "INSERT INTO items (sku, description, active, placeholder, created_batch_id, updated_batch_id, updated_at) VALUES (?, '', 1, 1, ?, ?, ?)",
  );
  const position = store.db.prepare(
    'INSERT INTO inventory_positions (item_id, on_hand, on_order, backorders, as_of, batch_id) VALUES (?, 0, 0, 0, NULL, ?)',
  );
  const out = new Map<string, number>();
  for (const sku of skus) {
    const id = Number(insert.run(sku, batchId, batchId, now).lastInsertRowid);
    position.run(id, batchId);
    out.set(sku, id);
  }
  return out;
}

const COLUMN_OF: Record<keyof Omit<ItemPatch, 'sku' | 'supplier'>, string> = {
  description: 'description',
  unit: 'unit',
  casePack: 'case_pack',
  moq: 'moq',
  leadTimeWeeks: 'lead_time_weeks',
  leadTimeSdWeeks: 'lead_time_sd_weeks',
  reviewPeriodWeeks: 'review_period_weeks',
  serviceLevel: 'service_level',
  serviceKind: 'service_kind',
  unitCost: 'unit_cost',
  holdingRate: 'holding_rate',
  orderCost: 'order_cost',
  shelfLifeWeeks: 'shelf_life_weeks',
  active: 'active',
};

/**
 * Insert or update items from an item master: only the fields present in a patch are written (a
 * field given as null returns to the workspace default); the placeholder mark is cleared.
 * Returns counts of created and updated items. Call inside the import's transaction.
 */
export function upsertItems(
  store: Store,
  patches: readonly ItemPatch[],
  batchId: number | null,
): { created: number; updated: number } {
  const now = nowIso();
  const ids = itemIdsBySku(store);
  const supplierIds = new Map<string, number>();
  const statements = new Map<string, Database.Statement<unknown[]>>();
  let created = 0;
  let updated = 0;
  const insert = store.db.prepare(
    "INSERT INTO items (sku, description, active, placeholder, created_batch_id, updated_batch_id, updated_at) VALUES (?, '', 1, 0, ?, ?, ?)",
  );
  const position = store.db.prepare(
    'INSERT INTO inventory_positions (item_id, on_hand, on_order, backorders, as_of, batch_id) VALUES (?, 0, 0, 0, NULL, ?)',
  );
  for (const patch of patches) {
    let id = ids.get(patch.sku);
    if (id === undefined) {
      id = Number(insert.run(patch.sku, batchId, batchId, now).lastInsertRowid);
      position.run(id, batchId);
      ids.set(patch.sku, id);
      created++;
    } else updated++;
    const cols: string[] = ['placeholder = 0', 'updated_batch_id = ?', 'updated_at = ?'];
    const values: unknown[] = [batchId, now];
    for (const [key, col] of Object.entries(COLUMN_OF) as [keyof typeof COLUMN_OF, string][]) {
      if (!(key in patch)) continue;
      const v = patch[key];
      cols.push(`${col} = ?`);
      if (key === 'active') values.push(v === undefined || v === null ? 1 : v ? 1 : 0);
      else if (key === 'description') values.push(v ?? '');
      else values.push(v ?? null);
    }
    if ('supplier' in patch) {
      let sid: number | null = null;
      if (patch.supplier) {
        sid = supplierIds.get(patch.supplier) ?? ensureSupplier(store, patch.supplier);
        supplierIds.set(patch.supplier, sid);
      }
      cols.push('supplier_id = ?');
      values.push(sid);
    }
    const sql = `UPDATE items SET ${cols.join(', ')} WHERE id = ?`;
    let st = statements.get(sql);
    if (!st) statements.set(sql, (st = store.db.prepare(sql)));
    values.push(id);
    st.run(values);
  }
  return { created, updated };
}
