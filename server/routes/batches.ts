import { Router } from 'express';
import {
  batchListSchema,
  batchParamsSchema,
  batchPlanRequestSchema,
  batchPlanSchema,
  batchQuerySchema,
  batchSchema,
  createBatchSchema,
  labSettingsSchema,
  specimenInputSchema,
  specimenParamsSchema,
  specimenSchema,
  updateBatchSchema,
  updateSpecimenSchema,
} from '../../shared/schemas/batch';
import { labParamsSchema } from '../../shared/schemas/lab';
import { authOf, labOf, requireLab } from '../middleware/auth';
import { validate } from '../middleware/validate';
import type { ApiDocs } from '../openapi';
import { documentPath } from '../openapi-paths';
import {
  addSpecimen,
  createBatch,
  getBatch,
  listBatches,
  planFromRequest,
  updateBatch,
  updateLabSettings,
  updateSpecimen,
} from '../services/batches';
import { getLab } from '../services/labs';

export function batchesRouter(): Router {
  const router = Router();

  router.post(
    '/labs/:labId/batch-plans',
    requireLab('read'),
    validate({ body: batchPlanRequestSchema }),
    async (_req, res) => {
      res.json(await planFromRequest(labOf(res).id, res.locals.body));
    },
  );

  router.get(
    '/labs/:labId/batches',
    requireLab('read'),
    validate({ query: batchQuerySchema }),
    async (_req, res) => {
      res.json({ batches: await listBatches(labOf(res).id, res.locals.query.status) });
    },
  );
  router.post(
    '/labs/:labId/batches',
    requireLab('edit'),
    validate({ body: createBatchSchema }),
    async (_req, res) => {
      const { batch, created } = await createBatch(
        labOf(res).id,
        authOf(res).user.id,
        res.locals.body,
      );
      res.status(created ? 201 : 200).json(batch);
    },
  );
  router.get(
    '/labs/:labId/batches/:batchId',
    requireLab('read'),
    validate({ params: batchParamsSchema }),
    async (_req, res) => {
      res.json(await getBatch(labOf(res).id, res.locals.params.batchId));
    },
  );
  router.patch(
    '/labs/:labId/batches/:batchId',
    requireLab('edit'),
    validate({ params: batchParamsSchema, body: updateBatchSchema }),
    async (_req, res) => {
      res.json(await updateBatch(labOf(res).id, res.locals.params.batchId, res.locals.body));
    },
  );
  router.post(
    '/labs/:labId/batches/:batchId/specimens',
    requireLab('edit'),
    validate({ params: batchParamsSchema, body: specimenInputSchema }),
    async (_req, res) => {
      const { specimen, created } = await addSpecimen(
        labOf(res).id,
        res.locals.params.batchId,
        res.locals.body,
      );
      res.status(created ? 201 : 200).json(specimen);
    },
  );
  router.patch(
    '/labs/:labId/batches/:batchId/specimens/:specimenId',
    requireLab('edit'),
    validate({ params: specimenParamsSchema, body: updateSpecimenSchema }),
    async (_req, res) => {
      const p = res.locals.params;
      res.json(await updateSpecimen(labOf(res).id, p.batchId, p.specimenId, res.locals.body));
    },
  );
  router.patch(
    '/labs/:labId/settings',
    requireLab('manage'),
    validate({ body: labSettingsSchema }),
    async (_req, res) => {
      const lab = labOf(res);
      await updateLabSettings(lab.id, res.locals.body);
      res.json(await getLab(lab.id, lab.role));
    },
  );
  return router;
}

export function registerBatchDocs(docs: ApiDocs): void {
  const member = 'any member of the lab';
  const editor = 'managers and technicians';
  documentPath(docs, {
    method: 'post',
    path: '/api/labs/{labId}/batch-plans',
    summary: 'Compute a batch plan (masses, solids, boron, saturation, warnings) without saving',
    access: member,
    params: labParamsSchema,
    body: batchPlanRequestSchema,
    ok: { status: 200, schema: batchPlanSchema, description: 'The plan' },
    errors: [400, 401, 404],
  });
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/batches',
    summary: 'Batches, newest first',
    access: member,
    params: labParamsSchema,
    query: batchQuerySchema,
    ok: { status: 200, schema: batchListSchema, description: 'Batches' },
    errors: [400, 401, 404],
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/labs/{labId}/batches',
    summary:
      'Record a prepared batch (idempotent by clientId: a retry answers 200 with the same batch)',
    access: editor,
    params: labParamsSchema,
    body: createBatchSchema,
    ok: { status: 201, schema: batchSchema, description: 'Recorded' },
    errors: [400, 401, 403, 404],
  });
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/batches/{batchId}',
    summary: 'A batch with its weigh-in, plan, timers and specimens',
    access: member,
    params: batchParamsSchema,
    ok: { status: 200, schema: batchSchema, description: 'The batch' },
    errors: [401, 404],
  });
  documentPath(docs, {
    method: 'patch',
    path: '/api/labs/{labId}/batches/{batchId}',
    summary:
      'Start the soak, change the status (prepared → in use → used up, or discarded with a reason), notes',
    access: editor,
    params: batchParamsSchema,
    body: updateBatchSchema,
    ok: { status: 200, schema: batchSchema, description: 'Updated' },
    errors: [400, 401, 403, 404, 409],
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/labs/{labId}/batches/{batchId}/specimens',
    summary: 'Log a treated specimen (idempotent by clientId)',
    access: editor,
    params: batchParamsSchema,
    body: specimenInputSchema,
    ok: { status: 201, schema: specimenSchema, description: 'Logged' },
    errors: [400, 401, 403, 404, 409],
  });
  documentPath(docs, {
    method: 'patch',
    path: '/api/labs/{labId}/batches/{batchId}/specimens/{specimenId}',
    summary: 'Add the wet or dried mass of a specimen',
    access: editor,
    params: specimenParamsSchema,
    body: updateSpecimenSchema,
    ok: { status: 200, schema: specimenSchema, description: 'Updated' },
    errors: [400, 401, 403, 404],
  });
  documentPath(docs, {
    method: 'patch',
    path: '/api/labs/{labId}/settings',
    summary: 'Lab settings (weighing tolerance)',
    access: 'managers of the lab',
    params: labParamsSchema,
    body: labSettingsSchema,
    ok: { status: 200, description: 'The lab' },
    errors: [400, 401, 403, 404],
  });
}
