/** Sequelize definitions and associations only; the logic is in services/. */
import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize';
import type { JobState, Message, Verdict } from '@scarpline/core';
import { sequelize } from '../db';

export const ROLES = ['admin', 'engineer', 'reviewer', 'viewer', 'integration'] as const;
export type Role = (typeof ROLES)[number];

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<number>;
  declare email: string;
  declare name: string;
  declare role: Role;
  /** scrypt$N$r$p$salt$hash; null for integration users, who hold API tokens only. */
  declare passwordHash: string | null;
  declare active: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}
User.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    email: { type: DataTypes.STRING, allowNull: false, unique: true },
    name: { type: DataTypes.STRING, allowNull: false },
    role: { type: DataTypes.STRING, allowNull: false },
    passwordHash: { type: DataTypes.STRING, allowNull: true },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'users' },
);

export class ApiToken extends Model<InferAttributes<ApiToken>, InferCreationAttributes<ApiToken>> {
  declare id: CreationOptional<number>;
  declare userId: ForeignKey<number>;
  /** `session` from sign-in, `integration` created by an admin. */
  declare kind: 'session' | 'integration';
  declare name: string | null;
  declare tokenHash: string;
  /** Projects an integration token may use; null: not limited by the token. */
  declare projectIds: number[] | null;
  declare expiresAt: Date;
  declare revokedAt: Date | null;
  declare lastUsedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}
ApiToken.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    kind: { type: DataTypes.STRING, allowNull: false },
    name: { type: DataTypes.STRING, allowNull: true },
    tokenHash: { type: DataTypes.STRING, allowNull: false, unique: true },
    projectIds: { type: DataTypes.JSONB, allowNull: true },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    revokedAt: { type: DataTypes.DATE, allowNull: true },
    lastUsedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'api_tokens' },
);

export class Project extends Model<InferAttributes<Project>, InferCreationAttributes<Project>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare description: string | null;
  declare createdBy: ForeignKey<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}
Project.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    name: { type: DataTypes.STRING, allowNull: false },
    description: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'projects' },
);

export type BatchStatus = 'running' | 'done';

export class Batch extends Model<InferAttributes<Batch>, InferCreationAttributes<Batch>> {
  declare id: CreationOptional<number>;
  declare projectId: ForeignKey<number>;
  declare submittedBy: ForeignKey<number>;
  /** The id written in the batch file (or the first section's id for loose section files). */
  declare name: string;
  declare title: string | null;
  declare status: BatchStatus;
  declare total: number;
  declare source: string;
  declare finishedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}
Batch.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    name: { type: DataTypes.STRING, allowNull: false },
    title: { type: DataTypes.TEXT, allowNull: true },
    status: { type: DataTypes.STRING, allowNull: false },
    total: { type: DataTypes.INTEGER, allowNull: false },
    source: { type: DataTypes.STRING, allowNull: false },
    finishedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'batches' },
);

/** The state of a section's job: the core's job states (verdict.ts). */
export type SectionStatus = JobState;

export class SectionRow extends Model<
  InferAttributes<SectionRow>,
  InferCreationAttributes<SectionRow>
> {
  declare id: CreationOptional<number>;
  declare batchId: ForeignKey<number>;
  /** The section's id (`<batch id>@<station>` in a corridor). */
  declare key: string;
  declare position: number;
  declare station: number | null;
  /** The validated, normalised section (SI), as analyzeSection takes it. */
  declare input: object;
  declare status: SectionStatus;
  /** The current run; a re-run with edits increments it and keeps the older results. */
  declare run: CreationOptional<number>;
  declare failReason: string | null;
  /** The section line of a GeoJSON corridor feature, as given; null for other inputs. */
  declare geometry: CreationOptional<object | null>;
  /**
   * The warnings of the input checks that concern this section (located messages as the core
   * gives them: severity, file, line, column, path, code, message); those of its current input.
   */
  declare inputWarnings: CreationOptional<Omit<Message, 'sections'>[]>;
  /** The properties of its GeoJSON corridor feature, as given (JSON: their order kept); null for other inputs. */
  declare featureProperties: CreationOptional<Record<string, unknown> | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}
SectionRow.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    key: { type: DataTypes.STRING, allowNull: false },
    position: { type: DataTypes.INTEGER, allowNull: false },
    station: { type: DataTypes.DOUBLE, allowNull: true },
    input: { type: DataTypes.JSONB, allowNull: false },
    status: { type: DataTypes.STRING, allowNull: false },
    run: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    failReason: { type: DataTypes.TEXT, allowNull: true },
    geometry: { type: DataTypes.JSONB, allowNull: true },
    inputWarnings: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    featureProperties: { type: DataTypes.JSON, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'sections' },
);

