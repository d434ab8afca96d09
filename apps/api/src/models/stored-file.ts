/** Stored files: the metadata of an object in storage (storage.ts holds the bytes). */
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize';
import { sequelize } from '../db';

/**
 * What a stored file is: an uploaded input of a batch or a section, a generated report, a
 * terrain raster a batch's sections were cut from.
 */
export const STORED_FILE_KINDS = ['batch-input', 'section-input', 'report', 'terrain'] as const;
export type StoredFileKind = (typeof STORED_FILE_KINDS)[number];

export class StoredFile extends Model<
  InferAttributes<StoredFile>,
  InferCreationAttributes<StoredFile>
> {
  declare id: CreationOptional<number>;
  /** The object's key in the bucket. */
  declare objectKey: string;
  declare kind: StoredFileKind;
  /** The file's name as uploaded (or as made, for a report). */
  declare name: string;
  declare contentType: string;
  /** Bytes. */
  declare size: number;
  /** SHA-256 of the bytes, hexadecimal. */
  declare sha256: string;
  declare batchId: number | null;
  declare sectionId: number | null;
  declare createdBy: number;
  declare createdAt: CreationOptional<Date>;
}
StoredFile.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    objectKey: { type: DataTypes.STRING(1024), allowNull: false, unique: true },
    kind: { type: DataTypes.STRING, allowNull: false },
    name: { type: DataTypes.STRING(255), allowNull: false },
    contentType: { type: DataTypes.STRING, allowNull: false },
    // BIGINT comes back from pg as a string: read as a number (files are far below 2^53 bytes).
    size: {
      type: DataTypes.BIGINT,
      allowNull: false,
      get(this: StoredFile) {
        return Number(this.getDataValue('size'));
      },
    },
    sha256: { type: DataTypes.STRING(64), allowNull: false },
    batchId: { type: DataTypes.INTEGER, allowNull: true },
    sectionId: { type: DataTypes.INTEGER, allowNull: true },
    createdBy: { type: DataTypes.INTEGER, allowNull: false },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'stored_files', updatedAt: false },
);
