import {
  copyFileSync,
  existsSync,
  mkdtempSync,
  readFileSync,
  rmSync,
  statSync,
  truncateSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, describe, expect, it } from 'vitest';
import { listAudit } from '../../../app/store/audit';
import { demandWriter, getAllWeeklyHistories, getWeeklyHistory } from '../../../app/store/demand';
import { dumpStore } from '../../../app/store/dump';
import {
  createPlaceholderItems,
  getItemSettings,
  listActiveItems,
  upsertItems,
} from '../../../app/store/items';
import { MIGRATIONS } from '../../../app/store/migrations';
import {
  addAdjustment,
  editOrderQty,
  getOverrides,
  markReviewed,
  setForcedModel,
  setSafetyStock,
} from '../../../app/store/overrides';
import { getWorkspaceSettings, putWorkspaceSettings } from '../../../app/store/settings';
import { getPosition } from '../../../app/store/stock';
import { openStore, StoreError } from '../../../app/store/store';
import { DEFAULT_WORKSPACE } from '../../../core/plan/types';

const dir = mkdtempSync(join(tmpdir(), 'provision-store-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
let n = 0;
const fresh = () => join(dir, `s${++n}.sqlite`);

describe('openStore', () => {
  it('creates a store with WAL, foreign keys and the current schema version', () => {
    const path = fresh();
    const s = openStore(path, { create: true });
    expect(s.db.pragma('journal_mode', { simple: true })).toBe('wal');
    expect(s.db.pragma('foreign_keys', { simple: true })).toBe(1);
    expect(s.db.pragma('user_version', { simple: true })).toBe(MIGRATIONS.length);
    s.close();
    openStore(path).close(); // reopens
  });

  it('refuses a missing file unless asked to create it', () => {
    expect(() => openStore(join(dir, 'nope.sqlite'))).toThrow(/nope\.sqlite: no such store/);
  });

  it('names the file when it is not a SQLite database', () => {
    const path = join(dir, 'notes.sqlite');
    writeFileSync(path, 'week,sku,qty\n2026-01-05,A,1\n'.repeat(20));
    expect(() => openStore(path, { create: true })).toThrow(StoreError);
    expect(() => openStore(path, { create: true })).toThrow(
      `${path}: not a Provision store (the file is not a SQLite database)`,
    );
  });

  it('names the file when it was cut short', () => {
    const path = fresh();
    const s = openStore(path, { create: true });
    s.db.exec("INSERT INTO suppliers (name, created_at) VALUES ('x', 'now')");
    s.close();
    const size = statSync(path).size;
    truncateSync(path, Math.floor(size / 2) + 100); // not a whole number of pages, and shorter than the header says
    expect(() => openStore(path)).toThrow(
      new RegExp(`^${path.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&')}: the store file is damaged`),
    );
    truncateSync(path, 50);
    expect(() => openStore(path)).toThrow(/not a Provision store/);
  });

  it("refuses another program's SQLite database", () => {
    const path = fresh();
    const db = new Database(path);
    db.exec('CREATE TABLE contacts (name TEXT)');
    db.close();
    expect(() => openStore(path)).toThrow(/a SQLite database of another program/);
  });

  it('refuses a store written by a newer version, and backs up an older one before migrating', () => {
    const path = fresh();
    const extra = {
      name: 'test: add a column',
      up: (db: Database.Database) => db.exec('ALTER TABLE suppliers ADD COLUMN phone TEXT'),
    };
    const s1 = openStore(path, { create: true });
    s1.db.exec("INSERT INTO suppliers (name, created_at) VALUES ('Hollowbrook Mill', 'now')");
    s1.close();
    const before = readFileSync(path);
    const s2 = openStore(path, { migrations: [...MIGRATIONS, extra] });
    expect(s2.db.pragma('user_version', { simple: true })).toBe(MIGRATIONS.length + 1);
    s2.close();
    const backup = `${path}.bak-v${MIGRATIONS.length}`;
    expect(existsSync(backup)).toBe(true);
    const b = new Database(backup, { readonly: true });
    expect(b.pragma('user_version', { simple: true })).toBe(MIGRATIONS.length);
    expect(b.prepare('SELECT name FROM suppliers').all()).toEqual([{ name: 'Hollowbrook Mill' }]);
    b.close();
    expect(before.length).toBeGreaterThan(0);
    expect(() => openStore(path)).toThrow(
      `${path}: this store was written by a newer Provision (schema version ${MIGRATIONS.length + 1}; this version reads up to ${MIGRATIONS.length}). Update Provision to open it.`,
    );
    copyFileSync(backup, path); // the backup is a working store
    rmSync(`${path}-wal`, { force: true });
    rmSync(`${path}-shm`, { force: true });
    openStore(path).close();
  });
});

describe('store modules', () => {
  it('resolves item settings against the workspace defaults', () => {
    const s = openStore(fresh(), { create: true });
    s.transaction(() =>
      upsertItems(
        s,
        [
          {
            sku: 'FLR-101',
            description: 'Strong White Bread Flour 25 kg',
            supplier: 'Hollowbrook Mill',
            casePack: 4,
            serviceLevel: 0.97,
          },
        ],
        null,
      ),
    );
    s.transaction(() => createPlaceholderItems(s, ['NEW-1'], null));
    const flour = getItemSettings(s, 'FLR-101')!;
    expect(flour).toMatchObject({
      supplier: 'Hollowbrook Mill',
      casePack: 4,
      serviceLevel: 0.97,
      leadTimeWeeks: DEFAULT_WORKSPACE.leadTimeWeeks,
    });
    const placeholder = getItemSettings(s, 'NEW-1')!;
    expect(placeholder).toMatchObject({
      casePack: 1,
      moq: 0,
      serviceLevel: null,
      serviceKind: 'cycle',
      active: true,
    });
    expect(getPosition(s, 'NEW-1')).toEqual({ onHand: 0, onOrder: 0, backorders: 0, asOf: null });
    putWorkspaceSettings(s, { leadTimeWeeks: 5, serviceKind: 'fill' });
    expect(getWorkspaceSettings(s)).toEqual({ ...DEFAULT_WORKSPACE, leadTimeWeeks: 5, serviceKind: 'fill' });
    expect(getItemSettings(s, 'NEW-1')!.leadTimeWeeks).toBe(5); // follows the defaults
    expect(listActiveItems(s).map((i) => [i.sku, i.placeholder])).toEqual([
      ['FLR-101', false],
      ['NEW-1', true],
    ]);
    s.close();
  });

  it("reads weekly history with gaps and stockouts as null, to the store's latest week", () => {
    const s = openStore(fresh(), { create: true });
    s.transaction(() => {
      const ids = createPlaceholderItems(s, ['A', 'B'], null);
      const batch = Number(
        s.db
          .prepare(
            "INSERT INTO import_batches (kind, file_name, sha256, rows_read, actor, started_at, finished_at, outcome, summary_json) VALUES ('sales', 'f', 'x', 0, 't', 'a', 'b', 'imported', '{}')",
          )
          .run().lastInsertRowid,
      );
      const w = demandWriter(s);
      w.upsert(ids.get('A')!, '2026-11-02', 5, false, batch);
      w.upsert(ids.get('A')!, '2026-11-16', 1, true, batch);
      w.upsert(ids.get('B')!, '2026-11-30', null, false, batch);
      w.flush();
    });
    const a = getWeeklyHistory(s, 'A')!;
    expect(a.weekStart).toEqual(['2026-11-02', '2026-11-09', '2026-11-16', '2026-11-23', '2026-11-30']);
    expect(a.qty).toEqual([5, null, null, null, null]);
    expect(a.stockoutWeeks).toEqual(['2026-11-16']);
    const all = getAllWeeklyHistories(s);
    expect(all.get('A')).toEqual(a);
    expect(all.get('B')!.qty).toEqual([null]);
    expect(getWeeklyHistory(s, 'nope')).toBeNull();
    // After a change of week start day, rows on two calendars are merged onto the latest one.
    s.transaction(() => {
      const id = (s.db.prepare("SELECT id FROM items WHERE sku = 'A'").get() as { id: number }).id;
      const w = demandWriter(s);
      w.upsert(id, '2026-11-29', 2, false, 1); // Sunday-start weeks after Monday-start ones
      w.upsert(id, '2026-12-06', 3, false, 1);
      w.flush();
    });
    const mixed = getWeeklyHistory(s, 'A')!;
    expect(mixed.weekStart[0]).toBe('2026-11-01'); // Monday 2026-11-02 lies in the Sunday-week of 11-01
    expect(mixed.weekStart.slice(-2)).toEqual(['2026-11-29', '2026-12-06']);
    expect(mixed.qty.slice(-2)).toEqual([2, 3]);
    s.close();
  });

  it('records each decision with its audit entry, or neither', () => {
    const s = openStore(fresh(), { create: true });
    s.transaction(() => createPlaceholderItems(s, ['A'], null));
    setForcedModel(
      s,
      'A',
      { order: { p: 1, d: 0, q: 0 }, seasonalHarmonics: 0, includeMean: true },
      { actor: 'ann', reason: 'AR(1) fits the bakery cycle' },
    );
    addAdjustment(
      s,
      'A',
      { from: '2026-12-07', to: '2026-12-21', kind: 'percent', value: 20, reason: 'holiday promotion' },
      { actor: 'ann' },
    );
    setSafetyStock(s, 'A', 12, { actor: 'ann', reason: 'customer contract' });
    markReviewed(s, 'A', { actor: 'ann' });
    const o = getOverrides(s, 'A');
    expect(o.forcedModel?.order).toEqual({ p: 1, d: 0, q: 0 });
    expect(o.adjustments).toHaveLength(1);
    expect(o.safetyStock).toBe(12);
    expect(o.reviewedBy).toBe('ann');
    const audit = listAudit(s, { sku: 'A' });
    expect(audit.map((e) => e.action)).toEqual([
      'mark-reviewed',
      'fix-safety-stock',
      'add-adjustment',
      'force-model',
    ]);
    expect(audit[1]).toMatchObject({ before: null, after: 12, reason: 'customer contract', actor: 'ann' });
    const dump = dumpStore(s);
    expect(() => setSafetyStock(s, 'missing', 1, { actor: 'ann' })).toThrow(/unknown SKU/);
    expect(() =>
      addAdjustment(
        s,
        'A',
        { from: '2026-12-21', to: '2026-12-07', kind: 'percent', value: 1, reason: 'x' },
        { actor: 'ann' },
      ),
    ).toThrow(/range/);
    expect(() => editOrderQty(s, 'A', 999, 5, { actor: 'ann' })).toThrow(); // no such run: foreign key
    expect(dumpStore(s)).toBe(dump);
    s.close();
  });
});
