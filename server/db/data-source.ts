import 'reflect-metadata';
import { DataSource } from 'typeorm';
import { loadConfig } from '../config.js';
import { entities } from './entities.js';
import { migrations } from './migrations/index.js';

const config = loadConfig();

// The one data source (also read by the TypeORM CLI). Never synchronize: the schema comes from migrations.
export default new DataSource({
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
