// Frozen revisions of a design.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { RevisionStatus } from '../../shared/api/designs';

/** Revision N of a design: the frozen design and analysis texts, author, summary, status. */
export class RevisionModel extends Model<InferAttributes<RevisionModel>, InferCreationAttributes<RevisionModel>> {
  declare id: CreationOptional<number>;
  declare designId: number;
  declare number: number;
  declare authorId: number;
  declare summary: string;
  declare status: RevisionStatus;
  declare design: string;
  declare analysis: string;
  declare errorCount: number;
  declare warningCount: number;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/**
 * Binds the model to a connection.
 * @param sequelize - the connection.
 */
export function initRevisionModel(sequelize: Sequelize): void {
  RevisionModel.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      designId: { type: DataTypes.INTEGER, allowNull: false, field: 'design_id' },
      number: { type: DataTypes.INTEGER, allowNull: false },
      authorId: { type: DataTypes.INTEGER, allowNull: false, field: 'author_id' },
      summary: { type: DataTypes.TEXT, allowNull: false },
      status: { type: DataTypes.STRING(24), allowNull: false },
      design: { type: DataTypes.TEXT, allowNull: false },
      analysis: { type: DataTypes.TEXT, allowNull: false },
      errorCount: { type: DataTypes.INTEGER, allowNull: false, field: 'error_count' },
      warningCount: { type: DataTypes.INTEGER, allowNull: false, field: 'warning_count' },
      createdAt: { type: DataTypes.DATE, field: 'created_at' },
      updatedAt: { type: DataTypes.DATE, field: 'updated_at' },
    },
    { sequelize, tableName: 'revisions', modelName: 'Revision' },
  );
}
