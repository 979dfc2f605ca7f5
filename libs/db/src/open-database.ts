import { mkdirSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import Database from 'better-sqlite3';
import { drizzle, type BetterSQLite3Database } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import * as schema from './schema';

/** The Drizzle database of Keelson, typed with the whole schema. */
export type KeelsonDatabase = BetterSQLite3Database<typeof schema>;

/** An open database: the Drizzle handle, the raw better-sqlite3 connection and a closer. */
export interface OpenDatabase {
  db: KeelsonDatabase;
  sqlite: Database.Database;
  /** Closes the connection (idempotent). */
  close(): void;
}

/** Options of {@link openDatabase}. */
export interface OpenDatabaseOptions {
  /** Milliseconds a writer waits for a lock before SQLITE_BUSY. */
  busyTimeoutMs?: number;
  /** Folder of the committed migrations; defaults to `libs/db/migrations`. */
  migrationsFolder?: string;
}

/** Defaults of {@link OpenDatabaseOptions}. */
export const OPEN_DATABASE_DEFAULTS = {
  busyTimeoutMs: 5_000,
  migrationsFolder: fileURLToPath(new URL('../migrations', import.meta.url)),
} as const;

/** The path that opens a private in-memory database. */
export const IN_MEMORY = ':memory:';

/**
 * Opens (creating when needed) the SQLite database at `path`, or an in-memory one for
 * `':memory:'`: creates the parent folder, turns on WAL mode, foreign keys and a busy timeout, and
 * applies every pending migration. Throws when the file cannot be opened or a migration fails.
 */
export function openDatabase(path: string, options: OpenDatabaseOptions = {}): OpenDatabase {
  const settings = { ...OPEN_DATABASE_DEFAULTS, ...options };
  if (path !== IN_MEMORY) {
    mkdirSync(dirname(resolve(path)), { recursive: true });
  }
  let sqlite: Database.Database;
  try {
    sqlite = new Database(path);
  } catch (error) {
    throw openFailure(path, error);
  }
  let isOpen = true;
  try {
    // An in-memory database answers 'memory' here; WAL applies to files only.
    sqlite.pragma('journal_mode = WAL');
    sqlite.pragma('foreign_keys = ON');
    sqlite.pragma(`busy_timeout = ${Math.max(0, Math.floor(settings.busyTimeoutMs))}`);
    sqlite.pragma('synchronous = NORMAL');
    const db = drizzle(sqlite, { schema });
    migrate(db, { migrationsFolder: settings.migrationsFolder });
    return {
      db,
      sqlite,
      close() {
        if (isOpen) {
          isOpen = false;
          sqlite.close();
        }
      },
    };
  } catch (error) {
    sqlite.close();
    throw openFailure(path, error);
  }
}

function openFailure(path: string, error: unknown): Error {
  const reason = error instanceof Error ? error.message : String(error);
  return new Error(`Could not open the database at ${path}: ${reason}`, { cause: error });
}

/**
 * The better-sqlite3 connection under a Drizzle database or transaction handle, for bulk writes
 * with prepared statements (inside a transaction: better-sqlite3 is synchronous, so statements
 * on the same connection belong to the open transaction). Throws for any other object.
 */
export function connectionOf(handle: object): Database.Database {
  const direct = (handle as { $client?: unknown }).$client;
  const viaSession = (handle as { session?: { client?: unknown } }).session?.client;
  const connection = direct ?? viaSession;
  if (!(connection instanceof Database)) {
    throw new TypeError('connectionOf: not a Drizzle better-sqlite3 database or transaction');
  }
  return connection;
}

/**
 * Inserts many rows with one prepared statement run per row: on a transaction's connection this
 * is several times faster than multi-row INSERTs built by the query builder. `table` and
 * `columns` are the caller's constants, never user input; `values` gives one row's values in
 * column order (booleans as 0/1, JSON as text).
 */
export function insertRows<T>(
  connection: Database.Database,
  table: string,
  columns: readonly string[],
  records: Iterable<T>,
  values: (record: T) => unknown[],
): void {
  const placeholders = columns.map(() => '?').join(', ');
  const statement = connection.prepare(
    `INSERT INTO ${table} (${columns.join(', ')}) VALUES (${placeholders})`,
  );
  for (const record of records) statement.run(values(record));
}
