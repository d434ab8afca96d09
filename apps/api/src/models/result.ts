/**
 * Results: one row per run of a section, the station's summary (its verdict over every design
 * case, its governing case's FS, method, requirement and ratio, its own warnings); each case's
 * reports are in case_results (models/case-result.ts).
 */
import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize';
import type { Verdict } from '@scarpline/core/verdict';
import { sequelize } from '../db';

export class ResultRow extends Model<
  InferAttributes<ResultRow>,
  InferCreationAttributes<ResultRow>
> {
  declare id: CreationOptional<number>;
  declare sectionId: ForeignKey<number>;
  declare run: number;
  /** The station's verdict over every case (the core's codes, verdict.ts): never `input-error` here. */
  declare verdict: Verdict;
  /** The governing case (the lowest FS / required FS); null when none governs. */
  declare governingCase: string | null;
  /** The governing case's (or, when none governs, the first case's) method, FS and requirement. */
  declare governingMethod: string | null;
  declare governingFs: number | null;
  declare requiredFs: number | null;
  /** The governing case's FS / required FS. */
  declare ratio: number | null;
  /** Results written before the cases (0008 moved them to case_results): null. */
  declare methods: object | null;
  declare criticalSurface: object | null;
  /** The station's own warnings (not a case's). */
  declare warnings: object;
  declare search: object | null;
  declare reason: string | null;
  declare solverVersion: string;
  declare inputHash: string;
  declare startedAt: Date;
  declare finishedAt: Date;
  declare durationMs: number;
  declare attempt: number;
  /** Each case's probability of failure on its critical surface, where the section asks (StationProbability[]). */
  declare probability: CreationOptional<object[] | null>;
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
    governingCase: { type: DataTypes.TEXT, allowNull: true },
    governingMethod: { type: DataTypes.STRING, allowNull: true },
    governingFs: { type: DataTypes.DOUBLE, allowNull: true },
    requiredFs: { type: DataTypes.DOUBLE, allowNull: true },
    ratio: { type: DataTypes.DOUBLE, allowNull: true },
    methods: { type: DataTypes.JSONB, allowNull: true },
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
    probability: { type: DataTypes.JSONB, allowNull: true },
    input: { type: DataTypes.JSONB, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'results' },
);
