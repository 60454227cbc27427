import express, { Router } from 'express';
import { labParamsSchema } from '../../shared/schemas/lab';
import {
  pairImportFileSchema,
  pairImportParamsSchema,
  pairImportPreviewSchema,
  pairImportQuerySchema,
  pairImportResultSchema,
} from '../../shared/schemas/pair-import';
import { AppError } from '../errors';
import { authOf, labOf, requireLab } from '../middleware/auth';
import { validate } from '../middleware/validate';
import type { ApiDocs } from '../openapi';
import { documentPath } from '../openapi-paths';
import { acceptImport, discardImport, previewImport } from '../services/pair-imports';

export const IMPORT_MAX_BYTES = 2 * 1024 * 1024;

const csvBody = express.text({ type: ['text/csv', 'text/plain'], limit: IMPORT_MAX_BYTES });

export function pairImportsRouter(): Router {
  const router = Router();
  const base = '/labs/:labId/pair-imports';
  router.post(
    `${base}/preview`,
    requireLab('edit'),
    csvBody,
    validate({ query: pairImportQuerySchema }),
    async (req, res) => {
      if (typeof req.body !== 'string') {
        // JSON or multipart reach this route (other routes read them) but are not a CSV file.
        if (req.headers['content-type'] && req.is(['text/csv', 'text/plain']) === false) {
          throw new AppError(
            415,
            'unsupported_media_type',
            'Send the file itself as the request body (Content-Type: text/csv).',
          );
        }
        throw new AppError(400, 'invalid_request', 'Send the file as the request body.', [
          { path: 'file', message: 'Send the CSV as the body, with Content-Type text/csv' },
        ]);
      }
      const { user } = authOf(res);
      res
        .status(201)
        .json(await previewImport(labOf(res).id, user.id, res.locals.query.fileName, req.body));
    },
  );
  router.post(
    `${base}/:importId/accept`,
    requireLab('edit'),
    validate({ params: pairImportParamsSchema }),
    async (_req, res) => {
      const { user } = authOf(res);
      res.json(await acceptImport(labOf(res).id, res.locals.params.importId, user));
    },
  );
  router.delete(
    `${base}/:importId`,
    requireLab('edit'),
    validate({ params: pairImportParamsSchema }),
    async (_req, res) => {
      await discardImport(labOf(res).id, res.locals.params.importId);
      res.status(204).end();
    },
  );
  return router;
}

export function registerPairImportDocs(docs: ApiDocs): void {
  const editor = 'managers and technicians';
  documentPath(docs, {
    method: 'post',
    path: '/api/labs/{labId}/pair-imports/preview',
    summary:
      'Check a pairs file (body: the CSV, Content-Type text/csv, at most 2 MB; the columns of pairs.csv) and keep its valid rows for 24 h. Writes no burn record.',
    access: editor,
    params: labParamsSchema,
    query: pairImportQuerySchema,
    csv: pairImportFileSchema,
    ok: {
      status: 201,
      schema: pairImportPreviewSchema,
      description: 'Every row with its line, errors by column, and values',
    },
    errors: [400, 401, 403, 404, 413, 415],
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/labs/{labId}/pair-imports/{importId}/accept',
    summary:
      'Write the valid rows in one transaction as an imported session of submitted pairs (idempotent: a second accept answers the same)',
    access: editor,
    params: pairImportParamsSchema,
    ok: { status: 200, schema: pairImportResultSchema, description: 'Imported' },
    errors: [401, 403, 404, 409],
  });
  documentPath(docs, {
    method: 'delete',
    path: '/api/labs/{labId}/pair-imports/{importId}',
    summary: 'Discard a previewed file (idempotent)',
    access: editor,
    params: pairImportParamsSchema,
    ok: { status: 204, description: 'Discarded' },
    errors: [401, 403, 404, 409],
  });
}
