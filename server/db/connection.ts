// The one database connection: SQLite (WAL journal, foreign keys on, busy timeout) by default,
// PostgreSQL when DATABASE_URL is given. All writes go through `db.write`, which runs one
// transaction at a time in this process, so counters such as revision numbers never race.
import { Sequelize, Transaction } from 'sequelize';
import type { Config } from '../config';

/** Handle on the database. */
export interface Database {
  sequelize: Sequelize;
  /** Runs `work` in a transaction, serialised with every other write of this process. */
  write<T>(work: (transaction: Transaction) => Promise<T>): Promise<T>;
  close(): Promise<void>;
}

/** How long a connection waits for another process's write lock (common practice, no source). */
const BUSY_TIMEOUT_MS = 10_000;

/**
 * Opens the database named by the configuration.
 * @param config - validated configuration.
 * @returns the handle.
 */
export async function openDatabase(config: Pick<Config, 'databasePath' | 'databaseUrl'>): Promise<Database> {
  const sqlite = config.databaseUrl === null;
  const sequelize = sqlite
    ? new Sequelize({ dialect: 'sqlite', storage: config.databasePath, logging: false, transactionType: Transaction.TYPES.IMMEDIATE })
    : new Sequelize(config.databaseUrl as string, { logging: false });
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
  let queue: Promise<unknown> = Promise.resolve();
  const write = <T>(work: (transaction: Transaction) => Promise<T>): Promise<T> => {
    const run = queue.then(() => sequelize.transaction((t) => work(t)));
    queue = run.catch(() => undefined);
    return run;
  };
  return { sequelize, write, close: () => sequelize.close() };
}
