/**
 * Stored files: what lies in object storage (uploaded inputs, generated reports, later terrain)
 * and what it belongs to. The bytes are in storage under object_key; this row says what they
 * are, how large, their SHA-256, who stored them and when.
 */
import { DataTypes, type QueryInterface } from 'sequelize';

export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.createTable('stored_files', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    object_key: { type: DataTypes.STRING(1024), allowNull: false, unique: true },
    kind: { type: DataTypes.STRING, allowNull: false },
    name: { type: DataTypes.STRING(255), allowNull: false },
    content_type: { type: DataTypes.STRING, allowNull: false },
    size: { type: DataTypes.BIGINT, allowNull: false },
    sha256: { type: DataTypes.STRING(64), allowNull: false },
    batch_id: {
      type: DataTypes.INTEGER,
      allowNull: true,
      references: { model: 'batches', key: 'id' },
      onDelete: 'CASCADE',
    },
    section_id: {
      type: DataTypes.INTEGER,
      allowNull: true,
      references: { model: 'sections', key: 'id' },
      onDelete: 'CASCADE',
    },
    created_by: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'users', key: 'id' },
    },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await q.addIndex('stored_files', ['batch_id', 'kind']);
  await q.addIndex('stored_files', ['section_id', 'kind']);
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.dropTable('stored_files');
}
