// Stored whole-system runs of revisions: computed the first time someone asks for a run of a
// revision (scenario, model, harmonic table, coefficients), then served as stored.
import { DataTypes, type QueryInterface } from 'sequelize';

/** Creates `revision_simulations` with one row per revision and run options. */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.createTable('revision_simulations', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    revision_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'revisions', key: 'id' }, onDelete: 'RESTRICT', onUpdate: 'RESTRICT' },
    scenario: { type: DataTypes.STRING(32), allowNull: false },
    model: { type: DataTypes.STRING(16), allowNull: false },
    harmonic_table: { type: DataTypes.STRING(32), allowNull: false },
    coefficients: { type: DataTypes.STRING(16), allowNull: false },
    tool_version: { type: DataTypes.STRING(32), allowNull: false },
    result: { type: DataTypes.TEXT, allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex('revision_simulations', ['revision_id', 'scenario', 'model', 'harmonic_table', 'coefficients'], { unique: true, name: 'revision_simulations_run' });
}

/** Drops the table. */
export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.dropTable('revision_simulations');
}
