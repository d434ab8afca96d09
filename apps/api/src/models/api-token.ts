/** API tokens: sign-in sessions and integration tokens, stored as their SHA-256. */
import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
} from 'sequelize';
import { sequelize } from '../db';
import type { User } from './user';

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
  /** Its user, when loaded with it (`include: [User]`). */
  declare User?: NonAttribute<User>;
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
