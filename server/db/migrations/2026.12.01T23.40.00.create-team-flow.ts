// Designs, revisions, reviews, releases, access tokens, audit events, captured mail.
import { DataTypes, type QueryInterface } from 'sequelize';

const ref = (table: string, allowNull = false) => ({ type: DataTypes.INTEGER, allowNull, references: { model: table, key: 'id' }, onDelete: 'RESTRICT', onUpdate: 'RESTRICT' });

/** Creates the team-flow tables, their indexes, and (on SQLite) triggers that keep released data unchanged. */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.createTable('designs', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    name: { type: DataTypes.STRING(200), allowNull: false, unique: true },
    owner_id: ref('users'),
    content: { type: DataTypes.TEXT, allowNull: false },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.createTable('revisions', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    design_id: ref('designs'),
    number: { type: DataTypes.INTEGER, allowNull: false },
    author_id: ref('users'),
    summary: { type: DataTypes.TEXT, allowNull: false },
    status: { type: DataTypes.STRING(24), allowNull: false },
    design: { type: DataTypes.TEXT, allowNull: false },
    analysis: { type: DataTypes.TEXT, allowNull: false },
    error_count: { type: DataTypes.INTEGER, allowNull: false },
    warning_count: { type: DataTypes.INTEGER, allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex('revisions', ['design_id', 'number'], { unique: true, name: 'revisions_design_number' });
  await qi.createTable('reviews', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    revision_id: ref('revisions'),
    reviewer_id: ref('users'),
    decision: { type: DataTypes.STRING(16), allowNull: false },
    comment: { type: DataTypes.TEXT, allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.createTable('releases', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    design_id: ref('designs'),
    revision_id: { ...ref('revisions'), unique: true },
    version: { type: DataTypes.STRING(64), allowNull: false },
    file_name: { type: DataTypes.STRING(255), allowNull: false },
    sha256: { type: DataTypes.STRING(64), allowNull: false },
    size_bytes: { type: DataTypes.INTEGER, allowNull: false },
    bundle: { type: DataTypes.BLOB, allowNull: false },
    released_by_id: ref('users'),
    withdrawn_at: { type: DataTypes.DATE, allowNull: true },
    withdrawn_reason: { type: DataTypes.TEXT, allowNull: true },
    withdrawn_by_id: ref('users', true),
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex('releases', ['design_id', 'version'], { unique: true, name: 'releases_design_version' });
  await qi.createTable('access_tokens', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    name: { type: DataTypes.STRING(120), allowNull: false },
    owner_id: ref('users'),
    prefix: { type: DataTypes.STRING(16), allowNull: false },
    secret_hash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    last_used_at: { type: DataTypes.DATE, allowNull: true },
    revoked_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.createTable('audit_events', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    actor_kind: { type: DataTypes.STRING(8), allowNull: false },
    actor_id: { type: DataTypes.INTEGER, allowNull: true },
    actor_label: { type: DataTypes.STRING(254), allowNull: false },
    action: { type: DataTypes.STRING(40), allowNull: false },
    target_type: { type: DataTypes.STRING(40), allowNull: false },
    target_id: { type: DataTypes.INTEGER, allowNull: true },
    details: { type: DataTypes.TEXT, allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex('audit_events', ['action', 'created_at'], { name: 'audit_events_action_time' });
  await qi.createTable('mail_messages', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    sender: { type: DataTypes.STRING(254), allowNull: false },
    recipients: { type: DataTypes.TEXT, allowNull: false },
    subject: { type: DataTypes.STRING(300), allowNull: false },
    text: { type: DataTypes.TEXT, allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  if (qi.sequelize.getDialect() === 'sqlite') {
    const abort = "SELECT RAISE(ABORT, 'released data never changes');";
    await qi.sequelize.query(`CREATE TRIGGER releases_keep_bytes BEFORE UPDATE OF design_id, revision_id, version, file_name, sha256, size_bytes, bundle, released_by_id, created_at ON releases BEGIN ${abort} END;`);
    await qi.sequelize.query(`CREATE TRIGGER releases_never_deleted BEFORE DELETE ON releases BEGIN ${abort} END;`);
    await qi.sequelize.query(`CREATE TRIGGER revisions_frozen BEFORE UPDATE OF design_id, number, author_id, summary, design, analysis, created_at ON revisions BEGIN ${abort} END;`);
    await qi.sequelize.query(`CREATE TRIGGER revisions_never_deleted BEFORE DELETE ON revisions BEGIN ${abort} END;`);
    await qi.sequelize.query(`CREATE TRIGGER released_revision_final BEFORE UPDATE OF status ON revisions WHEN OLD.status = 'released' BEGIN ${abort} END;`);
  }
}

/** Drops the team-flow tables. */
export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  for (const t of ['mail_messages', 'audit_events', 'access_tokens', 'releases', 'reviews', 'revisions', 'designs']) await qi.dropTable(t);
}
