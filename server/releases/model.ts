// Released coefficient sets: bundle bytes stored once, never changed, never deleted.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A release of one approved revision under a semantic version. */
export class ReleaseModel extends Model<InferAttributes<ReleaseModel>, InferCreationAttributes<ReleaseModel>> {
  declare id: CreationOptional<number>;
  declare designId: number;
  declare revisionId: number;
  declare version: string;
  declare fileName: string;
  declare sha256: string;
  declare sizeBytes: number;
  declare bundle: Buffer;
  declare releasedById: number;
  declare withdrawnAt: CreationOptional<Date | null>;
  declare withdrawnReason: CreationOptional<string | null>;
  declare withdrawnById: CreationOptional<number | null>;
  declare createdAt: CreationOptional<Date>;
}

/**
 * Binds the model to a connection.
 * @param sequelize - the connection.
 */
export function initReleaseModel(sequelize: Sequelize): void {
  ReleaseModel.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      designId: { type: DataTypes.INTEGER, allowNull: false, field: 'design_id' },
      revisionId: { type: DataTypes.INTEGER, allowNull: false, field: 'revision_id' },
      version: { type: DataTypes.STRING(64), allowNull: false },
      fileName: { type: DataTypes.STRING(255), allowNull: false, field: 'file_name' },
      sha256: { type: DataTypes.STRING(64), allowNull: false },
      sizeBytes: { type: DataTypes.INTEGER, allowNull: false, field: 'size_bytes' },
      bundle: { type: DataTypes.BLOB, allowNull: false },
      releasedById: { type: DataTypes.INTEGER, allowNull: false, field: 'released_by_id' },
      withdrawnAt: { type: DataTypes.DATE, allowNull: true, field: 'withdrawn_at' },
      withdrawnReason: { type: DataTypes.TEXT, allowNull: true, field: 'withdrawn_reason' },
      withdrawnById: { type: DataTypes.INTEGER, allowNull: true, field: 'withdrawn_by_id' },
      createdAt: { type: DataTypes.DATE, field: 'created_at' },
    },
    { sequelize, tableName: 'releases', modelName: 'Release', updatedAt: false },
  );
}
