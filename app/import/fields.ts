/**
 * The canonical fields of each kind of file and the header names we recognise for them. A header
 * is matched after normalising it (trimmed, lower case, runs of spaces/punctuation → '_', '#' → 'no'),
 * so "Item Code", " item-code " and "ITEM_CODE" are one name. `--map column=field` overrides.
 */
import type { ImportKind } from '../store/batches';

export interface FieldSpec {
  field: string;
  synonyms: string[];
  required?: boolean;
}

/** The SKU column, named the same way in every kind of file. */
const SKU_FIELD: FieldSpec = {
  field: 'sku',
  required: true,
  synonyms: [
    'sku',
    'item',
    'item_code',
    'item_no',
    'item_number',
    'item_id',
    'article',
    'article_no',
    'product',
    'product_code',
    'product_id',
    'part',
    'part_no',
    'part_number',
    'code',
  ],
};

export const FIELDS: Record<ImportKind, FieldSpec[]> = {
  sales: [
    {
      field: 'week',
      synonyms: [
        'week',
        'week_start',
        'week_starting',
        'week_commencing',
        'week_beginning',
        'wk',
        'week_of',
        'period_start',
      ],
    },
    {
      field: 'date',
      synonyms: [
        'date',
        'order_date',
        'sale_date',
        'sales_date',
        'invoice_date',
        'transaction_date',
        'ship_date',
        'delivery_date',
        'day',
      ],
    },
    SKU_FIELD,
    {
      field: 'qty',
      required: true,
      synonyms: [
        'qty',
        'quantity',
        'units',
        'units_sold',
        'qty_sold',
        'quantity_sold',
        'sold',
        'demand',
        'sales_qty',
        'volume',
        'pieces',
      ],
    },
    { field: 'stockout', synonyms: ['stockout', 'stock_out', 'stocked_out', 'out_of_stock', 'oos'] },
    {
      field: 'order',
      synonyms: [
        'order',
        'order_no',
        'order_number',
        'order_id',
        'invoice',
        'invoice_no',
        'invoice_number',
        'document',
        'document_no',
      ],
    },
  ],
  items: [
    SKU_FIELD,
    {
      field: 'description',
      synonyms: ['description', 'desc', 'name', 'item_name', 'product_name', 'item_description', 'title'],
    },
    {
      field: 'supplier',
      synonyms: ['supplier', 'vendor', 'supplier_name', 'vendor_name', 'manufacturer', 'source'],
    },
    { field: 'unit', synonyms: ['unit', 'uom', 'unit_of_measure', 'base_unit', 'units_of_measure'] },
    {
      field: 'case_pack',
      synonyms: [
        'case_pack',
        'pack',
        'pack_size',
        'case_size',
        'case_qty',
        'units_per_case',
        'order_multiple',
        'multiple',
      ],
    },
    {
      field: 'moq',
      synonyms: [
        'moq',
        'min_order',
        'min_order_qty',
        'minimum_order',
        'minimum_order_qty',
        'minimum_order_quantity',
      ],
    },
    {
      field: 'lead_time_weeks',
      synonyms: ['lead_time_weeks', 'lead_time', 'lead_time_wk', 'lead_time_w', 'lt', 'lt_weeks', 'leadtime'],
    },
    {
      field: 'lead_time_sd_weeks',
      synonyms: [
        'lead_time_sd_weeks',
        'lead_time_sd',
        'lead_time_std',
        'lead_time_stdev',
        'lt_sd',
        'lead_time_variability',
      ],
    },
    {
      field: 'review_period_weeks',
      synonyms: ['review_period_weeks', 'review_period', 'review_weeks', 'order_cycle', 'order_cycle_weeks'],
    },
    {
      field: 'service_level',
      synonyms: ['service_level', 'service', 'service_target', 'target_service', 'target_service_level'],
    },
    {
      field: 'service_kind',
      synonyms: [
        'service_kind',
        'service_type',
        'service_measure',
        'service_level_kind',
        'service_level_type',
      ],
    },
    {
      field: 'unit_cost',
      synonyms: ['unit_cost', 'cost', 'cost_price', 'purchase_price', 'unit_price', 'price'],
    },
    {
      field: 'holding_rate',
      synonyms: ['holding_rate', 'holding_cost_rate', 'carrying_rate', 'carrying_cost_rate', 'holding'],
    },
    { field: 'order_cost', synonyms: ['order_cost', 'ordering_cost', 'cost_per_order', 'setup_cost'] },
    {
      field: 'shelf_life_weeks',
      synonyms: ['shelf_life_weeks', 'shelf_life', 'shelf_life_wk', 'best_before_weeks'],
    },
    { field: 'active', synonyms: ['active', 'is_active', 'enabled', 'status_active', 'in_use'] },
  ],
  stock: [
    SKU_FIELD,
    {
      field: 'on_hand',
      required: true,
      synonyms: [
        'on_hand',
        'onhand',
        'stock',
        'in_stock',
        'qty_on_hand',
        'quantity_on_hand',
        'available',
        'inventory',
        'soh',
      ],
    },
    {
      field: 'on_order',
      synonyms: ['on_order', 'onorder', 'open_orders', 'open_po', 'incoming', 'in_transit', 'qty_on_order'],
    },
    {
      field: 'backorders',
      synonyms: ['backorders', 'backorder', 'back_orders', 'backlog', 'qty_backordered'],
    },
    {
      field: 'as_of',
      synonyms: ['as_of', 'as_of_date', 'date', 'stock_date', 'snapshot_date', 'count_date'],
    },
  ],
};

