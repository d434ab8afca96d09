/** The first schema: users, tokens, projects, batches, sections, results, reviews, audit log. */
import { DataTypes, type QueryInterface } from 'sequelize';

const id = { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true };
const stamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};
const ref = (table: string, allowNull = false) => ({
  type: DataTypes.INTEGER,
  allowNull,
  references: { model: table, key: 'id' },
  onDelete: 'CASCADE',
});

export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.createTable('users', {
    id,
    email: { type: DataTypes.STRING, allowNull: false, unique: true },
    name: { type: DataTypes.STRING, allowNull: false },
    role: { type: DataTypes.STRING, allowNull: false },
    password_hash: { type: DataTypes.STRING, allowNull: true },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    ...stamps,
  });
  await q.createTable('api_tokens', {
    id,
    user_id: ref('users'),
    kind: { type: DataTypes.STRING, allowNull: false },
    name: { type: DataTypes.STRING, allowNull: true },
    token_hash: { type: DataTypes.STRING, allowNull: false, unique: true },
    project_ids: { type: DataTypes.JSONB, allowNull: true },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    revoked_at: { type: DataTypes.DATE, allowNull: true },
    last_used_at: { type: DataTypes.DATE, allowNull: true },
    ...stamps,
  });
  await q.createTable('projects', {
    id,
    name: { type: DataTypes.STRING, allowNull: false },
    description: { type: DataTypes.TEXT, allowNull: true },
    created_by: ref('users'),
    ...stamps,
  });
  await q.createTable('batches', {
    id,
    project_id: ref('projects'),
    submitted_by: ref('users'),
    name: { type: DataTypes.STRING, allowNull: false },
    title: { type: DataTypes.TEXT, allowNull: true },
    status: { type: DataTypes.STRING, allowNull: false },
    total: { type: DataTypes.INTEGER, allowNull: false },
    source: { type: DataTypes.STRING, allowNull: false },
    finished_at: { type: DataTypes.DATE, allowNull: true },
    ...stamps,
  });
  await q.createTable('sections', {
    id,
    batch_id: ref('batches'),
    key: { type: DataTypes.STRING, allowNull: false },
    position: { type: DataTypes.INTEGER, allowNull: false },
    station: { type: DataTypes.DOUBLE, allowNull: true },
    input: { type: DataTypes.JSONB, allowNull: false },
    status: { type: DataTypes.STRING, allowNull: false },
    run: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    fail_reason: { type: DataTypes.TEXT, allowNull: true },
    ...stamps,
  });
  await q.addIndex('sections', ['batch_id', 'key'], { unique: true });
  await q.addIndex('sections', ['batch_id', 'status']);
  await q.createTable('results', {
    id,
    section_id: ref('sections'),
    run: { type: DataTypes.INTEGER, allowNull: false },
    status: { type: DataTypes.STRING, allowNull: false },
    governing_method: { type: DataTypes.STRING, allowNull: true },
    governing_fs: { type: DataTypes.DOUBLE, allowNull: true },
    required_fs: { type: DataTypes.DOUBLE, allowNull: true },
    methods: { type: DataTypes.JSONB, allowNull: false },
    critical_surface: { type: DataTypes.JSONB, allowNull: true },
    warnings: { type: DataTypes.JSONB, allowNull: false },
    search: { type: DataTypes.JSONB, allowNull: true },
    reason: { type: DataTypes.TEXT, allowNull: true },
    solver_version: { type: DataTypes.STRING, allowNull: false },
    input_hash: { type: DataTypes.STRING, allowNull: false },
    started_at: { type: DataTypes.DATE, allowNull: false },
    finished_at: { type: DataTypes.DATE, allowNull: false },
    duration_ms: { type: DataTypes.INTEGER, allowNull: false },
    attempt: { type: DataTypes.INTEGER, allowNull: false },
    ...stamps,
  });
  // One result per section and run: a retried job overwrites, never duplicates.
  await q.addIndex('results', ['section_id', 'run'], { unique: true });
  await q.createTable('reviews', {
    id,
    batch_id: ref('batches'),
    section_id: ref('sections', true),
    reviewer_id: ref('users'),
    decision: { type: DataTypes.STRING, allowNull: false },
    comment: { type: DataTypes.TEXT, allowNull: false },
    ...stamps,
  });
  await q.createTable('audit_log', {
    id,
    user_id: { type: DataTypes.INTEGER, allowNull: true },
    action: { type: DataTypes.STRING, allowNull: false },
    entity: { type: DataTypes.STRING, allowNull: false },
    entity_id: { type: DataTypes.INTEGER, allowNull: true },
    details: { type: DataTypes.JSONB, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  for (const t of [
    'audit_log',
    'reviews',
    'results',
    'sections',
    'batches',
    'projects',
    'api_tokens',
    'users',
  ]) {
    await q.dropTable(t);
  }
}
