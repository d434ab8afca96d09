/** Case results: one row per design case of a run's result, as the solver reported the case. */
import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize';
import type { CaseKind } from '@scarpline/core/result';
import type { Verdict } from '@scarpline/core/verdict';
import { sequelize } from '../db';

export class CaseResultRow extends Model<
  InferAttributes<CaseResultRow>,
  InferCreationAttributes<CaseResultRow>
> {
  declare id: CreationOptional<number>;
  declare resultId: ForeignKey<number>;
  /** The case's place in the section's list of cases. */
  declare position: number;
  /** Unique within its result. */
  declare name: string;
  declare kind: CaseKind;
  /** The case's own verdict (the core's codes, verdict.ts). */
  declare verdict: Verdict;
  declare governingMethod: string | null;
  declare governingFs: number | null;
  declare requiredFs: number | null;
  /** Governing FS / required FS; null without either, or with no significant slope. */
  declare ratio: number | null;
  /** The methods whose FS govern the case. */
  declare governs: string[];
  /** Per-method reports as the core gives them for the case. */
  declare methods: object[];
  declare criticalSurface: object | null;
  declare search: object | null;
  declare warnings: object[];
  /** A rapid-drawdown case's stages; a seismic case's yield coefficient and displacement. */
  declare drawdown: object | null;
  declare seismic: object | null;
  /** Where asked and below its requirement: the extra reinforcement that meets it. */
  declare requiredReinforcement: object | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}
CaseResultRow.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    position: { type: DataTypes.INTEGER, allowNull: false },
    name: { type: DataTypes.TEXT, allowNull: false },
    kind: { type: DataTypes.STRING, allowNull: false },
    verdict: { type: DataTypes.STRING, allowNull: false },
    governingMethod: { type: DataTypes.STRING, allowNull: true },
    governingFs: { type: DataTypes.DOUBLE, allowNull: true },
    requiredFs: { type: DataTypes.DOUBLE, allowNull: true },
    ratio: { type: DataTypes.DOUBLE, allowNull: true },
    governs: { type: DataTypes.JSONB, allowNull: false },
    methods: { type: DataTypes.JSONB, allowNull: false },
    criticalSurface: { type: DataTypes.JSONB, allowNull: true },
    search: { type: DataTypes.JSONB, allowNull: true },
    warnings: { type: DataTypes.JSONB, allowNull: false },
    drawdown: { type: DataTypes.JSONB, allowNull: true },
    seismic: { type: DataTypes.JSONB, allowNull: true },
    requiredReinforcement: { type: DataTypes.JSONB, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'case_results' },
);
