import { pipeline } from 'node:stream/promises';
import { Router } from 'express';
import { z } from 'zod';
import {
  correctionSchema,
  createPairSchema,
  createSessionSchema,
  measurementInputSchema,
  measurementParamsSchema,
  pairParamsSchema,
  pairSchema,
  photoFieldsSchema,
  photoParamsSchema,
  postMarksSchema,
  returnSchema,
  reviewQueueSchema,
  sessionListSchema,
  sessionParamsSchema,
  sessionSchema,
  unburnedSchema,
  updateSessionSchema,
} from '../../shared/schemas/burn';
import { labParamsSchema } from '../../shared/schemas/lab';
import { authOf, labOf, requireLab } from '../middleware/auth';
import { validate } from '../middleware/validate';
import type { ApiDocs } from '../openapi';
import { documentPath } from '../openapi-paths';
import type { PhotoStore } from '../photos/store';
import { photoUpload } from '../photos/upload';
import {
  addMarks,
  correctMeasurement,
  createPair,
  createSession,
  getPair,
  getSession,
  listSessions,
  putMeasurement,
  returnPair,
  reviewQueue,
  signOffPair,
  submitPair,
  unburnedSpecimens,
  updateSession,
} from '../services/burn-tests';
import { addPhoto, readPhoto } from '../services/photos';

export const PHOTO_MAX_BYTES = 15 * 1024 * 1024;

const photoRead = z.object({ labId: z.uuid(), photoId: z.uuid('Unknown photo') });

