import type { Knex } from 'knex';
import type { AppConfig } from '../config/config';

export function knexConfig(db: AppConfig['database']): Knex.Config {
  return {
    client: 'pg',
    connection: { host: db.host, port: db.port, user: db.user, password: db.password, database: db.database },
    pool: { min: 0, max: 10 },
  };
}
