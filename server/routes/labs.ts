import { Router } from 'express';
import { auditPageSchema, auditQuerySchema } from '../../shared/schemas/audit';
import {
  createInvitationSchema,
  invitationListSchema,
  invitationParamsSchema,
  invitationSchema,
} from '../../shared/schemas/invitation';
import {
  createLabSchema,
  labParamsSchema,
  labSchema,
  memberListSchema,
  memberParamsSchema,
  memberSchema,
  updateMemberSchema,
} from '../../shared/schemas/lab';
import { authOf, labOf, metaOf, requireLab } from '../middleware/auth';
import { limitTries } from '../middleware/rate-limit';
import { validate } from '../middleware/validate';
import type { ApiDocs } from '../openapi';
import { documentPath } from '../openapi-paths';
import { listLabAudit } from '../services/audit';
import type { ServiceDeps } from '../services/deps';
import { createInvitation, listInvitations, revokeInvitation } from '../services/invitations';
import { createLab, getLab } from '../services/labs';
import { changeRole, listMembers, removeMember } from '../services/members';

export function labsRouter(deps: ServiceDeps): Router {
  const router = Router();
  const actor = (req: Parameters<typeof metaOf>[0], res: Parameters<typeof authOf>[0]) => ({
    id: authOf(res).user.id,
    ip: metaOf(req).ip,
  });

  router.post('/labs', validate({ body: createLabSchema }), async (req, res) => {
    res.status(201).json(
      await createLab({
        name: res.locals.body.name,
        creatorId: authOf(res).user.id,
        ip: metaOf(req).ip,
      }),
    );
  });

  router.get('/labs/:labId', requireLab('read'), async (_req, res) => {
    const lab = labOf(res);
    res.json(await getLab(lab.id, lab.role));
  });

  router.get('/labs/:labId/members', requireLab('read'), async (_req, res) => {
    res.json({ members: await listMembers(labOf(res).id) });
  });

  router.patch(
    '/labs/:labId/members/:userId',
    requireLab('manage'),
    validate({ params: memberParamsSchema, body: updateMemberSchema }),
    async (req, res) => {
      res.json(
        await changeRole(
          labOf(res).id,
          res.locals.params.userId,
          res.locals.body.role,
          actor(req, res),
        ),
      );
    },
  );

  router.delete(
    '/labs/:labId/members/:userId',
    requireLab('manage'),
    validate({ params: memberParamsSchema }),
    async (req, res) => {
      await removeMember(labOf(res).id, res.locals.params.userId, actor(req, res));
      res.status(204).end();
    },
  );

  router.get('/labs/:labId/invitations', requireLab('manage'), async (_req, res) => {
    res.json({ invitations: await listInvitations(labOf(res).id) });
  });

  router.post(
    '/labs/:labId/invitations',
    requireLab('manage'),
    limitTries(deps.config, 'invite', 'ip'),
    validate({ body: createInvitationSchema }),
    async (req, res) => {
      res
        .status(201)
        .json(await createInvitation(deps, labOf(res).id, res.locals.body, actor(req, res)));
    },
  );

  router.delete(
    '/labs/:labId/invitations/:invitationId',
    requireLab('manage'),
    validate({ params: invitationParamsSchema }),
    async (req, res) => {
      await revokeInvitation(labOf(res).id, res.locals.params.invitationId, actor(req, res));
      res.status(204).end();
    },
  );

  router.get(
    '/labs/:labId/audit',
    requireLab('manage'),
    validate({ query: auditQuerySchema }),
    async (_req, res) => {
      const { page, pageSize } = res.locals.query as { page: number; pageSize: number };
      res.json(await listLabAudit(labOf(res).id, page, pageSize));
    },
  );

  return router;
}

export function registerLabDocs(docs: ApiDocs): void {
  const member = 'any member of the lab';
  const manager = 'managers of the lab';
  documentPath(docs, {
    method: 'post',
    path: '/api/labs',
    summary: 'Create another lab (you become its manager)',
    access: 'any signed-in user',
    body: createLabSchema,
    ok: { status: 201, schema: labSchema, description: 'Created' },
    errors: [400, 401, 403],
  });
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}',
    summary: 'A lab and your role in it',
    access: member,
    params: labParamsSchema,
    ok: { status: 200, schema: labSchema, description: 'The lab' },
    errors: [401, 404],
  });
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/members',
    summary: 'Members and their roles',
    access: member,
    params: labParamsSchema,
    ok: { status: 200, schema: memberListSchema, description: 'Members' },
    errors: [401, 404],
  });
  documentPath(docs, {
    method: 'patch',
    path: '/api/labs/{labId}/members/{userId}',
    summary: "Change a member's role (a lab keeps at least one manager)",
    access: manager,
    params: memberParamsSchema,
    body: updateMemberSchema,
    ok: { status: 200, schema: memberSchema, description: 'Changed' },
    errors: [400, 401, 403, 404, 409],
  });
  documentPath(docs, {
    method: 'delete',
    path: '/api/labs/{labId}/members/{userId}',
    summary: 'Remove a member (their access ends at once)',
    access: manager,
    params: memberParamsSchema,
    ok: { status: 204, description: 'Removed' },
    errors: [401, 403, 404, 409],
  });
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/invitations',
    summary: 'Invitations sent from this lab',
    access: manager,
    params: labParamsSchema,
    ok: { status: 200, schema: invitationListSchema, description: 'Invitations' },
    errors: [401, 403, 404],
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/labs/{labId}/invitations',
    summary: 'Invite someone by e-mail with a role (link works once, 7 days)',
    access: manager,
    params: labParamsSchema,
    body: createInvitationSchema,
    ok: { status: 201, schema: invitationSchema, description: 'Sent' },
    errors: [400, 401, 403, 404, 409, 429],
  });
  documentPath(docs, {
    method: 'delete',
    path: '/api/labs/{labId}/invitations/{invitationId}',
    summary: 'Withdraw an open invitation',
    access: manager,
    params: invitationParamsSchema,
    ok: { status: 204, description: 'Withdrawn' },
    errors: [401, 403, 404],
  });
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/audit',
    summary: "The lab's audit log, newest first, paged",
    access: manager,
    params: labParamsSchema,
    query: auditQuerySchema,
    ok: { status: 200, schema: auditPageSchema, description: 'One page' },
    errors: [400, 401, 403, 404],
  });
}
