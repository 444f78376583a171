import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { z } from 'zod';

// Environment of the server, validated once at start; a bad value stops the process with a message naming the variable.

const portSchema = z.coerce.number().int().min(0).max(65535);

const envSchema = z.object({
  HOST: z.string().default('127.0.0.1'),
  PORT: portSchema.default(8640),
  DATA_DIR: z.string().default('.data'),
  DB_HOST: z.string().default('127.0.0.1'),
  DB_PORT: portSchema.default(3407),
  DB_NAME: z.string().regex(/^[A-Za-z0-9_]+$/, 'letters, digits and _ only').default('gapsight'),
  DB_USER: z.string().default('gapsight'),
  DB_PASSWORD: z.string().optional(),
  // The migrator account: owns the schema (migrations only); the app's DB_USER gets row rights only. Default <DB_USER>_owner,
  // password DB_OWNER_PASSWORD or DATA_DIR/db-owner-password (written by the provisioning).
  DB_OWNER_USER: z.string().regex(/^[A-Za-z0-9_]+$/, 'letters, digits and _ only').optional(),
  DB_OWNER_PASSWORD: z.string().optional(),
  JWT_SECRET: z.string().optional(),
  JWT_EXPIRES_IN: z.string().regex(/^\d+[smhd]$/, 'a number followed by s, m, h or d (e.g. 8h)').default('8h'),
  DEMO: z.enum(['on', 'off']).default('on'),
  APP_URL: z.string().url().optional(),
  SMTP_HOST: z.string().optional(),
  SMTP_PORT: portSchema.optional(),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  SMTP_SECURE: z.enum(['true', 'false']).optional(),
  MAIL_FROM: z.string().default('Gapsight <gapsight@localhost>'),
  MAIL_SINK_PORT: portSchema.default(2526),
  LOGIN_MAX_FAILURES: z.coerce.number().int().min(1).default(5),
  LOGIN_LOCK_MINUTES: z.coerce.number().min(0.01).default(15),
  // Failed sign-ins one client address may make in the window before 429 (every account together).
  LOGIN_RATE_LIMIT_MAX: z.coerce.number().int().min(1).default(20),
  LOGIN_RATE_LIMIT_WINDOW_MINUTES: z.coerce.number().min(0.01).default(15),
  // Which proxies Express believes about the client's address (X-Forwarded-For): off (default), a hop count, or
  // addresses/subnets/names such as loopback or 10.0.0.0/8 (comma separated).
  TRUST_PROXY: z
    .string()
    .trim()
    .regex(/^(off|\d{1,2}|[A-Za-z0-9.:/]+(\s*,\s*[A-Za-z0-9.:/]+)*)$/, 'off, a number of hops, or addresses, subnets or names (loopback, 10.0.0.0/8)')
    .default('off'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
});

export type Config = z.infer<typeof envSchema> & { dataDir: string; dbPassword: string; dbOwnerUser: string; dbOwnerPassword: string; jwtSecret: string };

/** Reads a secret kept in the data folder (created by the provisioning script), or '' when absent. */
export function readDataSecret(dataDir: string, name: string): string {
  const file = path.join(dataDir, name);
  return existsSync(file) ? readFileSync(file, 'utf8').trim() : '';
}

export const JWT_SECRET_MIN = 32;

/** A configuration the server cannot run with; the message names the variable. */
export class ConfigError extends Error {}

/**
 * Parses the environment into a Config; throws a ConfigError naming every bad variable.
 * An explicitly set JWT_SECRET must have at least 32 characters. When JWT_SECRET is not set, the secret comes from
 * DATA_DIR/jwt-secret (written by `npm start`); with `requireJwtSecret` (the server) a missing or short one is an error,
 * without it (database tools that sign nothing) jwtSecret is then ''.
 */
export function loadConfig(env: NodeJS.ProcessEnv = process.env, opts: { requireJwtSecret?: boolean } = {}): Config {
  const parsed = envSchema.safeParse(env);
  const lines = parsed.success ? [] : parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
  const jwt = env.JWT_SECRET;
  if (jwt !== undefined && jwt.trim().length < JWT_SECRET_MIN) {
    lines.push(
      jwt.trim() === ''
        ? `  JWT_SECRET: set but empty; give it at least ${JWT_SECRET_MIN} random characters (e.g. openssl rand -hex 32), or unset it to use the data folder's secret`
        : `  JWT_SECRET: ${jwt.length} characters; it needs at least ${JWT_SECRET_MIN} (e.g. openssl rand -hex 32)`,
    );
  }
  if (!parsed.success || lines.length) throw new ConfigError(`Invalid environment:\n${lines.join('\n')}`);
  const c = parsed.data;
  const dataDir = path.resolve(c.DATA_DIR);
  const jwtSecret = c.JWT_SECRET ?? readDataSecret(dataDir, 'jwt-secret');
  if (opts.requireJwtSecret && jwtSecret.length < JWT_SECRET_MIN) {
    const file = path.join(dataDir, 'jwt-secret');
    throw new ConfigError(
      `Invalid environment:\n  JWT_SECRET: not set, and ${file} is ${jwtSecret ? `shorter than ${JWT_SECRET_MIN} characters` : 'missing'}; ` +
        `set JWT_SECRET to at least ${JWT_SECRET_MIN} random characters (e.g. openssl rand -hex 32)`,
    );
  }
  return {
    ...c,
    dataDir,
    dbPassword: c.DB_PASSWORD || readDataSecret(dataDir, 'db-password'),
    dbOwnerUser: c.DB_OWNER_USER || `${c.DB_USER}_owner`,
    dbOwnerPassword: c.DB_OWNER_PASSWORD || readDataSecret(dataDir, 'db-owner-password'),
    jwtSecret,
  };
}
