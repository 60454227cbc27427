import { randomBytes } from 'node:crypto';
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
  QB_PUBLIC_URL: z.url().optional(),
  QB_JWT_SECRET: z.string().min(32, 'must be at least 32 characters').optional(),
  QB_ACCESS_TTL_S: z.coerce.number().int().min(30).max(3600).default(900),
  QB_REFRESH_TTL_DAYS: z.coerce.number().int().min(1).max(365).default(30),
  QB_COOKIE_SECURE: flagSchema.optional(),
  QB_PASSWORD_COST: z.enum(['owasp', 'test']).default('owasp'),
  QB_RATE_LIMIT_MAX: z.coerce.number().int().min(1).default(10),
  QB_RATE_LIMIT_WINDOW_MS: z.coerce
    .number()
    .int()
    .min(1000)
    .default(15 * 60 * 1000),
  SMTP_HOST: z.string().min(1).optional(),
  SMTP_PORT: portSchema.optional(),
  SMTP_SECURE: flagSchema.optional(),
  SMTP_USER: z.string().optional(),
  SMTP_PASS: z.string().optional(),
  MAIL_FROM: z.string().min(3).default('Quenchbook <no-reply@quenchbook.invalid>'),
  QB_FAKE_SMTP_PORT: portSchema.default(2526),
  QB_MAILBOX_DIR: z.string().min(1).optional(),
  QB_S3_BUCKET: z.string().min(1).optional(),
  QB_S3_ENDPOINT: z.url().optional(),
  QB_S3_REGION: z.string().min(1).default('us-east-1'),
  QB_S3_ACCESS_KEY_ID: z.string().min(1).optional(),
  QB_S3_SECRET_ACCESS_KEY: z.string().min(1).optional(),
  QB_S3_FORCE_PATH_STYLE: flagSchema.optional(),
});

export type S3Config = {
  bucket: string;
  /** Unset means the provider's default endpoint for the region. */
  endpoint: string | undefined;
  region: string;
  accessKeyId: string;
  secretAccessKey: string;
  forcePathStyle: boolean;
};

/** Where photos live: a folder on this machine, or a bucket every instance shares. */
export type PhotoStorageConfig = { kind: 'disk'; dir: string } | ({ kind: 's3' } & S3Config);

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
  /** Base of links in e-mails, e.g. https://quenchbook.example.org; the one origin CORS allows. */
  publicUrl: string;
  photos: PhotoStorageConfig;
  auth: {
    jwtSecret: string;
    accessTtlSeconds: number;
    refreshTtlDays: number;
    cookieSecure: boolean;
    passwordCost: 'owasp' | 'test';
    rateLimitMax: number;
    rateLimitWindowMs: number;
  };
  mail: {
    host: string;
    port: number;
    secure: boolean;
    user: string | undefined;
    pass: string | undefined;
    from: string;
    /** Outside production: a local fake SMTP server captures mail here, shown at /dev/mail. */
    fakeSmtp: { port: number; mailboxDir: string } | undefined;
  };
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
  const production = e.NODE_ENV === 'production';
  const problems: string[] = [];
  if (production && !e.QB_JWT_SECRET) problems.push('  QB_JWT_SECRET: required in production');
  if (production && e.QB_PASSWORD_COST !== 'owasp') {
    problems.push('  QB_PASSWORD_COST: only "owasp" is allowed in production');
  }
  if (production && !e.SMTP_HOST) problems.push('  SMTP_HOST: required in production');
  // Links in e-mails and the CORS origin come from it; a guess from HOST and PORT is wrong
  // behind any proxy.
  if (production && !e.QB_PUBLIC_URL) problems.push('  QB_PUBLIC_URL: required in production');
  if (e.QB_S3_BUCKET && !(e.QB_S3_ACCESS_KEY_ID && e.QB_S3_SECRET_ACCESS_KEY)) {
    problems.push(
      '  QB_S3_ACCESS_KEY_ID, QB_S3_SECRET_ACCESS_KEY: required when QB_S3_BUCKET is set',
    );
  }
  if (problems.length) {
    throw new Error(`Invalid configuration in environment variables:\n${problems.join('\n')}`);
  }
  const dataDir = e.QB_DATA_DIR;
  const fakeSmtp =
    !production && !e.SMTP_HOST
      ? { port: e.QB_FAKE_SMTP_PORT, mailboxDir: e.QB_MAILBOX_DIR ?? path.join(dataDir, 'mail') }
      : undefined;
  return {
    env: e.NODE_ENV,
    host: e.HOST,
    port: e.PORT,
    databaseUrl: e.DATABASE_URL,
    dataDir,
    webDir: e.QB_WEB_DIR,
    pgPort: e.QB_PG_PORT,
    pgTestPort: e.QB_PG_TEST_PORT,
    logRequests: e.QB_LOG_REQUESTS ?? e.NODE_ENV !== 'test',
    dbTimeoutMs: e.QB_DB_TIMEOUT_MS,
    version: readVersion(),
    publicUrl: (e.QB_PUBLIC_URL ?? `http://${e.HOST}:${e.PORT}`).replace(/\/$/, ''),
    photos:
      e.QB_S3_BUCKET && e.QB_S3_ACCESS_KEY_ID && e.QB_S3_SECRET_ACCESS_KEY
        ? {
            kind: 's3',
            bucket: e.QB_S3_BUCKET,
            endpoint: e.QB_S3_ENDPOINT,
            region: e.QB_S3_REGION,
            accessKeyId: e.QB_S3_ACCESS_KEY_ID,
            secretAccessKey: e.QB_S3_SECRET_ACCESS_KEY,
            // Most S3-compatible stores (and the local fake) only answer path-style requests.
            forcePathStyle: e.QB_S3_FORCE_PATH_STYLE ?? true,
          }
        : { kind: 'disk', dir: path.join(dataDir, 'photos') },
    auth: {
      // Outside production a per-process secret is fine: a restart only forces a token refresh.
      jwtSecret: e.QB_JWT_SECRET ?? randomBytes(32).toString('base64url'),
      accessTtlSeconds: e.QB_ACCESS_TTL_S,
      refreshTtlDays: e.QB_REFRESH_TTL_DAYS,
      cookieSecure: e.QB_COOKIE_SECURE ?? production,
      passwordCost: e.QB_PASSWORD_COST,
      rateLimitMax: e.QB_RATE_LIMIT_MAX,
      rateLimitWindowMs: e.QB_RATE_LIMIT_WINDOW_MS,
    },
    mail: {
      host: e.SMTP_HOST ?? '127.0.0.1',
      port: e.SMTP_PORT ?? (fakeSmtp ? fakeSmtp.port : 587),
      secure: e.SMTP_SECURE ?? false,
      user: e.SMTP_USER,
      pass: e.SMTP_PASS,
      from: e.MAIL_FROM,
      fakeSmtp,
    },
  };
}

/** Environment for a child process: ours plus overrides, without touching process.env. */
export function childEnv(overrides: Record<string, string>): NodeJS.ProcessEnv {
  return { ...process.env, ...overrides };
}
