import { Router } from 'express';
import { meSchema, updateMeSchema, userSchema } from '../../shared/schemas/auth';
import { authenticate, authOf } from '../middleware/auth';
import { validate } from '../middleware/validate';
import type { ApiDocs } from '../openapi';
import { documentPath } from '../openapi-paths';
import { describeMe, updateMe } from '../services/accounts';
import type { ServiceDeps } from '../services/deps';

export function meRouter(deps: ServiceDeps): Router {
  const router = Router();
  const requireAuth = authenticate(deps.config);

  router.get('/me', requireAuth, async (_req, res) => {
    const { user, sessionId } = authOf(res);
    res.json(await describeMe(deps, user.id, sessionId));
  });

  router.patch('/me', requireAuth, validate({ body: updateMeSchema }), async (_req, res) => {
    res.json(await updateMe(authOf(res).user.id, res.locals.body));
  });

  return router;
}

export function registerMeDocs(docs: ApiDocs): void {
  documentPath(docs, {
    method: 'get',
    path: '/api/me',
    summary: 'The signed-in user, each lab with its role, and the CSRF token',
    access: 'any signed-in user',
    ok: { status: 200, schema: meSchema, description: 'Who you are' },
    errors: [401],
  });
  documentPath(docs, {
    method: 'patch',
    path: '/api/me',
    summary: 'Change your name or display units',
    access: 'any signed-in user',
    body: updateMeSchema,
    ok: { status: 200, schema: userSchema, description: 'Updated' },
    errors: [400, 401, 403],
  });
}
