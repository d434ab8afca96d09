/** Sections of a batch: the stored input and the state of its job. */
import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize';
import type { Message } from '@scarpline/core/input';
import type { JobState } from '@scarpline/core/verdict';
import { sequelize } from '../db';

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
  /** Who started the current run with edits (null: the submitted run); they may not review it. */
  declare editedBy: CreationOptional<number | null>;
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
    editedBy: { type: DataTypes.INTEGER, allowNull: true },
    geometry: { type: DataTypes.JSONB, allowNull: true },
    inputWarnings: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    featureProperties: { type: DataTypes.JSON, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'sections' },
);
