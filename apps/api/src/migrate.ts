/** Migrations and seeders with umzug; the list is explicit so compiled and ts-jest runs agree. */
import { Umzug, SequelizeStorage } from 'umzug';
import type { QueryInterface, Sequelize } from 'sequelize';
import * as initial from './migrations/0001-initial';

export function migrator(sequelize: Sequelize): Umzug<QueryInterface> {
  return new Umzug({
    migrations: [{ name: '0001-initial', up: initial.up, down: initial.down }],
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  });
}

export async function migrate(sequelize: Sequelize): Promise<string[]> {
  const done = await migrator(sequelize).up();
  return done.map((m) => m.name);
}
