import { Router } from 'express';
import {
  copyPresetSchema,
  criteriaProfileInputSchema,
  criteriaProfileListSchema,
  criteriaProfileOutputSchema,
  profileParamsSchema,
} from '../../shared/schemas/criteria';
import { labParamsSchema } from '../../shared/schemas/lab';
import { labOf, requireLab } from '../middleware/auth';
import { validate } from '../middleware/validate';
import type { ApiDocs } from '../openapi';
import { documentPath } from '../openapi-paths';
import {
  copyPreset,
  createProfile,
  deleteProfile,
  listProfiles,
  updateProfile,
} from '../services/criteria-profiles';

export function criteriaProfilesRouter(): Router {
  const router = Router();
  const base = '/labs/:labId/criteria-profiles';
  router.get(base, requireLab('read'), async (_req, res) => {
    res.json({ profiles: await listProfiles(labOf(res).id) });
  });
  router.post(
    base,
    requireLab('manage'),
    validate({ body: criteriaProfileInputSchema }),
    async (_req, res) => {
      res.status(201).json(await createProfile(labOf(res).id, res.locals.body));
    },
  );
  router.post(
    `${base}/copy-preset`,
    requireLab('manage'),
    validate({ body: copyPresetSchema }),
    async (_req, res) => {
      res.status(201).json(await copyPreset(labOf(res).id, res.locals.body.presetKey));
    },
  );
  router.put(
    `${base}/:profileId`,
    requireLab('manage'),
    validate({ params: profileParamsSchema, body: criteriaProfileInputSchema }),
    async (_req, res) => {
      res.json(await updateProfile(labOf(res).id, res.locals.params.profileId, res.locals.body));
    },
  );
  router.delete(
    `${base}/:profileId`,
    requireLab('manage'),
    validate({ params: profileParamsSchema }),
    async (_req, res) => {
      await deleteProfile(labOf(res).id, res.locals.params.profileId);
      res.status(204).end();
    },
  );
  return router;
}

export function registerCriteriaDocs(docs: ApiDocs): void {
  const manager = 'managers of the lab';
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/criteria-profiles',
    summary: "The lab's criteria profiles",
    access: 'any member of the lab',
    params: labParamsSchema,
    ok: { status: 200, schema: criteriaProfileListSchema, description: 'Profiles' },
    errors: [401, 404],
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/labs/{labId}/criteria-profiles',
    summary: 'Write a criteria profile',
    access: manager,
    params: labParamsSchema,
    body: criteriaProfileInputSchema,
    ok: { status: 201, schema: criteriaProfileOutputSchema, description: 'Created' },
    errors: [400, 401, 403, 404, 409],
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/labs/{labId}/criteria-profiles/copy-preset',
    summary: 'Copy a preset into the lab, to edit it there',
    access: manager,
    params: labParamsSchema,
    body: copyPresetSchema,
    ok: { status: 201, schema: criteriaProfileOutputSchema, description: 'Copied' },
    errors: [400, 401, 403, 404],
  });
  documentPath(docs, {
    method: 'put',
    path: '/api/labs/{labId}/criteria-profiles/{profileId}',
    summary: 'Edit a criteria profile',
    access: manager,
    params: profileParamsSchema,
    body: criteriaProfileInputSchema,
    ok: { status: 200, schema: criteriaProfileOutputSchema, description: 'Saved' },
    errors: [400, 401, 403, 404, 409],
  });
  documentPath(docs, {
    method: 'delete',
    path: '/api/labs/{labId}/criteria-profiles/{profileId}',
    summary: 'Delete a criteria profile',
    access: manager,
    params: profileParamsSchema,
    ok: { status: 204, description: 'Deleted' },
    errors: [401, 403, 404],
  });
}
