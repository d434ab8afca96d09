/**
 * Section studies (a probabilistic analysis, a sensitivity or a solve of one section's current
 * input, run by worker jobs with their progress, their result kept as JSON), the FS of the
 * chunks of a study whose realisations are shared among workers, and the probability of failure
 * a corridor's station carries with its result (results.probability).
 */
import { DataTypes, type QueryInterface } from 'sequelize';

const ref = (table: string) => ({
  type: DataTypes.INTEGER,
  allowNull: false,
  references: { model: table, key: 'id' },
  onDelete: 'CASCADE',
});

export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.createTable('studies', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    section_id: ref('sections'),
    batch_id: ref('batches'),
    run: { type: DataTypes.INTEGER, allowNull: false },
    kind: { type: DataTypes.STRING, allowNull: false },
    status: { type: DataTypes.STRING, allowNull: false },
    request: { type: DataTypes.JSONB, allowNull: false },
    input: { type: DataTypes.JSONB, allowNull: false },
    spec: { type: DataTypes.JSONB, allowNull: false },
    done: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    total: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    chunks: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    chunks_done: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    combined: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    criticals: { type: DataTypes.JSONB, allowNull: true },
    result: { type: DataTypes.JSONB, allowNull: true },
    problem: { type: DataTypes.JSONB, allowNull: true },
    requested_by: ref('users'),
    finished_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await q.addIndex('studies', ['section_id', 'id']);
  await q.createTable('study_chunks', {
    study_id: { ...ref('studies'), primaryKey: true },
    position: { type: DataTypes.INTEGER, allowNull: false, primaryKey: true },
    case_name: { type: DataTypes.TEXT, allowNull: false },
    from_index: { type: DataTypes.INTEGER, allowNull: false },
    fs: { type: DataTypes.JSONB, allowNull: false },
  });
  await q.addColumn('results', 'probability', { type: DataTypes.JSONB, allowNull: true });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.removeColumn('results', 'probability');
  await q.dropTable('study_chunks');
  await q.dropTable('studies');
}
