import { Router } from 'express';
import { rankingQuerySchema } from '../../shared/schemas/ranking';
import { treatmentDetailSchema, treatmentParamsSchema } from '../../shared/schemas/treatment';
import { labOf, requireLab } from '../middleware/auth';
import { validate } from '../middleware/validate';
import type { ApiDocs } from '../openapi';
import { documentPath } from '../openapi-paths';
import { treatmentDetail } from '../services/treatment-detail';

export function treatmentsRouter(): Router {
  const router = Router();
  router.get(
    '/labs/:labId/rankings/treatments/:key',
    requireLab('read'),
    validate({ params: treatmentParamsSchema, query: rankingQuerySchema }),
    async (_req, res) => {
      const { key } = res.locals.params as { key: string };
      res.json(await treatmentDetail(labOf(res).id, key, res.locals.query));
    },
  );
  return router;
}

export function registerTreatmentDocs(docs: ApiDocs): void {
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/rankings/treatments/{key}',
    summary:
      'One treatment of the ranking (key: revision id|substrate, URL-encoded) with its statistics and its pairs, under the same filters',
    access: 'any member of the lab',
    params: treatmentParamsSchema,
    query: rankingQuerySchema,
    ok: { status: 200, schema: treatmentDetailSchema, description: 'The treatment and its pairs' },
    errors: [400, 401, 404],
  });
}
