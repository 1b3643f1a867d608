/**
 * The store's schema as an ordered list of migrations. Migration i (0-based) takes a store from
 * `PRAGMA user_version` = i to i + 1. To change the schema, APPEND a migration; never edit one that
 * has shipped, since stores in the field already ran it.
 *
 * Conventions: SKUs live in `items`; every other table refers to items by `item_id` (an integer key
 * keeps the large demand and forecast tables small). Dates are ISO 'YYYY-MM-DD' text, timestamps
 * ISO 8601 UTC text. A NULL item setting means "take the workspace default" (resolved on read, so a
 * change of the defaults reaches every item that never set its own value).
 */
import type Database from 'better-sqlite3';

export interface Migration {
  name: string;
  up: (db: Database.Database) => void;
}

const initialSchema = `
CREATE TABLE suppliers (
  id INTEGER PRIMARY KEY,
  name TEXT NOT NULL UNIQUE,
  created_at TEXT NOT NULL
);

CREATE TABLE import_batches (
  id INTEGER PRIMARY KEY,
  kind TEXT NOT NULL CHECK (kind IN ('sales', 'items', 'stock')),
  file_name TEXT NOT NULL,
  sha256 TEXT NOT NULL,
  rows_read INTEGER NOT NULL,
  actor TEXT NOT NULL,
  started_at TEXT NOT NULL,
  finished_at TEXT NOT NULL,
  outcome TEXT NOT NULL,
  summary_json TEXT NOT NULL
);
CREATE INDEX import_batches_sha ON import_batches (sha256);

CREATE TABLE items (
  id INTEGER PRIMARY KEY,
  sku TEXT NOT NULL UNIQUE,
  description TEXT NOT NULL DEFAULT '',
  supplier_id INTEGER REFERENCES suppliers (id),
  unit TEXT,
  case_pack REAL CHECK (case_pack IS NULL OR case_pack > 0),
  moq REAL CHECK (moq IS NULL OR moq >= 0),
  lead_time_weeks REAL CHECK (lead_time_weeks IS NULL OR lead_time_weeks >= 0),
  lead_time_sd_weeks REAL CHECK (lead_time_sd_weeks IS NULL OR lead_time_sd_weeks >= 0),
  review_period_weeks REAL CHECK (review_period_weeks IS NULL OR review_period_weeks >= 0),
  service_level REAL CHECK (service_level IS NULL OR (service_level > 0 AND service_level < 1)),
  service_kind TEXT CHECK (service_kind IS NULL OR service_kind IN ('cycle', 'fill')),
  unit_cost REAL CHECK (unit_cost IS NULL OR unit_cost >= 0),
  holding_rate REAL CHECK (holding_rate IS NULL OR holding_rate >= 0),
  order_cost REAL CHECK (order_cost IS NULL OR order_cost >= 0),
  shelf_life_weeks REAL CHECK (shelf_life_weeks IS NULL OR shelf_life_weeks > 0),
  active INTEGER NOT NULL DEFAULT 1 CHECK (active IN (0, 1)),
  placeholder INTEGER NOT NULL DEFAULT 0 CHECK (placeholder IN (0, 1)),
  created_batch_id INTEGER REFERENCES import_batches (id),
  updated_batch_id INTEGER REFERENCES import_batches (id),
  updated_at TEXT NOT NULL
);
CREATE INDEX items_supplier ON items (supplier_id);

CREATE TABLE weekly_demand (
  item_id INTEGER NOT NULL REFERENCES items (id) ON DELETE CASCADE,
  week_start TEXT NOT NULL,
  qty REAL,
  stockout INTEGER NOT NULL DEFAULT 0 CHECK (stockout IN (0, 1)),
  batch_id INTEGER NOT NULL REFERENCES import_batches (id),
  PRIMARY KEY (item_id, week_start)
) WITHOUT ROWID;

CREATE TABLE inventory_positions (
  item_id INTEGER PRIMARY KEY REFERENCES items (id) ON DELETE CASCADE,
  on_hand REAL NOT NULL DEFAULT 0,
  on_order REAL NOT NULL DEFAULT 0,
  backorders REAL NOT NULL DEFAULT 0,
  as_of TEXT,
  batch_id INTEGER REFERENCES import_batches (id)
);

CREATE TABLE workspace_settings (
  key TEXT PRIMARY KEY,
  value_json TEXT NOT NULL
);

CREATE TABLE planning_runs (
  id INTEGER PRIMARY KEY,
  started_at TEXT NOT NULL,
  finished_at TEXT,
  status TEXT NOT NULL CHECK (status IN ('running', 'complete', 'failed', 'cancelled')),
  items_total INTEGER NOT NULL DEFAULT 0,
  items_planned INTEGER NOT NULL DEFAULT 0,
  items_reused INTEGER NOT NULL DEFAULT 0,
  items_failed INTEGER NOT NULL DEFAULT 0,
  actor TEXT,
  settings_json TEXT NOT NULL,
  note TEXT
);

CREATE TABLE run_items (
  run_id INTEGER NOT NULL REFERENCES planning_runs (id) ON DELETE CASCADE,
  item_id INTEGER NOT NULL REFERENCES items (id) ON DELETE CASCADE,
  fingerprint TEXT NOT NULL,
  status TEXT NOT NULL CHECK (status IN ('planned', 'reused', 'fallback', 'failed')),
  reused_from_run_id INTEGER REFERENCES planning_runs (id),
  diagnostics_json TEXT,
  error TEXT,
  PRIMARY KEY (run_id, item_id)
) WITHOUT ROWID;
CREATE INDEX run_items_item ON run_items (item_id, run_id);

CREATE TABLE run_models (
  run_id INTEGER NOT NULL REFERENCES planning_runs (id) ON DELETE CASCADE,
  item_id INTEGER NOT NULL REFERENCES items (id) ON DELETE CASCADE,
  p INTEGER NOT NULL,
  d INTEGER NOT NULL,
  q INTEGER NOT NULL,
  seasonal_harmonics INTEGER NOT NULL DEFAULT 0,
  include_mean INTEGER NOT NULL DEFAULT 1,
  aicc REAL,
  chosen INTEGER NOT NULL DEFAULT 1 CHECK (chosen IN (0, 1)),
  detail_json TEXT NOT NULL,
  PRIMARY KEY (run_id, item_id, p, d, q, seasonal_harmonics, include_mean)
) WITHOUT ROWID;

CREATE TABLE run_forecasts (
  run_id INTEGER NOT NULL REFERENCES planning_runs (id) ON DELETE CASCADE,
  item_id INTEGER NOT NULL REFERENCES items (id) ON DELETE CASCADE,
  step INTEGER NOT NULL,
  week_start TEXT NOT NULL,
  mean REAL NOT NULL,
  se REAL NOT NULL,
  lower80 REAL NOT NULL,
  upper80 REAL NOT NULL,
  lower95 REAL NOT NULL,
  upper95 REAL NOT NULL,
  PRIMARY KEY (run_id, item_id, step)
) WITHOUT ROWID;

CREATE TABLE run_flags (
  run_id INTEGER NOT NULL REFERENCES planning_runs (id) ON DELETE CASCADE,
  item_id INTEGER NOT NULL REFERENCES items (id) ON DELETE CASCADE,
  seq INTEGER NOT NULL,
  code TEXT NOT NULL,
  severity TEXT NOT NULL CHECK (severity IN ('info', 'warning', 'critical')),
  reason TEXT NOT NULL,
  action TEXT NOT NULL,
  PRIMARY KEY (run_id, item_id, seq)
) WITHOUT ROWID;

CREATE TABLE order_lines (
  run_id INTEGER NOT NULL REFERENCES planning_runs (id) ON DELETE CASCADE,
  item_id INTEGER NOT NULL REFERENCES items (id) ON DELETE CASCADE,
  order_qty REAL NOT NULL,
  case_packs REAL NOT NULL,
  reorder_point REAL NOT NULL,
  order_up_to REAL NOT NULL,
  safety_stock REAL NOT NULL,
  interval_forecast REAL NOT NULL,
  interval_sd REAL NOT NULL,
  service_level REAL NOT NULL,
  service_kind TEXT NOT NULL CHECK (service_kind IN ('cycle', 'fill')),
  explanation TEXT NOT NULL,
  detail_json TEXT,
  PRIMARY KEY (run_id, item_id)
) WITHOUT ROWID;

CREATE TABLE overrides (
  item_id INTEGER PRIMARY KEY REFERENCES items (id) ON DELETE CASCADE,
  forced_model_json TEXT,
  adjustments_json TEXT NOT NULL DEFAULT '[]',
  safety_stock REAL CHECK (safety_stock IS NULL OR safety_stock >= 0),
  reviewed_at TEXT,
  reviewed_by TEXT,
  reviewed_run_id INTEGER REFERENCES planning_runs (id) ON DELETE SET NULL,
  updated_at TEXT NOT NULL
);

CREATE TABLE order_edits (
  run_id INTEGER NOT NULL REFERENCES planning_runs (id) ON DELETE CASCADE,
  item_id INTEGER NOT NULL REFERENCES items (id) ON DELETE CASCADE,
  order_qty REAL NOT NULL CHECK (order_qty >= 0),
  reason TEXT NOT NULL,
  actor TEXT NOT NULL,
  at TEXT NOT NULL,
  PRIMARY KEY (run_id, item_id)
) WITHOUT ROWID;

CREATE TABLE audit_log (
  id INTEGER PRIMARY KEY,
  at TEXT NOT NULL,
  actor TEXT NOT NULL,
  sku TEXT,
  action TEXT NOT NULL,
  before_json TEXT,
  after_json TEXT,
  reason TEXT
);
CREATE INDEX audit_log_sku ON audit_log (sku, id);
`;

/** Ordered: index i migrates user_version i → i + 1. Append only. */
export const MIGRATIONS: readonly Migration[] = [
  {
    name: 'initial schema',
    up: (db) => db.exec(initialSchema),
  },
];

export const SCHEMA_VERSION = MIGRATIONS.length;
