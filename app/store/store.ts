/**
 * Opening a planning workspace: one SQLite file (better-sqlite3), WAL journal, foreign keys on,
 * schema brought up to date through the numbered migrations of ./migrations. A store written by a
 * newer Provision is refused; an older one is copied beside itself (`FILE.bak-vN`) before it is
 * migrated. A file that is not a SQLite database, or one that was cut short, gets an error naming
 * the file instead of a crash later on.
 */
import { closeSync, existsSync, openSync, readSync, statSync } from 'node:fs';
import { basename } from 'node:path';
import Database from 'better-sqlite3';
import { MIGRATIONS, type Migration } from './migrations';

/** 'PROV' in ASCII: marks a SQLite file as a Provision store (PRAGMA application_id). */
export const APPLICATION_ID = 0x50524f56;

export interface Store {
  readonly path: string;
  /** The connection. Only modules under app/store/ may run SQL on it. */
  readonly db: Database.Database;
  /** Run `fn` in one transaction (nested calls become savepoints); rolled back whole if it throws. */
  transaction<T>(fn: () => T): T;
  close(): void;
}

export interface OpenOptions {
  /** Create the file when it does not exist (default false). */
  create?: boolean;
  readonly?: boolean;
  /** The migration list (default MIGRATIONS); tests pass longer or shorter lists to exercise upgrades. */
  migrations?: readonly Migration[];
}

export class StoreError extends Error {
  constructor(
    message: string,
    readonly path: string,
  ) {
    super(message);
    this.name = 'StoreError';
  }
}

const SQLITE_MAGIC = 'SQLite format 3\u0000';

/** Cheap structural check of the 100-byte SQLite header (https://sqlite.org/fileformat.html §1.3). */
function checkHeader(path: string): void {
  const size = statSync(path).size;
  if (size === 0) return; // an empty file is an empty database to SQLite: it becomes a new store
  const header = Buffer.alloc(100);
  const fd = openSync(path, 'r');
  let got = 0;
  try {
    got = readSync(fd, header, 0, 100, 0);
  } finally {
    closeSync(fd);
  }
  const name = basename(path);
  if (got < 100 || header.toString('latin1', 0, 16) !== SQLITE_MAGIC) {
    throw new StoreError(
      `${path}: not a Provision store (the file is not a SQLite database). Choose a store file, or a new file name to create one.`,
      path,
    );
  }
  const rawPageSize = header.readUInt16BE(16);
  const pageSize = rawPageSize === 1 ? 65536 : rawPageSize;
  const changeCounter = header.readUInt32BE(24);
  const pageCount = header.readUInt32BE(28);
  const validFor = header.readUInt32BE(92);
  const hasWal = existsSync(`${path}-wal`) && statSync(`${path}-wal`).size > 0;
  const truncated =
    size % pageSize !== 0 ||
    (!hasWal && pageCount > 0 && validFor === changeCounter && size < pageCount * pageSize);
  if (truncated) {
    throw new StoreError(
      `${path}: the store file is damaged (it is ${size} bytes, its header promises ${pageCount * pageSize}); it was probably cut short while copying. Restore ${name} from a backup.`,
      path,
    );
  }
}

function describeSqliteError(path: string, err: unknown): StoreError {
  const code = (err as { code?: string }).code ?? '';
  const msg = err instanceof Error ? err.message : String(err);
  if (code === 'SQLITE_NOTADB') {
    return new StoreError(`${path}: not a Provision store (the file is not a SQLite database).`, path);
  }
  if (code === 'SQLITE_CORRUPT' || /malformed/i.test(msg)) {
    return new StoreError(`${path}: the store file is damaged (${msg}). Restore it from a backup.`, path);
  }
  if (code === 'SQLITE_BUSY' || code === 'SQLITE_LOCKED') {
    return new StoreError(
      `${path}: the store is in use by another program (${msg}). Close it and retry.`,
      path,
    );
  }
  return new StoreError(`${path}: cannot open the store: ${msg}`, path);
}

