/**
 * Studies: a probabilistic analysis, a sensitivity or a solve of one section's run, its state
 * while workers compute it (done of total), and its result (JSON, SI, as the core gives it).
 */
import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize';
import { sequelize } from '../db';

export const STUDY_KINDS = ['probability', 'sensitivity', 'solve'] as const;
export type StudyKind = (typeof STUDY_KINDS)[number];
/** queued: waiting for a worker; running: being computed (done of total); done; failed (problem says why). */
export const STUDY_STATES = ['queued', 'running', 'done', 'failed'] as const;
export type StudyState = (typeof STUDY_STATES)[number];

export class StudyRow extends Model<InferAttributes<StudyRow>, InferCreationAttributes<StudyRow>> {
  declare id: CreationOptional<number>;
  declare sectionId: ForeignKey<number>;
  declare batchId: ForeignKey<number>;
  /** The section's run the study was asked of (its input then). */
  declare run: number;
  declare kind: StudyKind;
  declare status: StudyState;
  /** The request as accepted, defaults filled (file units, as sent). */
  declare request: object;
  /** The section's input of that run (SI), and what the core is asked (ProbabilitySpec or SolveRequest, SI). */
  declare input: object;
  declare spec: object;
  declare done: CreationOptional<number>;
  declare total: CreationOptional<number>;
  /** Chunks of realisations shared among workers (0: one job), and those written. */
  declare chunks: CreationOptional<number>;
  declare chunksDone: CreationOptional<number>;
  /** Set by the chunk that found them all written: its combining job is the only one. */
  declare combined: CreationOptional<boolean>;
  /** The critical surfaces at the means by case, which every chunk shares. */
  declare criticals: CreationOptional<object | null>;
  declare result: CreationOptional<object | null>;
  declare problem: CreationOptional<{ title: string; detail?: string } | null>;
  declare requestedBy: ForeignKey<number>;
  declare finishedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}
StudyRow.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    run: { type: DataTypes.INTEGER, allowNull: false },
    kind: { type: DataTypes.STRING, allowNull: false },
    status: { type: DataTypes.STRING, allowNull: false },
    request: { type: DataTypes.JSONB, allowNull: false },
    input: { type: DataTypes.JSONB, allowNull: false },
    spec: { type: DataTypes.JSONB, allowNull: false },
    done: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    total: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    chunks: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    chunksDone: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    combined: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    criticals: { type: DataTypes.JSONB, allowNull: true },
    result: { type: DataTypes.JSONB, allowNull: true },
    problem: { type: DataTypes.JSONB, allowNull: true },
    finishedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'studies' },
);
