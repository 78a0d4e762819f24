// The audit log.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** Who did what to which target, when, with details (JSON text). */
export class AuditEventModel extends Model<InferAttributes<AuditEventModel>, InferCreationAttributes<AuditEventModel>> {
  declare id: CreationOptional<number>;
  declare actorKind: 'user' | 'token' | 'system';
  declare actorId: number | null;
  declare actorLabel: string;
  declare action: string;
  declare targetType: string;
  declare targetId: number | null;
  declare details: string;
  declare createdAt: CreationOptional<Date>;
}

/**
 * Binds the model to a connection.
 * @param sequelize - the connection.
 */
export function initAuditEventModel(sequelize: Sequelize): void {
  AuditEventModel.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      actorKind: { type: DataTypes.STRING(8), allowNull: false, field: 'actor_kind' },
      actorId: { type: DataTypes.INTEGER, allowNull: true, field: 'actor_id' },
      actorLabel: { type: DataTypes.STRING(254), allowNull: false, field: 'actor_label' },
      action: { type: DataTypes.STRING(40), allowNull: false },
      targetType: { type: DataTypes.STRING(40), allowNull: false, field: 'target_type' },
      targetId: { type: DataTypes.INTEGER, allowNull: true, field: 'target_id' },
      details: { type: DataTypes.TEXT, allowNull: false },
      createdAt: { type: DataTypes.DATE, field: 'created_at' },
    },
    { sequelize, tableName: 'audit_events', modelName: 'AuditEvent', updatedAt: false },
  );
}
