import 'reflect-metadata';
import { DataSource } from 'typeorm';
import type { Env } from '../config/env';
import { env } from '../config/env';
import { entities } from './entities';
import { migrations } from './migrations';
import type { Log } from '../lib/log';
import { QueryLog } from '../lib/log';

/** `log` given: failed and slow queries are logged through it, SQL text only (never parameters). */
export function createDataSource(
  database = env.DB_NAME,
  db: Pick<Env, 'DB_HOST' | 'DB_PORT' | 'DB_USER' | 'DB_PASSWORD'> = env,
  log?: Log,
): DataSource {
  return new DataSource({
    type: 'mysql',
    host: db.DB_HOST,
    port: db.DB_PORT,
    username: db.DB_USER,
    password: db.DB_PASSWORD,
    database,
    charset: 'utf8mb4_unicode_ci',
    timezone: 'Z',
    // BIGINT ids come back as strings: ids stay exact and are never mixed with numbers.
    supportBigNumbers: true,
    bigNumberStrings: true,
    entities,
    migrations,
    migrationsTableName: 'schema_migrations',
    synchronize: false,
    // Without a log (scripts, tests) TypeORM says nothing: its own logger would print parameters.
    logging: log ? ['error', 'warn'] : false,
    logger: log ? new QueryLog(log) : undefined,
    maxQueryExecutionTime: 2000,
  });
}
