import { readFileSync } from 'node:fs';
import path from 'node:path';
import { z } from 'zod';

// The only module that reads process.env: everything else receives a typed Config.
export const repoRoot = path.resolve(__dirname, '..');

const portSchema = z.coerce.number().int().min(0).max(65535);
const flagSchema = z.enum(['0', '1', 'true', 'false']).transform((v) => v === '1' || v === 'true');

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: portSchema.default(8080),
  DATABASE_URL: z.url({ protocol: /^postgres(ql)?$/ }).optional(),
  QB_DATA_DIR: z.string().min(1).default(path.join(repoRoot, '.data')),
  QB_WEB_DIR: z.string().min(1).default(path.join(repoRoot, 'dist')),
  QB_PG_PORT: portSchema.default(54320),
  QB_PG_TEST_PORT: portSchema.default(54321),
  QB_LOG_REQUESTS: flagSchema.optional(),
  QB_DB_TIMEOUT_MS: z.coerce.number().int().positive().default(2000),
});

export type Config = {
  env: 'development' | 'test' | 'production';
  host: string;
  port: number;
  /** Unset means: use the private cluster that the scripts manage. */
  databaseUrl: string | undefined;
  dataDir: string;
  webDir: string;
  pgPort: number;
  pgTestPort: number;
  logRequests: boolean;
  dbTimeoutMs: number;
  version: string;
};

function readVersion(): string {
  const pkg = JSON.parse(readFileSync(path.join(repoRoot, 'package.json'), 'utf8')) as {
    version: string;
  };
  return pkg.version;
}

export function loadConfig(env: Record<string, string | undefined> = process.env): Config {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid configuration in environment variables:\n${lines.join('\n')}`);
  }
  const e = parsed.data;
  return {
    env: e.NODE_ENV,
    host: e.HOST,
    port: e.PORT,
    databaseUrl: e.DATABASE_URL,
    dataDir: e.QB_DATA_DIR,
    webDir: e.QB_WEB_DIR,
    pgPort: e.QB_PG_PORT,
    pgTestPort: e.QB_PG_TEST_PORT,
    logRequests: e.QB_LOG_REQUESTS ?? e.NODE_ENV !== 'test',
    dbTimeoutMs: e.QB_DB_TIMEOUT_MS,
    version: readVersion(),
  };
}

/** Environment for a child process: ours plus overrides, without touching process.env. */
export function childEnv(overrides: Record<string, string>): NodeJS.ProcessEnv {
  return { ...process.env, ...overrides };
}
