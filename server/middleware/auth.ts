import type { Request, RequestHandler, Response } from 'express';
import type { Capability, Role } from '../../shared/schemas/roles';
import { roleCan } from '../../shared/schemas/roles';
import type { Config } from '../config';
import { AppError } from '../errors';
import type { UserModel } from '../models';
import type { RequestMeta } from '../services/deps';
import { roleIn } from '../services/labs';
import { activeSessionUser } from '../services/sessions';
import { csrfTokenMatches, verifyAccessToken } from '../services/tokens';

export const ACCESS_COOKIE = 'qb_access';
export const REFRESH_COOKIE = 'qb_refresh';
export const CSRF_HEADER = 'x-csrf-token';

export type Auth = { user: UserModel; sessionId: string; via: 'header' | 'cookie' };

export function authOf(res: Response): Auth {
  const auth = res.locals.auth as Auth | undefined;
  if (!auth) throw new Error('authOf used on a route without requireAuth');
  return auth;
}

export function labOf(res: Response): { id: string; role: Role } {
  const lab = res.locals.lab as { id: string; role: Role } | undefined;
  if (!lab) throw new Error('labOf used on a route without requireLab');
  return lab;
}

export function metaOf(req: Request): RequestMeta {
  return { ip: req.ip ?? null, userAgent: req.get('user-agent') ?? null };
}

function bearer(req: Request): string | undefined {
  const header = req.get('authorization');
  if (!header) return undefined;
  const [scheme, token] = header.split(' ');
  return scheme?.toLowerCase() === 'bearer' && token ? token : '';
}

const UNSAFE = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/**
 * Reads the caller from an Authorization header (API clients) or the access cookie (the web
 * app). A cookie-borne write must also carry the session's CSRF token in X-CSRF-Token.
 * With `optional`, a caller without valid credentials continues as anonymous.
 */
export function authenticate(config: Config, opts: { optional?: boolean } = {}): RequestHandler {
  return async (req, res, next) => {
    const fromHeader = bearer(req);
    const cookies = req.cookies as Record<string, string | undefined>;
    const token = fromHeader ?? cookies[ACCESS_COOKIE];
    try {
      if (!token) throw new AppError(401, 'unauthenticated', 'Please sign in.');
      const claims = verifyAccessToken(config, token);
      const user = await activeSessionUser(claims.sessionId, claims.userId);
      const via = fromHeader !== undefined ? 'header' : 'cookie';
      if (
        via === 'cookie' &&
        UNSAFE.has(req.method) &&
        !csrfTokenMatches(config, claims.sessionId, req.get(CSRF_HEADER))
      ) {
        throw new AppError(
          403,
          'csrf_failed',
          'This request is missing its security token. Reload the page and try again.',
        );
      }
      res.locals.auth = { user, sessionId: claims.sessionId, via } satisfies Auth;
      next();
    } catch (err) {
      if (opts.optional && err instanceof AppError && err.status === 401) next();
      else next(err);
    }
  };
}

/**
 * The caller must be a member of :labId holding the capability. Not a member, or no such
 * lab: 404, so another lab's records do not even show that they exist.
 */
export function requireLab(capability: Capability): RequestHandler {
  return async (req, res, next) => {
    const labId = String(req.params.labId ?? '');
    const { user } = authOf(res);
    const uuid = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
    const role = uuid.test(labId) ? await roleIn(labId, user.id) : undefined;
    if (!role) return next(AppError.notFound('No such lab, or you are not a member of it.'));
    if (!roleCan(role, capability)) {
      return next(
        new AppError(403, 'forbidden', `Your role in this lab (${role}) does not allow this.`),
      );
    }
    res.locals.lab = { id: labId, role };
    next();
  };
}