function migrate(db: Database.Database, path: string, migrations: readonly Migration[]): void {
  const SCHEMA_VERSION = migrations.length;
  const version = db.pragma('user_version', { simple: true }) as number;
  const appId = db.pragma('application_id', { simple: true }) as number;
  if (version > SCHEMA_VERSION) {
    throw new StoreError(
      `${path}: this store was written by a newer Provision (schema version ${version}; this version reads up to ${SCHEMA_VERSION}). Update Provision to open it.`,
      path,
    );
  }
  if (version === 0) {
    const tables = db.prepare("SELECT count(*) AS n FROM sqlite_master WHERE type = 'table'").get() as {
      n: number;
    };
    if (tables.n > 0 && appId !== APPLICATION_ID) {
      throw new StoreError(
        `${path}: not a Provision store (a SQLite database of another program). Choose a store file, or a new file name to create one.`,
        path,
      );
    }
  } else if (appId !== APPLICATION_ID) {
    throw new StoreError(`${path}: not a Provision store (a SQLite database of another program).`, path);
  }
  if (version === SCHEMA_VERSION) return;
  if (version > 0) {
    // Back up the older store beside itself before changing it; VACUUM INTO writes a consistent copy.
    let backup = `${path}.bak-v${version}`;
    for (let n = 2; existsSync(backup); n++) backup = `${path}.bak-v${version}-${n}`;
    db.prepare('VACUUM INTO ?').run(backup);
  }
  const run = db.transaction(() => {
    for (let v = version; v < SCHEMA_VERSION; v++) migrations[v].up(db);
    db.pragma(`application_id = ${APPLICATION_ID}`);
    db.pragma(`user_version = ${SCHEMA_VERSION}`);
  });
  run();
}

/** Open (and when asked, create) a store; the schema is migrated to the current version. */
export function openStore(path: string, options: OpenOptions = {}): Store {
  const exists = existsSync(path);
  if (!exists && !options.create) {
    throw new StoreError(`${path}: no such store. Give an existing store file, or create one first.`, path);
  }
  if (exists) {
    if (statSync(path).isDirectory()) throw new StoreError(`${path}: is a folder, not a store file.`, path);
    checkHeader(path);
  }
  let db: Database.Database;
  try {
    db = new Database(path, { readonly: options.readonly === true, fileMustExist: !options.create });
  } catch (err) {
    throw describeSqliteError(path, err);
  }
  try {
    db.pragma('busy_timeout = 5000');
    if (!options.readonly) db.pragma('journal_mode = WAL');
    db.pragma('foreign_keys = ON');
    db.pragma('synchronous = NORMAL');
    // A 64 MB page cache keeps a large import's B-tree pages in memory (default is 2 MB).
    db.pragma('cache_size = -65536');
    const migrations = options.migrations ?? MIGRATIONS;
    if (!options.readonly) migrate(db, path, migrations);
    else if ((db.pragma('user_version', { simple: true }) as number) !== migrations.length) {
      throw new StoreError(`${path}: the store needs an upgrade; open it for writing once.`, path);
    }
    // Touch every table's root page: a damaged file fails here, with its name, not in mid-import.
    db.prepare("SELECT count(*) FROM sqlite_master WHERE type = 'table'").get();
    db.prepare('SELECT 1 FROM items LIMIT 1').get();
  } catch (err) {
    db.close();
    if (err instanceof StoreError) throw err;
    throw describeSqliteError(path, err);
  }
  return {
    path,
    db,
    transaction<T>(fn: () => T): T {
      return db.transaction(fn)();
    },
    close() {
      if (db.open) db.close();
    },
  };
}

/**
 * Run `fn` in one transaction with foreign-key enforcement off, for bulk writes whose keys are
 * correct by construction (the import's). SQLite ignores the pragma inside a transaction, so this
 * must not be nested in one; enforcement is back on afterwards, whatever happens.
 */
export function withoutForeignKeys<T>(store: Store, fn: () => T): T {
  if (store.db.inTransaction) return store.transaction(fn);
  store.db.pragma('foreign_keys = OFF');
  try {
    return store.transaction(fn);
  } finally {
    store.db.pragma('foreign_keys = ON');
  }
}

/** Current time as ISO 8601 UTC text, the store's timestamp format. */
export function nowIso(): string {
  return new Date().toISOString();
}