export const IGNORE = 'ignore';

/** Header normalisation used for matching (see the top comment). */
export function normaliseHeader(name: string): string {
  return name
    .trim()
    .toLowerCase()
    .replace(/#/g, ' no ')
    .replace(/%/g, ' pct ')
    .replace(/[^a-z0-9]+/g, '_')
    .replace(/^_+|_+$/g, '');
}

export interface ColumnMapping {
  /** For each column of the file (by position): the canonical field, or null when ignored. */
  fieldOf: (string | null)[];
  /** Field → column index. */
  columnOf: Map<string, number>;
  /** The header names as they appear in the file, trimmed. */
  headers: string[];
}

/**
 * Map header columns to fields: explicit `--map` entries first, then synonyms. Returns the mapping
 * or the list of problems (each a sentence) that stop the import.
 */
export function resolveMapping(
  kind: ImportKind,
  header: string[],
  explicit: Record<string, string> = {},
): { mapping: ColumnMapping; problems: { column: string | null; message: string }[] } {
  const specs = FIELDS[kind];
  const known = new Set(specs.map((s) => s.field));
  const headers = header.map((h) => h.trim());
  const norm = headers.map(normaliseHeader);
  const fieldOf: (string | null)[] = headers.map(() => null);
  const fixed = new Set<number>();
  const problems: { column: string | null; message: string }[] = [];
  for (const [column, fieldRaw] of Object.entries(explicit)) {
    const field = normaliseHeader(fieldRaw);
    const key = normaliseHeader(column);
    let idx = headers.indexOf(column.trim());
    if (idx < 0) idx = norm.indexOf(key);
    if (idx < 0) {
      problems.push({
        column,
        message: `--map ${column}=${fieldRaw}: the file has no column '${column}' (its columns: ${headers.join(', ')})`,
      });
      continue;
    }
    if (field !== IGNORE && !known.has(field)) {
      problems.push({
        column,
        message: `--map ${column}=${fieldRaw}: '${fieldRaw}' is not a field of a ${kind} file (fields: ${[...known].join(', ')}, or ${IGNORE})`,
      });
      continue;
    }
    fieldOf[idx] = field === IGNORE ? null : field;
    fixed.add(idx);
  }
  for (let i = 0; i < headers.length; i++) {
    if (fixed.has(i)) continue;
    const spec = specs.find((s) => s.field === norm[i]) ?? specs.find((s) => s.synonyms.includes(norm[i]));
    // A field named explicitly with --map is not also taken by a header's synonym.
    if (spec && ![...fixed].some((j) => fieldOf[j] === spec.field)) fieldOf[i] = spec.field;
  }
  const columnOf = new Map<string, number>();
  for (let i = 0; i < headers.length; i++) {
    const f = fieldOf[i];
    if (f === null) continue;
    const prev = columnOf.get(f);
    if (prev !== undefined) {
      problems.push({
        column: headers[i],
        message: `columns '${headers[prev]}' and '${headers[i]}' both map to ${f}; choose one, e.g. --map "${headers[i]}=${IGNORE}"`,
      });
    } else columnOf.set(f, i);
  }
  for (const spec of specs) {
    if (spec.required && !columnOf.has(spec.field)) {
      problems.push({
        column: null,
        message: `no column for ${spec.field} (looked for: ${spec.synonyms.slice(0, 6).join(', ')}, …); name one with --map COLUMN=${spec.field}`,
      });
    }
  }
  if (kind === 'sales') {
    const week = columnOf.has('week');
    const date = columnOf.has('date');
    if (week && date) {
      problems.push({
        column: headers[columnOf.get('date')!],
        message: `both a week column ('${headers[columnOf.get('week')!]}') and a date column ('${headers[columnOf.get('date')!]}'); keep one, e.g. --map "${headers[columnOf.get('date')!]}=${IGNORE}"`,
      });
    } else if (!week && !date) {
      problems.push({
        column: null,
        message:
          'no week or date column: a sales file has weekly buckets (week,sku,qty) or dated lines (date,sku,qty); name one with --map COLUMN=week or --map COLUMN=date',
      });
    }
  }
  return { mapping: { fieldOf, columnOf, headers }, problems };
}
