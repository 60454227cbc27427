import { Router, type Response } from 'express';
import { z } from 'zod';
import {
  changePasswordSchema,
  refreshSchema,
  resetConfirmSchema,
  sessionStateSchema,
  resetRequestSchema,
  signedInSchema,
  signInSchema,
  signUpSchema,
  type SignedIn,
} from '../../shared/schemas/auth';
import { AppError } from '../errors';
import { authenticate, authOf, metaOf, REFRESH_COOKIE, type Auth } from '../middleware/auth';
import { limitTries } from '../middleware/rate-limit';
import { validate } from '../middleware/validate';
import type { ApiDocs } from '../openapi';
import { documentPath } from '../openapi-paths';
import {
  changePassword,
  confirmPasswordReset,
  describeMe,
  requestPasswordReset,
  signIn,
  signUp,
} from '../services/accounts';
import { recordAudit } from '../services/audit';
import type { ServiceDeps } from '../services/deps';
import {
  revokeAllSessions,
  revokeSession,
  rotateSession,
  type IssuedTokens,
} from '../services/sessions';
import { clearSessionCookies, setSessionCookies } from './session-cookies';

type Delivery = 'cookie' | 'body';

/** Signs the caller in: cookies for the web, tokens in the body for API clients. */
export async function respondSignedIn(
  res: Response,
  deps: ServiceDeps,
  tokens: IssuedTokens & { userId: string },
  delivery: Delivery,
  status = 200,
): Promise<void> {
  const me = await describeMe(deps, tokens.userId, tokens.sessionId);
  const body: SignedIn =
    delivery === 'body'
      ? { me, accessToken: tokens.accessToken, refreshToken: tokens.refreshToken }
      : { me };
  if (delivery === 'cookie') setSessionCookies(res, deps.config, tokens);
  res.status(status).json(body);
}

export function authRouter(deps: ServiceDeps): Router {
  const { config } = deps;
  const router = Router();
  const requireAuth = authenticate(config);

  router.post(
    '/auth/sign-up',
    limitTries(config, 'sign-up', 'ip'),
    validate({ body: signUpSchema }),
    async (req, res) => {
      const tokens = await signUp(deps, res.locals.body, metaOf(req));
      await respondSignedIn(res, deps, tokens, 'cookie', 201);
    },
  );

  router.post(
    '/auth/sign-in',
    limitTries(config, 'sign-in', 'ip'),
    limitTries(config, 'sign-in', 'email'),
    validate({ body: signInSchema }),
    async (req, res) => {
      const input = res.locals.body as z.infer<typeof signInSchema>;
      const tokens = await signIn(deps, input.email, input.password, metaOf(req));
      await respondSignedIn(res, deps, tokens, input.tokenDelivery);
    },
  );

  // The web app asks this on load: it renews an expired access cookie from the refresh cookie,
  // and answers "nobody" with a 200 rather than a 401.
  router.get('/auth/session', authenticate(config, { optional: true }), async (req, res) => {
    const auth = res.locals.auth as Auth | undefined;
    if (auth) {
      res.json({ me: await describeMe(deps, auth.user.id, auth.sessionId) });
      return;
    }
    const refresh = (req.cookies as Record<string, string | undefined>)[REFRESH_COOKIE];
    if (refresh) {
      try {
        const tokens = await rotateSession(config, refresh);
        setSessionCookies(res, config, tokens);
        res.json({ me: await describeMe(deps, tokens.userId, tokens.sessionId) });
        return;
      } catch (err) {
        if (!(err instanceof AppError && err.status === 401)) throw err;
        clearSessionCookies(res, config);
      }
    }
    res.json({ me: null });
  });

  router.post('/auth/refresh', validate({ body: refreshSchema }), async (req, res) => {
    const input = res.locals.body as z.infer<typeof refreshSchema>;
    const cookie = (req.cookies as Record<string, string | undefined>)[REFRESH_COOKIE];
    const token = input.refreshToken ?? cookie;
    if (!token) throw new AppError(401, 'unauthenticated', 'Please sign in.');
    const tokens = await rotateSession(config, token);
    await respondSignedIn(res, deps, tokens, input.refreshToken ? input.tokenDelivery : 'cookie');
  });

  router.post('/auth/sign-out', requireAuth, async (req, res) => {
    const { user, sessionId } = authOf(res);
    await revokeSession(sessionId);
    await recordAudit({ action: 'sign_out', actorId: user.id, ip: metaOf(req).ip });
    clearSessionCookies(res, config);
    res.status(204).end();
  });

  router.post('/auth/sign-out-everywhere', requireAuth, async (req, res) => {
    const { user } = authOf(res);
    const ended = await revokeAllSessions(user.id);
    await recordAudit({
      action: 'sign_out_everywhere',
      actorId: user.id,
      ip: metaOf(req).ip,
      detail: { sessionsEnded: ended },
    });
    clearSessionCookies(res, config);
    res.status(204).end();
  });

  router.post(
    '/auth/password',
    requireAuth,
    validate({ body: changePasswordSchema }),
    async (req, res) => {
      const { user, sessionId } = authOf(res);
      await changePassword(deps, user.id, sessionId, res.locals.body, metaOf(req));
      res.status(204).end();
    },
  );

  router.post(
    '/auth/password-reset/request',
    limitTries(config, 'reset', 'ip'),
    limitTries(config, 'reset', 'email'),
    validate({ body: resetRequestSchema }),
    async (req, res) => {
      await requestPasswordReset(deps, res.locals.body.email, metaOf(req));
      // The same answer whether or not the address has an account.
      res
        .status(202)
        .json({ message: 'If this address has an account, a reset link is on its way.' });
    },
  );

  router.post(
    '/auth/password-reset/confirm',
    limitTries(config, 'reset-confirm', 'ip'),
    validate({ body: resetConfirmSchema }),
    async (req, res) => {
      await confirmPasswordReset(deps, res.locals.body, metaOf(req));
      clearSessionCookies(res, config);
      res.status(204).end();
    },
  );

  return router;
}

