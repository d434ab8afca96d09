/**
 * Workers' heartbeats: each worker process keeps a row up to date (seen_at, the section it is
 * on, its job figures for /metrics), so the API knows whether any worker is alive. A batch
 * remembers since when it has been stalled (sections waiting, no worker alive), so that an
 * administrator is told once per stall.
 */
import { DataTypes, type QueryInterface } from 'sequelize';

export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.createTable('worker_heartbeats', {
    id: { type: DataTypes.STRING, primaryKey: true },
    host: { type: DataTypes.STRING, allowNull: false },
    pid: { type: DataTypes.INTEGER, allowNull: false },
    started_at: { type: DataTypes.DATE, allowNull: false },
    seen_at: { type: DataTypes.DATE, allowNull: false },
    section_id: { type: DataTypes.INTEGER, allowNull: true },
    metrics: { type: DataTypes.JSONB, allowNull: true },
  });
  await q.addIndex('worker_heartbeats', ['seen_at']);
  await q.addColumn('batches', 'stalled_since', { type: DataTypes.DATE, allowNull: true });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.removeColumn('batches', 'stalled_since');
  await q.dropTable('worker_heartbeats');
}
