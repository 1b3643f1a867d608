/**
 * A full dump of a store's content: every table's rows in primary-key order, plus user_version.
 * Used to show that a rejected or skipped import changed nothing (byte-for-byte equal dumps).
 */
import type { Store } from './store';

export function dumpStore(store: Store): string {
  const tables = store.db
    .prepare("SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name")
    .all() as { name: string }[];
  const parts: string[] = [`user_version=${store.db.pragma('user_version', { simple: true })}`];
  for (const { name } of tables) {
    const cols = (store.db.prepare(`PRAGMA table_info("${name}")`).all() as { name: string }[]).map(
      (c) => `"${c.name}"`,
    );
    const rows = store.db
      .prepare(`SELECT * FROM "${name}" ORDER BY ${cols.join(', ')}`)
      .raw()
      .all();
    parts.push(`## ${name} (${rows.length})`);
    for (const r of rows) parts.push(JSON.stringify(r));
  }
  return parts.join('\n');
}
