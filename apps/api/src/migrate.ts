/** Migrations and seeders with umzug; the list is explicit so compiled and ts-jest runs agree. */
import { Umzug, SequelizeStorage } from 'umzug';
import type { QueryInterface, Sequelize } from 'sequelize';
import * as initial from './migrations/0001-initial';
import * as second from './migrations/0002-reviews-runs-geometry';
import * as third from './migrations/0003-section-input-warnings';
import * as fourth from './migrations/0004-verdicts-feature-properties';
import * as fifth from './migrations/0005-accounts-and-editors';
import * as sixth from './migrations/0006-worker-heartbeats';
import * as seventh from './migrations/0007-phi-zero-circle-interslice';
import * as eighth from './migrations/0008-case-results';
import * as ninth from './migrations/0009-required-reinforcement';
import * as tenth from './migrations/0010-stored-files';
import * as eleventh from './migrations/0011-reports';
import * as twelfth from './migrations/0012-studies';

export function migrator(sequelize: Sequelize): Umzug<QueryInterface> {
  return new Umzug({
    migrations: [
      { name: '0001-initial', up: initial.up, down: initial.down },
      { name: '0002-reviews-runs-geometry', up: second.up, down: second.down },
      { name: '0003-section-input-warnings', up: third.up, down: third.down },
      { name: '0004-verdicts-feature-properties', up: fourth.up, down: fourth.down },
      { name: '0005-accounts-and-editors', up: fifth.up, down: fifth.down },
      { name: '0006-worker-heartbeats', up: sixth.up, down: sixth.down },
      { name: '0007-phi-zero-circle-interslice', up: seventh.up, down: seventh.down },
      { name: '0008-case-results', up: eighth.up, down: eighth.down },
      { name: '0009-required-reinforcement', up: ninth.up, down: ninth.down },
      { name: '0010-stored-files', up: tenth.up, down: tenth.down },
      { name: '0011-reports', up: eleventh.up, down: eleventh.down },
      { name: '0012-studies', up: twelfth.up, down: twelfth.down },
    ],
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  });
}

export async function migrate(sequelize: Sequelize): Promise<string[]> {
  const done = await migrator(sequelize).up();
  return done.map((m) => m.name);
}
