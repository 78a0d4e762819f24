// Schema only through these timestamped migrations (umzug), applied in order and recorded in `SequelizeMeta`.
import { SequelizeStorage, Umzug } from 'umzug';
import type { Sequelize } from 'sequelize';
import * as createUsers from './migrations/2026.12.01T23.30.00.create-users';
import * as createTeamFlow from './migrations/2026.12.01T23.40.00.create-team-flow';
import * as immutabilityOnPostgres from './migrations/2026.12.10T09.00.00.immutability-on-postgres';
import * as listIndexes from './migrations/2026.12.10T09.10.00.list-indexes';
import * as createRevisionSimulations from './migrations/2026.12.10T09.20.00.create-revision-simulations';

const migrations = [
  { name: '2026.12.01T23.30.00.create-users', module: createUsers },
  { name: '2026.12.01T23.40.00.create-team-flow', module: createTeamFlow },
  { name: '2026.12.10T09.00.00.immutability-on-postgres', module: immutabilityOnPostgres },
  { name: '2026.12.10T09.10.00.list-indexes', module: listIndexes },
  { name: '2026.12.10T09.20.00.create-revision-simulations', module: createRevisionSimulations },
];

/**
 * Builds the migrator for a connection.
 * @param sequelize - the connection.
 * @returns the umzug instance.
 */
export function migrator(sequelize: Sequelize): Umzug<ReturnType<Sequelize['getQueryInterface']>> {
  return new Umzug({
    migrations: migrations.map((m) => ({ name: m.name, up: m.module.up, down: m.module.down })),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize }),
    logger: undefined,
  });
}

/**
 * Applies every pending migration.
 * @param sequelize - the connection.
 * @returns the names applied.
 */
export async function migrate(sequelize: Sequelize): Promise<string[]> {
  const done = await migrator(sequelize).up();
  return done.map((m) => m.name);
}
