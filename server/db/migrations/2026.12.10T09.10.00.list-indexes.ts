// Indexes for the filters and orders of the list routes, and for the foreign keys the pages look up
// (PostgreSQL does not index a referencing column by itself).
import type { QueryInterface } from 'sequelize';

const INDEXES: { table: string; fields: string[]; name: string }[] = [
  { table: 'designs', fields: ['updated_at', 'id'], name: 'designs_updated' },
  { table: 'revisions', fields: ['status'], name: 'revisions_status' },
  { table: 'reviews', fields: ['revision_id'], name: 'reviews_revision' },
  { table: 'releases', fields: ['design_id', 'id'], name: 'releases_design_newest' },
  { table: 'access_tokens', fields: ['owner_id'], name: 'access_tokens_owner' },
  { table: 'audit_events', fields: ['target_type', 'target_id'], name: 'audit_events_target' },
  { table: 'audit_events', fields: ['actor_id'], name: 'audit_events_actor' },
  { table: 'audit_events', fields: ['created_at'], name: 'audit_events_time' },
];

/** Creates the indexes. */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  for (const index of INDEXES) await qi.addIndex(index.table, index.fields, { name: index.name });
}

/** Drops them. */
export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  for (const index of INDEXES) await qi.removeIndex(index.table, index.name);
}
