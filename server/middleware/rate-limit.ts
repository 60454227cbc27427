import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { Config } from '../config';
import { AppError } from '../errors';
import { PostgresRateLimitStore } from './rate-limit-store';

type Key = 'ip' | 'email';

function keyOf(req: Request, key: Key): string {
  if (key === 'ip') return ipKeyGenerator(req.ip ?? 'unknown');
  const email = (req.body as { email?: unknown } | undefined)?.email;
  return typeof email === 'string' ? `email:${email.trim().toLowerCase()}` : `ip:${req.ip}`;
}

/**
 * Limits tries per IP or per account (the e-mail in the body), e.g. 10 per 15 minutes.
 * The count lives in PostgreSQL, so all instances of the server share it.
 */
export function limitTries(config: Config, name: string, key: Key): RequestHandler {
  return rateLimit({
    windowMs: config.auth.rateLimitWindowMs,
    limit: config.auth.rateLimitMax,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    store: new PostgresRateLimitStore(),
    keyGenerator: (req) => `${name}:${keyOf(req, key)}`,
    handler: (req, res, next) => {
      const resetTime = (req as Request & { rateLimit?: { resetTime?: Date } }).rateLimit
        ?.resetTime;
      const seconds = Math.max(
        1,
        Math.ceil(
          ((resetTime?.getTime() ?? Date.now() + config.auth.rateLimitWindowMs) - Date.now()) /
            1000,
        ),
      );
      res.setHeader('Retry-After', String(seconds));
      const minutes = Math.ceil(seconds / 60);
      next(
        new AppError(
          429,
          'rate_limited',
          `Too many tries. Wait ${minutes} minute${minutes === 1 ? '' : 's'} and try again.`,
        ),
      );
    },
  });
}
