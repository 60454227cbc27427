import { Router } from 'express';
import { z } from 'zod';
import { acceptInvitationSchema, signedInSchema, tokenSchema } from '../../shared/schemas/auth';
import { invitationPreviewSchema } from '../../shared/schemas/invitation';
import { authenticate, metaOf, type Auth } from '../middleware/auth';
import { limitTries } from '../middleware/rate-limit';
import { validate } from '../middleware/validate';
import type { ApiDocs } from '../openapi';
import { documentPath } from '../openapi-paths';
import type { ServiceDeps } from '../services/deps';
import { acceptInvitation, previewInvitation } from '../services/invitations';
import { respondSignedIn } from './auth';

const tokenParams = z.object({ token: tokenSchema });

export function invitationsRouter(deps: ServiceDeps): Router {
  const router = Router();

  router.get('/invitations/:token', validate({ params: tokenParams }), async (_req, res) => {
    res.json(await previewInvitation(res.locals.params.token));
  });

  router.post(
    '/invitations/:token/accept',
    limitTries(deps.config, 'accept', 'ip'),
    authenticate(deps.config, { optional: true }),
    validate({ params: tokenParams, body: acceptInvitationSchema }),
    async (req, res) => {
      const auth = res.locals.auth as Auth | undefined;
      const result = await acceptInvitation(
        deps,
        res.locals.params.token,
        res.locals.body,
        auth?.user.id,
        metaOf(req),
      );
      if (result.tokens) await respondSignedIn(res, deps, result.tokens, 'cookie', 201);
      else res.json({ labId: result.labId });
    },
  );

  return router;
}

export function registerInvitationDocs(docs: ApiDocs): void {
  documentPath(docs, {
    method: 'get',
    path: '/api/invitations/{token}',
    summary: 'What an invitation link offers',
    access: 'anyone with the link',
    params: tokenParams,
    ok: { status: 200, schema: invitationPreviewSchema, description: 'The invitation' },
    errors: [400],
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/invitations/{token}/accept',
    summary:
      'Accept: signed in as the invited address, join; new to Quenchbook, give a name and password',
    access: 'anyone with the link',
    params: tokenParams,
    body: acceptInvitationSchema,
    ok: {
      status: 201,
      schema: signedInSchema,
      description:
        'New account created and signed in (200 with { labId } when an existing account joins)',
    },
    errors: [400, 401, 403, 409, 429],
  });
}
