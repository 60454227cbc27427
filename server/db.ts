import pg from 'pg';
import { BaseError, ConnectionError, Sequelize } from 'sequelize';
import { initModels } from './models';

/** How long opening a connection may take before the request fails (instead of hanging). */
const CONNECT_TIMEOUT_MS = 5_000;
/** A query that has not answered in this long is given up (the server may be frozen). */
const QUERY_TIMEOUT_MS = 30_000;

export function createSequelize(databaseUrl: string): Sequelize {
  const sequelize = new Sequelize(databaseUrl, {
    dialect: 'postgres',
    dialectModule: pg,
    logging: false,
    define: { underscored: true },
    // A connection the database closed (e.g. on restart) is marked invalid by Sequelize and
    // replaced on the next acquire, so the pool recovers without restarting the server.
    pool: { max: 10, min: 0, idle: 10_000, acquire: 10_000 },
    dialectOptions: {
      connectionTimeoutMillis: CONNECT_TIMEOUT_MS,
      query_timeout: QUERY_TIMEOUT_MS,
    },
  });
  initModels(sequelize);
  return sequelize;
}

// SQLSTATE classes 08 (connection exception) and 57P (operator intervention: shutdown, restart,
// "the database system is starting up"), and 53300 (too many connections).
const UNAVAILABLE_CODES = /^(08|57P0[1-4]$|53300$)/;
const UNAVAILABLE_ERRNOS = new Set(['ECONNREFUSED', 'ECONNRESET', 'EPIPE', 'ETIMEDOUT']);
const UNAVAILABLE_MESSAGES =
  /Connection terminated|connection is closed|Client has encountered a connection error|Query read timeout|timeout expired/i;

/**
 * True when an error means "the database cannot be reached right now" (stopped, restarting,
 * connection lost) rather than a fault of the request or a bug: worth a retry later.
 */
export function isDatabaseUnavailable(err: unknown): boolean {
  if (err instanceof ConnectionError) return true;
  if (!(err instanceof BaseError)) return false;
  const cause = (err as BaseError & { original?: Error & { code?: string } }).original;
  if (!cause) return false;
  const code = cause.code ?? '';
  return (
    UNAVAILABLE_CODES.test(code) ||
    UNAVAILABLE_ERRNOS.has(code) ||
    UNAVAILABLE_MESSAGES.test(cause.message)
  );
}

/** True when the database answers a trivial query within the timeout. */
export async function databaseIsUp(sequelize: Sequelize, timeoutMs: number): Promise<boolean> {
  let timer: ReturnType<typeof setTimeout> | undefined;
  const timeout = new Promise<false>((resolve) => {
    timer = setTimeout(() => resolve(false), timeoutMs);
  });
  const probe = sequelize.query('SELECT 1').then(
    () => true,
    () => false,
  );
  try {
    return await Promise.race([probe, timeout]);
  } finally {
    clearTimeout(timer);
  }
}