export function burnTestsRouter(store: PhotoStore): Router {
  const router = Router();
  const base = '/labs/:labId';

  router.get(`${base}/burn-sessions`, requireLab('read'), async (_req, res) => {
    res.json({ sessions: await listSessions(labOf(res).id) });
  });
  router.post(
    `${base}/burn-sessions`,
    requireLab('edit'),
    validate({ body: createSessionSchema }),
    async (_req, res) => {
      const { session, created } = await createSession(
        labOf(res).id,
        authOf(res).user.id,
        res.locals.body,
      );
      res.status(created ? 201 : 200).json(session);
    },
  );
  router.get(
    `${base}/burn-sessions/:sessionId`,
    requireLab('read'),
    validate({ params: sessionParamsSchema }),
    async (_req, res) => {
      res.json(await getSession(labOf(res).id, res.locals.params.sessionId));
    },
  );
  router.patch(
    `${base}/burn-sessions/:sessionId`,
    requireLab('edit'),
    validate({ params: sessionParamsSchema, body: updateSessionSchema }),
    async (_req, res) => {
      res.json(
        await updateSession(
          labOf(res).id,
          res.locals.params.sessionId,
          authOf(res).user.id,
          res.locals.body,
        ),
      );
    },
  );
  router.post(
    `${base}/burn-sessions/:sessionId/pairs`,
    requireLab('edit'),
    validate({ params: sessionParamsSchema, body: createPairSchema }),
    async (_req, res) => {
      const { pair, created } = await createPair(
        labOf(res).id,
        res.locals.params.sessionId,
        res.locals.body,
      );
      res.status(created ? 201 : 200).json(pair);
    },
  );
  router.get(`${base}/specimens/unburned`, requireLab('read'), async (_req, res) => {
    res.json({ specimens: await unburnedSpecimens(labOf(res).id) });
  });
  router.get(`${base}/review-queue`, requireLab('read'), async (_req, res) => {
    res.json({ pairs: await reviewQueue(labOf(res).id) });
  });
  router.get(
    `${base}/pairs/:pairId`,
    requireLab('read'),
    validate({ params: pairParamsSchema }),
    async (_req, res) => {
      res.json(await getPair(labOf(res).id, res.locals.params.pairId));
    },
  );
  router.post(
    `${base}/pairs/:pairId/marks`,
    requireLab('edit'),
    validate({ params: pairParamsSchema, body: postMarksSchema }),
    async (_req, res) => {
      res.json(
        await addMarks(
          labOf(res).id,
          res.locals.params.pairId,
          authOf(res).user.id,
          res.locals.body,
        ),
      );
    },
  );
  router.put(
    `${base}/pairs/:pairId/measurements/:specimenId`,
    requireLab('edit'),
    validate({ params: measurementParamsSchema, body: measurementInputSchema }),
    async (_req, res) => {
      const p = res.locals.params;
      res.json(await putMeasurement(labOf(res).id, p.pairId, p.specimenId, res.locals.body));
    },
  );
  router.post(
    `${base}/pairs/:pairId/submit`,
    requireLab('edit'),
    validate({ params: pairParamsSchema }),
    async (_req, res) => {
      res.json(await submitPair(labOf(res).id, res.locals.params.pairId, authOf(res).user.id));
    },
  );
  router.post(
    `${base}/pairs/:pairId/sign-off`,
    requireLab('review'),
    validate({ params: pairParamsSchema }),
    async (_req, res) => {
      res.json(await signOffPair(labOf(res).id, res.locals.params.pairId, authOf(res).user.id));
    },
  );
  router.post(
    `${base}/pairs/:pairId/return`,
    requireLab('review'),
    validate({ params: pairParamsSchema, body: returnSchema }),
    async (_req, res) => {
      res.json(
        await returnPair(
          labOf(res).id,
          res.locals.params.pairId,
          authOf(res).user.id,
          res.locals.body.comment,
        ),
      );
    },
  );
  router.post(
    `${base}/pairs/:pairId/corrections`,
    requireLab('review'),
    validate({ params: pairParamsSchema, body: correctionSchema }),
    async (_req, res) => {
      res.json(
        await correctMeasurement(
          labOf(res).id,
          res.locals.params.pairId,
          authOf(res).user.id,
          res.locals.body,
        ),
      );
    },
  );
  router.post(
    `${base}/pairs/:pairId/photos`,
    requireLab('edit'),
    validate({ params: pairParamsSchema }),
    photoUpload(PHOTO_MAX_BYTES),
    validate({ form: photoFieldsSchema }),
    async (req, res) => {
      const { photo, created } = await addPhoto(
        store,
        labOf(res).id,
        res.locals.params.pairId,
        authOf(res).user.id,
        res.locals.body,
        req.file!.buffer,
      );
      res.status(created ? 201 : 200).json(photo);
    },
  );
  for (const [suffix, thumb] of [
    ['', false],
    ['/thumbnail', true],
  ] as const) {
    router.get(
      `${base}/photos/:photoId${suffix}`,
      requireLab('read'),
      validate({ params: photoRead }),
      async (_req, res) => {
        const photo = await readPhoto(store, labOf(res).id, res.locals.params.photoId, thumb);
        res.setHeader('Cache-Control', 'private, max-age=86400');
        res.type('image/jpeg');
        if (photo.size) res.setHeader('Content-Length', String(photo.size));
        try {
          await pipeline(photo.body, res);
        } catch (err) {
          // The viewer went away mid-photo: nothing to answer and nothing to log.
          if ((err as NodeJS.ErrnoException).code !== 'ERR_STREAM_PREMATURE_CLOSE') throw err;
        }
      },
    );
  }
  return router;
}

