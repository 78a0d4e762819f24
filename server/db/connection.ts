// The one database connection: SQLite (WAL journal, foreign keys on, busy timeout) by default,
// PostgreSQL when DATABASE_URL is given. Every write runs in a transaction through `db.write`.
// The guarantees do not rest on this process: services lock the rows they decide on (`lockFor`,
// FOR UPDATE on PostgreSQL; SQLite's BEGIN IMMEDIATE holds the file's one write lock), unique
// indexes back every allocated key, and the migrations' triggers refuse changes to released data.
// So several server processes on one database give the same answers as one.
import { Sequelize, Transaction, UniqueConstraintError } from 'sequelize';
import type { Config } from '../config';

/** Handle on the database. */
export interface Database {
  sequelize: Sequelize;
  /** `postgres` or `sqlite`. */
  dialect: 'postgres' | 'sqlite';
  /**
   * Runs `work` in a transaction and commits it. When the database reports a transient conflict
   * (serialization failure, deadlock, busy file, or a unique key taken by a concurrent commit),
   * the transaction is rolled back and `work` runs again in a new one, at most WRITE_ATTEMPTS times,
   * so `work` must only touch the database.
   */
  write<T>(work: (transaction: Transaction) => Promise<T>): Promise<T>;
  /**
   * Runs `work` while no other process on this database runs its own `exclusively` (PostgreSQL: a
   * transaction-level advisory lock held by one pool connection while `work` uses the others).
   * Start-up uses it, so processes starting together migrate and seed once. On SQLite it just runs.
   */
  exclusively<T>(work: () => Promise<T>): Promise<T>;
  close(): Promise<void>;
}

/** Advisory-lock key of start-up on PostgreSQL (any constant the application owns). */
const STARTUP_LOCK_KEY = 734_151_001;

/** How long a connection waits for another process's write lock (common practice, no source). */
const BUSY_TIMEOUT_MS = 10_000;

/** Cap of the retry loop in `write` (common practice, no source): attempts of one transaction. */
export const WRITE_ATTEMPTS = 5;

/** PostgreSQL SQLSTATE codes worth a retry: serialization_failure, deadlock_detected (PostgreSQL manual, Appendix A). */
const RETRY_SQLSTATES = new Set(['40001', '40P01']);

/** Connections per process on PostgreSQL (Sequelize's pool; common practice, no source). */
const PG_POOL_MAX = 10;

/**
 * Whether a failed transaction may succeed when run again.
 * @param err - what the transaction threw.
 * @returns true for serialization failures, deadlocks, a busy SQLite file and unique violations.
 */
export function isTransientConflict(err: unknown): boolean {
  if (err instanceof UniqueConstraintError) return true;
  const original = (err as { original?: { code?: unknown } } | null)?.original ?? (err as { code?: unknown } | null);
  const code = original?.code;
  return typeof code === 'string' && (RETRY_SQLSTATES.has(code) || code === 'SQLITE_BUSY');
}

/**
 * Options that read rows and lock them until the transaction ends: FOR UPDATE on PostgreSQL; on
 * SQLite the write transaction (BEGIN IMMEDIATE) already excludes every other writer.
 * @param transaction - the write transaction.
 * @returns Sequelize find options.
 */
export function lockFor(transaction: Transaction): { transaction: Transaction; lock: Transaction['LOCK']['UPDATE'] } {
  return { transaction, lock: transaction.LOCK.UPDATE };
}

const pause = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/**
 * Opens the database named by the configuration.
 * @param config - validated configuration.
 * @returns the handle.
 */
export async function openDatabase(config: Pick<Config, 'databasePath' | 'databaseUrl'>): Promise<Database> {
  const sqlite = config.databaseUrl === null;
  const sequelize = sqlite
    ? new Sequelize({ dialect: 'sqlite', storage: config.databasePath, logging: false, transactionType: Transaction.TYPES.IMMEDIATE })
    : new Sequelize(config.databaseUrl as string, { logging: false, pool: { max: PG_POOL_MAX, min: 0, idle: 10_000 } });
  if (sqlite) {
    // Every sqlite3 connection (the default one and one per transaction) waits instead of failing busy.
    const manager = sequelize.connectionManager as unknown as { getConnection: (o: unknown) => Promise<{ configure: (k: string, v: number) => void }> };
    const original = manager.getConnection.bind(manager);
    const configured = new WeakSet<object>();
    manager.getConnection = async (options: unknown) => {
      const connection = await original(options);
      if (!configured.has(connection)) {
        connection.configure('busyTimeout', BUSY_TIMEOUT_MS);
        configured.add(connection);
      }
      return connection;
    };
    await sequelize.query('PRAGMA journal_mode = WAL');
    await sequelize.query('PRAGMA synchronous = FULL');
  }
  await sequelize.authenticate();
  const attempt = async <T>(work: (transaction: Transaction) => Promise<T>): Promise<T> => {
    for (let n = 1; ; n++) {
      try {
        return await sequelize.transaction((t) => work(t));
      } catch (err) {
        if (n >= WRITE_ATTEMPTS || !isTransientConflict(err)) throw err;
        await pause(Math.random() * 10 * n);
      }
    }
  };
  // SQLite takes one writer at a time per file. This process's writers queue here rather than in
  // SQLite's busy handler, which would hold one of libuv's four worker threads per waiting writer and
  // could starve the writer that holds the lock. Other processes on the file wait in the busy handler.
  let queue: Promise<unknown> = Promise.resolve();
  const write = sqlite
    ? <T>(work: (transaction: Transaction) => Promise<T>): Promise<T> => {
      const run = queue.then(() => attempt(work));
      queue = run.catch(() => undefined);
      return run;
    }
    : attempt;
  const exclusively = sqlite
    ? <T>(work: () => Promise<T>): Promise<T> => work()
    : <T>(work: () => Promise<T>): Promise<T> => sequelize.transaction(async (t) => {
      await sequelize.query(`SELECT pg_advisory_xact_lock(${STARTUP_LOCK_KEY})`, { transaction: t });
      return work();
    });
  return { sequelize, dialect: sqlite ? 'sqlite' : 'postgres', write, exclusively, close: () => sequelize.close() };
}
