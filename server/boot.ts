// Start-up sequence shared by `npm start`, `npm run dev` and the tests: open the database,
// apply migrations, seed an empty database, start the mailer, build the app.
import type { Express } from 'express';
import { createApp } from './app';
import type { Config } from './config';
import { openDatabase } from './db/connection';
import { migrate } from './db/migrate';
import { initModels } from './db/models';
import { seedIfEmpty } from './db/seed';
import { createMailer } from './mail/service';
import { createSimulationPool, SIMULATION_BUDGET_MS } from './simulation/pool';
import type { AppContext } from './middleware/context';

/** A ready app and what it holds. */
export interface Booted {
  app: Express;
  ctx: AppContext;
  seeded: boolean;
  close(): Promise<void>;
}

/**
 * Boots the server parts.
 * @param config - validated configuration.
 * @param options - seeding and the client folder.
 * @param options.seed - seed demo data into an empty database (default true).
 * @param options.clientDir - built client to serve.
 * @returns the booted app.
 */
export async function boot(config: Config, options: { seed?: boolean; clientDir?: string } = {}): Promise<Booted> {
  const db = await openDatabase(config);
  initModels(db.sequelize);
  const log = (m: string) => { if (config.logLevel !== 'silent') process.stderr.write(`${m}\n`); };
  const mailer = await createMailer(config, db, log);
  // One simulation thread: a run keeps a core busy for up to seconds; the other core serves requests.
  const simulation = createSimulationPool({ threads: 1, budgetMs: SIMULATION_BUDGET_MS });
  const ctx: AppContext = { config, db, mailer, simulation };
  // Processes starting together on one PostgreSQL database migrate and seed one after the other.
  const seeded = await db.exclusively(async () => {
    await migrate(db.sequelize);
    return options.seed === false ? false : seedIfEmpty(ctx);
  });
  const app = createApp(ctx, { clientDir: options.clientDir });
  return { app, ctx, seeded, close: async () => { await simulation.close(); await mailer.close(); await db.close(); } };
}
