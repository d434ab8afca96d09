/** Results: one row per run of a section, as the solver reported it. */
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
