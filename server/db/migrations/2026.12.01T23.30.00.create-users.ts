// Accounts.
import { DataTypes, type QueryInterface } from 'sequelize';

/** Creates `users`. */
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.createTable('users', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
    name: { type: DataTypes.STRING(120), allowNull: false },
    role: { type: DataTypes.STRING(16), allowNull: false },
    password_hash: { type: DataTypes.STRING(100), allowNull: false },
    disabled: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
}

/** Drops `users`. */
export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.dropTable('users');
}
