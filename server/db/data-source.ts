import 'reflect-metadata';
import { DataSource } from 'typeorm';
import type { Env } from '../config/env';
import { env } from '../config/env';
import { entities } from './entities';
import { migrations } from './migrations';

export function createDataSource(database = env.DB_NAME, db: Pick<Env, 'DB_HOST' | 'DB_PORT' | 'DB_USER' | 'DB_PASSWORD'> = env): DataSource {
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
    // Tests provoke constraint errors on purpose; elsewhere failed queries are logged.
    logging: env.NODE_ENV === 'test' ? false : ['error'],
  });
}
