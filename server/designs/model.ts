// Design working copies.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A design: its working copy (a `varsmith-design/1` JSON text), owner and optimistic-lock version. */
export class DesignModel extends Model<InferAttributes<DesignModel>, InferCreationAttributes<DesignModel>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare ownerId: number;
  declare content: string;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/**
 * Binds the model to a connection.
 * @param sequelize - the connection.
 */
export function initDesignModel(sequelize: Sequelize): void {
  DesignModel.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      name: { type: DataTypes.STRING(200), allowNull: false, unique: true },
      ownerId: { type: DataTypes.INTEGER, allowNull: false, field: 'owner_id' },
      content: { type: DataTypes.TEXT, allowNull: false },
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      createdAt: { type: DataTypes.DATE, field: 'created_at' },
      updatedAt: { type: DataTypes.DATE, field: 'updated_at' },
    },
    { sequelize, tableName: 'designs', modelName: 'Design' },
  );
}