export function registerAuthDocs(docs: ApiDocs): void {
  const anyone = 'anyone';
  const signedIn = 'any signed-in user';
  documentPath(docs, {
    method: 'post',
    path: '/api/auth/sign-up',
    summary: 'Create an account and its first lab (as manager)',
    access: anyone,
    body: signUpSchema,
    ok: { status: 201, schema: signedInSchema, description: 'Signed in (cookies set)' },
    errors: [400, 409, 429],
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/auth/sign-in',
    summary: 'Sign in with e-mail and password',
    access: anyone,
    body: signInSchema,
    ok: {
      status: 200,
      schema: signedInSchema,
      description: 'Signed in: cookies, or tokens in the body with tokenDelivery "body"',
    },
    errors: [400, 401, 429],
  });
  documentPath(docs, {
    method: 'get',
    path: '/api/auth/session',
    summary:
      'Who is signed in; renews the access cookie from the refresh cookie; me is null when nobody',
    access: anyone,
    ok: { status: 200, schema: sessionStateSchema, description: 'The session, or { me: null }' },
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/auth/refresh',
    summary: 'Swap a refresh token (cookie or body) for new tokens',
    access: anyone,
    body: refreshSchema,
    ok: {
      status: 200,
      schema: signedInSchema,
      description: 'New tokens; the old refresh token no longer works',
    },
    errors: [400, 401],
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/auth/sign-out',
    summary: 'End this session',
    access: signedIn,
    ok: { status: 204, description: 'Signed out' },
    errors: [401, 403],
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/auth/sign-out-everywhere',
    summary: 'End every session of this user',
    access: signedIn,
    ok: { status: 204, description: 'All sessions ended' },
    errors: [401, 403],
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/auth/password',
    summary: 'Change the password (other sessions end)',
    access: signedIn,
    body: changePasswordSchema,
    ok: { status: 204, description: 'Changed' },
    errors: [400, 401, 403],
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/auth/password-reset/request',
    summary: 'E-mail a single-use reset link (valid 30 minutes)',
    access: anyone,
    body: resetRequestSchema,
    ok: { status: 202, description: 'Same answer whether or not the address has an account' },
    errors: [400, 429],
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/auth/password-reset/confirm',
    summary: 'Set a new password with a reset token (all sessions end)',
    access: anyone,
    body: resetConfirmSchema,
    ok: { status: 204, description: 'Password set' },
    errors: [400, 429],
  });
}
