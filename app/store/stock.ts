/** Inventory positions (table inventory_positions): the latest on hand, on order and backorders per item. */
import type { InventoryPosition } from '../../core/plan/types';
import type { Store } from './store';

interface PositionRow {
  on_hand: number;
  on_order: number;
  backorders: number;
  as_of: string | null;
}

const ZERO: InventoryPosition = { onHand: 0, onOrder: 0, backorders: 0, asOf: null };

function fromRow(r: PositionRow): InventoryPosition {
  return { onHand: r.on_hand, onOrder: r.on_order, backorders: r.backorders, asOf: r.as_of };
}

/** Position of one SKU; zero when the SKU has none (or is unknown). */
export function getPosition(store: Store, sku: string): InventoryPosition {
  const r = store.db
    .prepare(
      'SELECT p.on_hand, p.on_order, p.backorders, p.as_of FROM inventory_positions p JOIN items i ON i.id = p.item_id WHERE i.sku = ?',
    )
    .get(sku) as PositionRow | undefined;
  return r ? fromRow(r) : { ...ZERO };
}

/** SKU → position of every item that has one. */
export function getAllPositions(store: Store): Map<string, InventoryPosition> {
  const out = new Map<string, InventoryPosition>();
  const rows = store.db
    .prepare(
      'SELECT i.sku, p.on_hand, p.on_order, p.backorders, p.as_of FROM inventory_positions p JOIN items i ON i.id = p.item_id',
    )
    .iterate() as Iterable<PositionRow & { sku: string }>;
  for (const r of rows) out.set(r.sku, fromRow(r));
  return out;
}

/** Replace an item's position. Call inside the import's transaction. */
export function putPosition(
  store: Store,
  itemId: number,
  p: InventoryPosition,
  batchId: number | null,
): void {
  store.db
    .prepare(
      `INSERT INTO inventory_positions (item_id, on_hand, on_order, backorders, as_of, batch_id) VALUES (?, ?, ?, ?, ?, ?)
       ON CONFLICT (item_id) DO UPDATE SET on_hand = excluded.on_hand, on_order = excluded.on_order,
         backorders = excluded.backorders, as_of = excluded.as_of, batch_id = excluded.batch_id`,
    )
    .run(itemId, p.onHand, p.onOrder, p.backorders, p.asOf, batchId);
}
