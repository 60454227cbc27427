import type { Response } from 'express';
import type { Config } from '../config';
import { ACCESS_COOKIE, REFRESH_COOKIE } from '../middleware/auth';
import type { IssuedTokens } from '../services/sessions';

const DAY_MS = 24 * 60 * 60 * 1000;

export function setSessionCookies(res: Response, config: Config, tokens: IssuedTokens): void {
  const base = { httpOnly: true, sameSite: 'lax' as const, secure: config.auth.cookieSecure };
  res.cookie(ACCESS_COOKIE, tokens.accessToken, {
    ...base,
    path: '/api',
    maxAge: config.auth.accessTtlSeconds * 1000,
  });
  // The refresh token is only ever sent to the auth routes.
  res.cookie(REFRESH_COOKIE, tokens.refreshToken, {
    ...base,
    path: '/api/auth',
    maxAge: config.auth.refreshTtlDays * DAY_MS,
  });
}

export function clearSessionCookies(res: Response, config: Config): void {
  const base = { httpOnly: true, sameSite: 'lax' as const, secure: config.auth.cookieSecure };
  res.clearCookie(ACCESS_COOKIE, { ...base, path: '/api' });
  res.clearCookie(REFRESH_COOKIE, { ...base, path: '/api/auth' });
}
