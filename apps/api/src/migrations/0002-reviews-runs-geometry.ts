/**
 * Reviews name the run they concern; results keep the input they were computed from (so the
 * history of re-runs shows what changed); sections keep the line geometry of a GeoJSON corridor.
 */
import { DataTypes, type QueryInterface } from 'sequelize';

export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.addColumn('reviews', 'run', { type: DataTypes.INTEGER, allowNull: true });
  await q.addIndex('reviews', ['batch_id', 'section_id']);
  await q.addColumn('results', 'input', { type: DataTypes.JSONB, allowNull: true });
  await q.addColumn('sections', 'geometry', { type: DataTypes.JSONB, allowNull: true });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.removeColumn('sections', 'geometry');
  await q.removeColumn('results', 'input');
  await q.removeIndex('reviews', ['batch_id', 'section_id']);
  await q.removeColumn('reviews', 'run');
}
