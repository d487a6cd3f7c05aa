import 'reflect-metadata';
import { DataSource } from 'typeorm';
import { env } from '../config/env';
import { entities } from './entities';
import { migrations } from './migrations';

export function createDataSource(database = env.DB_NAME): DataSource {
  return new DataSource({
    type: 'mysql',
    host: env.DB_HOST,
    port: env.DB_PORT,
    username: env.DB_USER,
    password: env.DB_PASSWORD,
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
