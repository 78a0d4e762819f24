// Messages the local SMTP server received.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** One received message; `recipients` is a JSON array text. */
export class MailMessageModel extends Model<InferAttributes<MailMessageModel>, InferCreationAttributes<MailMessageModel>> {
  declare id: CreationOptional<number>;
  declare sender: string;
  declare recipients: string;
  declare subject: string;
  declare text: string;
  declare createdAt: CreationOptional<Date>;
}

/**
 * Binds the model to a connection.
 * @param sequelize - the connection.
 */
export function initMailMessageModel(sequelize: Sequelize): void {
  MailMessageModel.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      sender: { type: DataTypes.STRING(254), allowNull: false },
      recipients: { type: DataTypes.TEXT, allowNull: false },
      subject: { type: DataTypes.STRING(300), allowNull: false },
      text: { type: DataTypes.TEXT, allowNull: false },
      createdAt: { type: DataTypes.DATE, field: 'created_at' },
    },
    { sequelize, tableName: 'mail_messages', modelName: 'MailMessage', updatedAt: false },
  );
}
