// Read-only access tokens for benches and CI.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A token: name, owner, SHA-256 of the secret (the secret itself is never stored), last use, revocation. */
export class AccessTokenModel extends Model<InferAttributes<AccessTokenModel>, InferCreationAttributes<AccessTokenModel>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare ownerId: number;
  declare prefix: string;
  declare secretHash: string;
  declare lastUsedAt: CreationOptional<Date | null>;
  declare revokedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
}

/**
 * Binds the model to a connection.
 * @param sequelize - the connection.
 */
export function initAccessTokenModel(sequelize: Sequelize): void {
  AccessTokenModel.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      name: { type: DataTypes.STRING(120), allowNull: false },
      ownerId: { type: DataTypes.INTEGER, allowNull: false, field: 'owner_id' },
      prefix: { type: DataTypes.STRING(16), allowNull: false },
      secretHash: { type: DataTypes.STRING(64), allowNull: false, unique: true, field: 'secret_hash' },
      lastUsedAt: { type: DataTypes.DATE, allowNull: true, field: 'last_used_at' },
      revokedAt: { type: DataTypes.DATE, allowNull: true, field: 'revoked_at' },
      createdAt: { type: DataTypes.DATE, field: 'created_at' },
    },
    { sequelize, tableName: 'access_tokens', modelName: 'AccessToken', updatedAt: false },
  );
}
