import 'reflect-metadata';
import { DataSource } from 'typeorm';
import type { Config } from '../config.js';
import { entities } from './entities.js';
import { migrations } from './migrations/index.js';

/** The data source for a checked configuration. Never synchronize: the schema comes from migrations. */
export function createDataSource(config: Pick<Config, 'DB_HOST' | 'DB_PORT' | 'DB_USER' | 'DB_NAME' | 'dbPassword'>): DataSource {
  return new DataSource({
    type: 'mariadb',
    host: config.DB_HOST,
    port: config.DB_PORT,
    username: config.DB_USER,
    password: config.dbPassword,
    database: config.DB_NAME,
    entities,
    migrations,
    synchronize: false,
    migrationsRun: false,
    logging: false,
    charset: 'utf8mb4_unicode_ci',
    timezone: 'Z',
    extra: { decimalNumbers: true, supportBigNumbers: true, bigNumberStrings: false, connectionLimit: 10 },
  });
}