export class ResultRow extends Model<
  InferAttributes<ResultRow>,
  InferCreationAttributes<ResultRow>
> {
  declare id: CreationOptional<number>;
  declare sectionId: ForeignKey<number>;
  declare run: number;
  /** The verdict of the run (the core's codes, verdict.ts): never `input-error` here. */
  declare verdict: Verdict;
  declare governingMethod: string | null;
  declare governingFs: number | null;
  declare requiredFs: number | null;
  /** Per-method reports as analyzeSection returns them. */
  declare methods: object;
  declare criticalSurface: object | null;
  declare warnings: object;
  /** The search report (FS map, moves), kept for plots. */
  declare search: object | null;
  declare reason: string | null;
  declare solverVersion: string;
  declare inputHash: string;
  declare startedAt: Date;
  declare finishedAt: Date;
  declare durationMs: number;
  declare attempt: number;
  /** The section input this run was computed from. */
  declare input: CreationOptional<object | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}
ResultRow.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    run: { type: DataTypes.INTEGER, allowNull: false },
    verdict: { type: DataTypes.STRING, allowNull: false },
    governingMethod: { type: DataTypes.STRING, allowNull: true },
    governingFs: { type: DataTypes.DOUBLE, allowNull: true },
    requiredFs: { type: DataTypes.DOUBLE, allowNull: true },
    methods: { type: DataTypes.JSONB, allowNull: false },
    criticalSurface: { type: DataTypes.JSONB, allowNull: true },
    warnings: { type: DataTypes.JSONB, allowNull: false },
    search: { type: DataTypes.JSONB, allowNull: true },
    reason: { type: DataTypes.TEXT, allowNull: true },
    solverVersion: { type: DataTypes.STRING, allowNull: false },
    inputHash: { type: DataTypes.STRING, allowNull: false },
    startedAt: { type: DataTypes.DATE, allowNull: false },
    finishedAt: { type: DataTypes.DATE, allowNull: false },
    durationMs: { type: DataTypes.INTEGER, allowNull: false },
    attempt: { type: DataTypes.INTEGER, allowNull: false },
    input: { type: DataTypes.JSONB, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'results' },
);

export class Review extends Model<InferAttributes<Review>, InferCreationAttributes<Review>> {
  declare id: CreationOptional<number>;
  declare batchId: ForeignKey<number>;
  declare sectionId: ForeignKey<number> | null;
  declare reviewerId: ForeignKey<number>;
  declare decision: 'approved' | 'returned';
  declare comment: string;
  /** The section's run the review concerns; null for a review of the whole batch. */
  declare run: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}
Review.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    decision: { type: DataTypes.STRING, allowNull: false },
    comment: { type: DataTypes.TEXT, allowNull: false },
    run: { type: DataTypes.INTEGER, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'reviews' },
);

export class AuditEntry extends Model<
  InferAttributes<AuditEntry>,
  InferCreationAttributes<AuditEntry>
> {
  declare id: CreationOptional<number>;
  declare userId: number | null;
  declare action: string;
  declare entity: string;
  declare entityId: number | null;
  declare details: object | null;
  declare createdAt: CreationOptional<Date>;
}
AuditEntry.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    userId: { type: DataTypes.INTEGER, allowNull: true },
    action: { type: DataTypes.STRING, allowNull: false },
    entity: { type: DataTypes.STRING, allowNull: false },
    entityId: { type: DataTypes.INTEGER, allowNull: true },
    details: { type: DataTypes.JSONB, allowNull: true },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'audit_log', updatedAt: false },
);

User.hasMany(ApiToken, { foreignKey: 'userId' });
ApiToken.belongsTo(User, { foreignKey: 'userId' });
Project.belongsTo(User, { foreignKey: 'createdBy', as: 'creator' });
Project.hasMany(Batch, { foreignKey: 'projectId' });
Batch.belongsTo(Project, { foreignKey: 'projectId' });
Batch.belongsTo(User, { foreignKey: 'submittedBy', as: 'submitter' });
Batch.hasMany(SectionRow, { foreignKey: 'batchId' });
SectionRow.belongsTo(Batch, { foreignKey: 'batchId' });
SectionRow.hasMany(ResultRow, { foreignKey: 'sectionId' });
ResultRow.belongsTo(SectionRow, { foreignKey: 'sectionId' });
Review.belongsTo(User, { foreignKey: 'reviewerId', as: 'reviewer' });
Review.belongsTo(Batch, { foreignKey: 'batchId' });
Review.belongsTo(SectionRow, { foreignKey: 'sectionId' });
Batch.hasMany(Review, { foreignKey: 'batchId' });
