// Stored simulation runs of revisions.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** One stored run of a revision: its options, the tool version that computed it, the result JSON. */
export class RevisionSimulationModel extends Model<InferAttributes<RevisionSimulationModel>, InferCreationAttributes<RevisionSimulationModel>> {
  declare id: CreationOptional<number>;
  declare revisionId: number;
  declare scenario: string;
  declare model: string;
  declare harmonicTable: string;
  declare coefficients: string;
  declare toolVersion: string;
  declare result: string;
  declare createdAt: CreationOptional<Date>;
}

/**
 * Binds the model to a connection.
 * @param sequelize - the connection.
 */
export function initRevisionSimulationModel(sequelize: Sequelize): void {
  RevisionSimulationModel.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      revisionId: { type: DataTypes.INTEGER, allowNull: false, field: 'revision_id' },
      scenario: { type: DataTypes.STRING(32), allowNull: false },
      model: { type: DataTypes.STRING(16), allowNull: false },
      harmonicTable: { type: DataTypes.STRING(32), allowNull: false, field: 'harmonic_table' },
      coefficients: { type: DataTypes.STRING(16), allowNull: false },
      toolVersion: { type: DataTypes.STRING(32), allowNull: false, field: 'tool_version' },
      result: { type: DataTypes.TEXT, allowNull: false },
      createdAt: { type: DataTypes.DATE, field: 'created_at' },
    },
    { sequelize, tableName: 'revision_simulations', modelName: 'RevisionSimulation', updatedAt: false },
  );
}
