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
  JWT_SECRET: z.string().min(32, 'at least 32 characters').optional(),
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
});

export type Config = z.infer<typeof envSchema> & { dataDir: string; dbPassword: string; jwtSecret: string };

/** Reads a secret kept in the data folder (created by the provisioning script), or '' when absent. */
export function readDataSecret(dataDir: string, name: string): string {
  const file = path.join(dataDir, name);
  return existsSync(file) ? readFileSync(file, 'utf8').trim() : '';
}

/** Parses process.env into a Config; throws an Error naming every bad variable. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid environment:\n${lines.join('\n')}`);
  }
  const c = parsed.data;
  const dataDir = path.resolve(c.DATA_DIR);
  return {
    ...c,
    dataDir,
    dbPassword: c.DB_PASSWORD ?? readDataSecret(dataDir, 'db-password'),
    jwtSecret: c.JWT_SECRET ?? readDataSecret(dataDir, 'jwt-secret'),
  };
}