export function registerBurnDocs(docs: ApiDocs): void {
  const member = 'any member of the lab';
  const editor = 'managers and technicians';
  const reviewer = 'managers and reviewers';
  const e = [400, 401, 403, 404, 409];
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/burn-sessions',
    summary: 'Burn sessions, newest first',
    access: member,
    params: labParamsSchema,
    ok: { status: 200, schema: sessionListSchema, description: 'Sessions' },
    errors: [401, 404],
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/labs/{labId}/burn-sessions',
    summary: 'Open a burn session (idempotent by clientId)',
    access: editor,
    params: labParamsSchema,
    body: createSessionSchema,
    ok: { status: 201, schema: sessionSchema, description: 'Opened' },
    errors: e,
  });
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/burn-sessions/{sessionId}',
    summary: 'A session with its pairs',
    access: member,
    params: sessionParamsSchema,
    ok: { status: 200, schema: sessionSchema, description: 'The session' },
    errors: [401, 404],
  });
  documentPath(docs, {
    method: 'patch',
    path: '/api/labs/{labId}/burn-sessions/{sessionId}',
    summary: 'Tick the safety checklist, notes',
    access: editor,
    params: sessionParamsSchema,
    body: updateSessionSchema,
    ok: { status: 200, schema: sessionSchema, description: 'Updated' },
    errors: e,
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/labs/{labId}/burn-sessions/{sessionId}/pairs',
    summary: 'Add a pair: a treated specimen and its untreated control (idempotent by clientId)',
    access: editor,
    params: sessionParamsSchema,
    body: createPairSchema,
    ok: { status: 201, schema: pairSchema, description: 'Added' },
    errors: e,
  });
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/specimens/unburned',
    summary: 'Treated specimens not yet in a pair',
    access: member,
    params: labParamsSchema,
    ok: { status: 200, schema: unburnedSchema, description: 'Specimens' },
    errors: [401, 404],
  });
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/review-queue',
    summary: 'Burn tests waiting for review',
    access: member,
    params: labParamsSchema,
    ok: { status: 200, schema: reviewQueueSchema, description: 'Waiting' },
    errors: [401, 404],
  });
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/pairs/{pairId}',
    summary: 'A burn test: lanes with marks and derived times, measurements, photos, history',
    access: member,
    params: pairParamsSchema,
    ok: { status: 200, schema: pairSchema, description: 'The test' },
    errors: [401, 404],
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/labs/{labId}/pairs/{pairId}/marks',
    summary: "Store timer marks (each id is the client's: a resend is stored once)",
    access: editor,
    params: pairParamsSchema,
    body: postMarksSchema,
    ok: { status: 200, schema: pairSchema, description: 'Stored' },
    errors: e,
  });
  documentPath(docs, {
    method: 'put',
    path: '/api/labs/{labId}/pairs/{pairId}/measurements/{specimenId}',
    summary: 'Char length, masses, drips and notes of one specimen (idempotent)',
    access: editor,
    params: measurementParamsSchema,
    body: measurementInputSchema,
    ok: { status: 200, schema: pairSchema, description: 'Saved' },
    errors: e,
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/labs/{labId}/pairs/{pairId}/submit',
    summary: 'Submit for review',
    access: editor,
    params: pairParamsSchema,
    ok: { status: 200, schema: pairSchema, description: 'Submitted' },
    errors: e,
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/labs/{labId}/pairs/{pairId}/sign-off',
    summary: 'Sign off (the record is then locked)',
    access: reviewer,
    params: pairParamsSchema,
    ok: { status: 200, schema: pairSchema, description: 'Signed off' },
    errors: e,
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/labs/{labId}/pairs/{pairId}/return',
    summary: 'Return with a comment',
    access: reviewer,
    params: pairParamsSchema,
    body: returnSchema,
    ok: { status: 200, schema: pairSchema, description: 'Returned' },
    errors: e,
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/labs/{labId}/pairs/{pairId}/corrections',
    summary:
      'Correct a signed-off measurement with a reason (kept in the history with old and new values)',
    access: reviewer,
    params: pairParamsSchema,
    body: correctionSchema,
    ok: { status: 200, schema: pairSchema, description: 'Corrected' },
    errors: e,
  });
  documentPath(docs, {
    method: 'post',
    path: '/api/labs/{labId}/pairs/{pairId}/photos',
    summary:
      'Upload a photo (multipart: photo, clientId, specimenId, stage); images only, checked by content, EXIF removed',
    access: editor,
    params: pairParamsSchema,
    multipart: photoFieldsSchema.extend({
      photo: z.string().meta({ format: 'binary', description: 'The image file' }),
    }),
    ok: { status: 201, description: 'Stored' },
    errors: [...e, 413],
  });
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/photos/{photoId}',
    summary: 'A photo (JPEG)',
    access: member,
    params: photoParamsSchema,
    ok: { status: 200, description: 'image/jpeg' },
    errors: [401, 404],
  });
  documentPath(docs, {
    method: 'get',
    path: '/api/labs/{labId}/photos/{photoId}/thumbnail',
    summary: "A photo's thumbnail (JPEG)",
    access: member,
    params: photoParamsSchema,
    ok: { status: 200, description: 'image/jpeg' },
    errors: [401, 404],
  });
}
