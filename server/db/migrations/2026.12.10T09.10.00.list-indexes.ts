// Indexes for the filters and orders of the list routes, and for the foreign keys the pages look up
// (PostgreSQL does not index a referencing column by itself). On SQLite the list indexes also carry
// every column the list shows: SQLite stores a row's columns in one record, and reading a column
// that follows a large value (a bundle, a frozen analysis, a working copy) walks that value's
// overflow pages, about 0.1 ms a row here; a covering index answers the list without the table.
// PostgreSQL keeps large values out of line (TOAST) and reads only the columns asked for.
import type { QueryInterface } from 'sequelize';

interface IndexDef {
  table: string;
  fields: string[];
  name: string;
}

const INDEXES: IndexDef[] = [
  { table: 'revisions', fields: ['status'], name: 'revisions_status' },
  { table: 'reviews', fields: ['revision_id'], name: 'reviews_revision' },
  { table: 'releases', fields: ['design_id', 'id'], name: 'releases_design_newest' },
  { table: 'access_tokens', fields: ['owner_id'], name: 'access_tokens_owner' },
  { table: 'audit_events', fields: ['target_type', 'target_id'], name: 'audit_events_target' },
  { table: 'audit_events', fields: ['actor_id'], name: 'audit_events_actor' },
  { table: 'audit_events', fields: ['created_at'], name: 'audit_events_time' },
];

/** The list orders, with (SQLite) the listed columns after the sort key. */
const listing = (sqlite: boolean): IndexDef[] => {
  const designColumns = ['owner_id', 'version', 'created_at'];
  return [
    { table: 'designs', fields: ['updated_at', 'id', ...(sqlite ? ['name', ...designColumns] : [])], name: 'designs_updated' },
    ...(sqlite ? [
      { table: 'designs', fields: ['name', 'id', ...designColumns, 'updated_at'], name: 'designs_listing' },
      { table: 'revisions', fields: ['design_id', 'number', 'id', 'author_id', 'status', 'error_count', 'warning_count', 'created_at', 'summary'], name: 'revisions_listing' },
      {
        table: 'releases',
        fields: ['id', 'design_id', 'revision_id', 'version', 'file_name', 'sha256', 'size_bytes', 'released_by_id', 'created_at', 'withdrawn_at', 'withdrawn_by_id', 'withdrawn_reason'],
        name: 'releases_listing',
      },
    ] : []),
  ];
};

/** Creates the indexes. */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  for (const index of [...INDEXES, ...listing(qi.sequelize.getDialect() === 'sqlite')]) await qi.addIndex(index.table, index.fields, { name: index.name });
}

/** Drops them. */
export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  for (const index of [...INDEXES, ...listing(qi.sequelize.getDialect() === 'sqlite')]) await qi.removeIndex(index.table, index.name);
}
