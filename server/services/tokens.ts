import { createHash, createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import jwt from 'jsonwebtoken';
import type { Config } from '../config';
import { AppError } from '../errors';

const ISSUER = 'quenchbook';
const AUDIENCE = 'quenchbook-api';

/** An unguessable token for links and refresh: 32 random bytes. */
export function randomToken(): string {
  return randomBytes(32).toString('base64url');
}

/** Tokens are stored only as hashes, so a database leak does not hand out working links. */
export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

export type AccessClaims = { userId: string; sessionId: string };

export function signAccessToken(config: Config, claims: AccessClaims): string {
  return jwt.sign({ sid: claims.sessionId }, config.auth.jwtSecret, {
    algorithm: 'HS256',
    expiresIn: config.auth.accessTtlSeconds,
    issuer: ISSUER,
    audience: AUDIENCE,
    subject: claims.userId,
  });
}

export function verifyAccessToken(config: Config, token: string): AccessClaims {
  try {
    // The algorithm is pinned: a token with alg "none" or another algorithm is refused.
    const payload = jwt.verify(token, config.auth.jwtSecret, {
      algorithms: ['HS256'],
      issuer: ISSUER,
      audience: AUDIENCE,
    });
    if (
      typeof payload === 'string' ||
      typeof payload.sub !== 'string' ||
      typeof payload.sid !== 'string'
    ) {
      throw new Error('claims missing');
    }
    return { userId: payload.sub, sessionId: payload.sid };
  } catch (err) {
    if (err instanceof jwt.TokenExpiredError) {
      throw new AppError(
        401,
        'token_expired',
        'Your sign-in has expired. Refresh it or sign in again.',
      );
    }
    throw new AppError(401, 'unauthenticated', 'Please sign in.');
  }
}

/** CSRF token bound to the session: an HMAC, so nothing extra is stored. */
export function csrfTokenFor(config: Config, sessionId: string): string {
  return createHmac('sha256', config.auth.jwtSecret)
    .update(`csrf:${sessionId}`)
    .digest('base64url');
}

export function csrfTokenMatches(
  config: Config,
  sessionId: string,
  given: string | undefined,
): boolean {
  if (!given) return false;
  const expected = Buffer.from(csrfTokenFor(config, sessionId));
  const actual = Buffer.from(given);
  return expected.length === actual.length && timingSafeEqual(expected, actual);
}
