/** A worker process's heartbeat: who it is, when it was last seen, what it is on. */
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize';
import { sequelize } from '../db';

export class WorkerHeartbeat extends Model<
  InferAttributes<WorkerHeartbeat>,
  InferCreationAttributes<WorkerHeartbeat>
> {
  /** `<host>:<pid>:<random>`, new at each start of a process. */
  declare id: string;
  declare host: string;
  declare pid: number;
  declare startedAt: Date;
  /** The database's clock at the last heartbeat (one clock for every machine). */
  declare seenAt: CreationOptional<Date>;
  /** The section it is analysing, or null when idle. */
  declare sectionId: number | null;
  /** Its job figures (prom-client's metrics as JSON), summed over workers by /metrics. */
  declare metrics: object | null;
}
WorkerHeartbeat.init(
  {
    id: { type: DataTypes.STRING, primaryKey: true },
    host: { type: DataTypes.STRING, allowNull: false },
    pid: { type: DataTypes.INTEGER, allowNull: false },
    startedAt: { type: DataTypes.DATE, allowNull: false },
    seenAt: { type: DataTypes.DATE, allowNull: false },
    sectionId: { type: DataTypes.INTEGER, allowNull: true },
    metrics: { type: DataTypes.JSONB, allowNull: true },
  },
  { sequelize, tableName: 'worker_heartbeats', timestamps: false },
);
