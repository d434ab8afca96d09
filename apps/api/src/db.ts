/** The one Sequelize instance of a process. */
import { Sequelize } from 'sequelize';
import { config } from './config';

export const sequelize = new Sequelize(config.databaseUrl, {
  dialect: 'postgres',
  logging: false,
  pool: { max: 10 },
  define: { underscored: true },
});
