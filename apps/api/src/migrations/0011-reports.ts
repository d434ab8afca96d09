/**
 * Reports made of results: a section's report (made on request) and a corridor's (made by a
 * worker job, with its progress), each stored as a file (stored_files) once made. A report
 * names the review it records, so that a report made before a review is not handed out as the
 * signed one.
 */
import { DataTypes, type QueryInterface } from 'sequelize';

const ref = (table: string, allowNull = false) => ({
  type: DataTypes.INTEGER,
  allowNull,
  references: { model: table, key: 'id' },
  onDelete: 'CASCADE',
});

export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.createTable('reports', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    kind: { type: DataTypes.STRING, allowNull: false },
    batch_id: ref('batches'),
    section_id: ref('sections', true),
    run: { type: DataTypes.INTEGER, allowNull: true },
    appendix: { type: DataTypes.STRING, allowNull: true },
    status: { type: DataTypes.STRING, allowNull: false },
    done: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    total: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    review_id: { type: DataTypes.INTEGER, allowNull: true },
    file_id: { ...ref('stored_files', true), onDelete: 'SET NULL' },
    requested_by: ref('users'),
    reason: { type: DataTypes.TEXT, allowNull: true },
    finished_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await q.addIndex('reports', ['batch_id', 'created_at']);
  await q.addIndex('reports', ['section_id', 'run']);
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.dropTable('reports');
}
