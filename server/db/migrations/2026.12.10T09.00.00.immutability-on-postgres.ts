// Released data never changes, on PostgreSQL too: the triggers SQLite got with the team-flow tables
// (same names, same columns), plus refusing TRUNCATE, which skips row triggers on PostgreSQL.
import type { QueryInterface } from 'sequelize';

/** The message every refusal carries (the same as SQLite's RAISE(ABORT, ...)). */
const REFUSAL = 'released data never changes';

const TRIGGERS = [
  'releases_keep_bytes BEFORE UPDATE OF design_id, revision_id, version, file_name, sha256, size_bytes, bundle, released_by_id, created_at ON releases FOR EACH ROW',
  'releases_never_deleted BEFORE DELETE ON releases FOR EACH ROW',
  'releases_never_truncated BEFORE TRUNCATE ON releases FOR EACH STATEMENT',
  'revisions_frozen BEFORE UPDATE OF design_id, number, author_id, summary, design, analysis, created_at ON revisions FOR EACH ROW',
  'revisions_never_deleted BEFORE DELETE ON revisions FOR EACH ROW',
  'revisions_never_truncated BEFORE TRUNCATE ON revisions FOR EACH STATEMENT',
  "released_revision_final BEFORE UPDATE OF status ON revisions FOR EACH ROW WHEN (OLD.status = 'released')",
];

/** Creates the refusing function and its triggers (PostgreSQL only; SQLite has them since the team-flow migration). */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  if (qi.sequelize.getDialect() !== 'postgres') return;
  await qi.sequelize.query(
    `CREATE FUNCTION varsmith_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN RAISE EXCEPTION '${REFUSAL}' USING ERRCODE = 'P0001'; END $$;`,
  );
  for (const trigger of TRIGGERS) await qi.sequelize.query(`CREATE TRIGGER ${trigger} EXECUTE FUNCTION varsmith_refuse_change();`);
}

/** Drops them. */
export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  if (qi.sequelize.getDialect() !== 'postgres') return;
  for (const trigger of TRIGGERS) {
    const [name, table] = [trigger.split(' ')[0], / ON (\w+) /.exec(trigger)![1]];
    await qi.sequelize.query(`DROP TRIGGER ${name} ON ${table};`);
  }
  await qi.sequelize.query('DROP FUNCTION varsmith_refuse_change();');
}
