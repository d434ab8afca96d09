/**
 * Accounts and editors: a user who must replace their password at the next sign-in (an
 * invitation's password), the password-reset links sent by mail (stored as the SHA-256 of their
 * token, single use, expiring), and who edited a section's current run (they may not review it).
 */
import { DataTypes, type QueryInterface } from 'sequelize';

export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.addColumn('users', 'must_change_password', {
    type: DataTypes.BOOLEAN,
    allowNull: false,
    defaultValue: false,
  });
  await q.addColumn('sections', 'edited_by', {
    type: DataTypes.INTEGER,
    allowNull: true,
    references: { model: 'users', key: 'id' },
  });
  await q.createTable('password_resets', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    user_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'users', key: 'id' },
      onDelete: 'CASCADE',
    },
    token_hash: { type: DataTypes.STRING, allowNull: false, unique: true },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    used_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await q.addIndex('password_resets', ['user_id']);
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.dropTable('password_resets');
  await q.removeColumn('sections', 'edited_by');
  await q.removeColumn('users', 'must_change_password');
}
