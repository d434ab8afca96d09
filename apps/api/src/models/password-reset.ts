/** Password-reset links sent by mail: the SHA-256 of their token, single use, expiring. */
import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize';
import { sequelize } from '../db';

export class PasswordReset extends Model<
  InferAttributes<PasswordReset>,
  InferCreationAttributes<PasswordReset>
> {
  declare id: CreationOptional<number>;
  declare userId: ForeignKey<number>;
  declare tokenHash: string;
  declare expiresAt: Date;
  /** When it was used, or replaced by a newer link; null while it may be used. */
  declare usedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
}
PasswordReset.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    tokenHash: { type: DataTypes.STRING, allowNull: false, unique: true },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    usedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'password_resets', updatedAt: false },
);
