/** Reports: a section's or a corridor's PDF, its state while a worker makes it, and its file. */
import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize';
import { sequelize } from '../db';

export const REPORT_KINDS = ['section', 'corridor'] as const;
export type ReportKind = (typeof REPORT_KINDS)[number];
/** queued: waiting for a worker; running: being laid out (done of total section pages). */
export const REPORT_STATES = ['queued', 'running', 'done', 'failed'] as const;
export type ReportState = (typeof REPORT_STATES)[number];
/** The section pages a corridor report appends: every station's, those below requirement, none. */
export const APPENDIX_CHOICES = ['all', 'below', 'none'] as const;
export type Appendix = (typeof APPENDIX_CHOICES)[number];

export class ReportRow extends Model<
  InferAttributes<ReportRow>,
  InferCreationAttributes<ReportRow>
> {
  declare id: CreationOptional<number>;
  declare kind: ReportKind;
  declare batchId: ForeignKey<number>;
  /** The section of a section report; null for a corridor's. */
  declare sectionId: ForeignKey<number> | null;
  /** The section's run a section report shows; null for a corridor's. */
  declare run: number | null;
  declare appendix: Appendix | null;
  declare status: ReportState;
  declare done: CreationOptional<number>;
  declare total: CreationOptional<number>;
  /** The review the report records (the latest that applied when it was made); null: none. */
  declare reviewId: number | null;
  declare fileId: ForeignKey<number> | null;
  declare requestedBy: ForeignKey<number>;
  /** Why a failed report was not made. */
  declare reason: CreationOptional<string | null>;
  declare finishedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}
ReportRow.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    kind: { type: DataTypes.STRING, allowNull: false },
    run: { type: DataTypes.INTEGER, allowNull: true },
    appendix: { type: DataTypes.STRING, allowNull: true },
    status: { type: DataTypes.STRING, allowNull: false },
    done: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    total: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    reviewId: { type: DataTypes.INTEGER, allowNull: true },
    reason: { type: DataTypes.TEXT, allowNull: true },
    finishedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'reports' },
);
