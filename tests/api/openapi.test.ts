import request from 'supertest';
import { withTestApp } from '../support/app';

const built = withTestApp();

describe('GET /api/openapi.json', () => {
  it('describes the API as OpenAPI 3.1 from the shared schemas', async () => {
    const res = await request(built.app).get('/api/openapi.json');
    expect(res.status).toBe(200);
    expect(res.body.openapi).toBe('3.1.0');
    expect(res.body.info.version).toBe(built.db.config.version);
    expect(Object.keys(res.body.paths)).toContain('/api/health');
    const health = res.body.paths['/api/health'].get.responses;
    expect(Object.keys(health).sort()).toEqual(['200', '503']);
    expect(health['200'].content['application/json'].schema).toEqual({
      $ref: '#/components/schemas/Health',
    });
    expect(res.body.components.schemas.Health.properties.db.enum).toEqual(['ok', 'down']);
    expect(res.body.components.schemas.Error.required).toEqual(['error']);
  });

  it('documents every route with its method', async () => {
    const res = await request(built.app).get('/api/openapi.json');
    const documented = Object.entries(res.body.paths as Record<string, object>).flatMap(
      ([path, ops]) => Object.keys(ops).map((method) => `${method.toUpperCase()} ${path}`),
    );
    expect(documented.sort()).toEqual(
      [
        'GET /api/health',
        'POST /api/auth/sign-up',
        'POST /api/auth/sign-in',
        'GET /api/auth/session',
        'POST /api/auth/refresh',
        'POST /api/auth/sign-out',
        'POST /api/auth/sign-out-everywhere',
        'POST /api/auth/password',
        'POST /api/auth/password-reset/request',
        'POST /api/auth/password-reset/confirm',
        'GET /api/me',
        'PATCH /api/me',
        'GET /api/invitations/{token}',
        'POST /api/invitations/{token}/accept',
        'POST /api/labs',
        'GET /api/labs/{labId}',
        'GET /api/labs/{labId}/members',
        'PATCH /api/labs/{labId}/members/{userId}',
        'DELETE /api/labs/{labId}/members/{userId}',
        'GET /api/labs/{labId}/invitations',
        'POST /api/labs/{labId}/invitations',
        'DELETE /api/labs/{labId}/invitations/{invitationId}',
        'GET /api/labs/{labId}/audit',
        'GET /api/labs/{labId}/chemicals',
        'GET /api/labs/{labId}/chemicals/{chemicalId}',
        'POST /api/labs/{labId}/chemicals',
        'GET /api/labs/{labId}/recipes',
        'POST /api/labs/{labId}/recipes',
        'GET /api/labs/{labId}/recipes/{recipeId}',
        'PUT /api/labs/{labId}/recipes/{recipeId}',
        'GET /api/labs/{labId}/recipes/{recipeId}/revisions',
        'POST /api/labs/{labId}/batch-plans',
        'GET /api/labs/{labId}/batches',
        'POST /api/labs/{labId}/batches',
        'GET /api/labs/{labId}/batches/{batchId}',
        'PATCH /api/labs/{labId}/batches/{batchId}',
        'POST /api/labs/{labId}/batches/{batchId}/specimens',
        'PATCH /api/labs/{labId}/batches/{batchId}/specimens/{specimenId}',
        'PATCH /api/labs/{labId}/settings',
        'GET /api/labs/{labId}/burn-sessions',
        'POST /api/labs/{labId}/burn-sessions',
        'GET /api/labs/{labId}/burn-sessions/{sessionId}',
        'PATCH /api/labs/{labId}/burn-sessions/{sessionId}',
        'POST /api/labs/{labId}/burn-sessions/{sessionId}/pairs',
        'GET /api/labs/{labId}/specimens/unburned',
        'GET /api/labs/{labId}/review-queue',
        'GET /api/labs/{labId}/pairs/{pairId}',
        'POST /api/labs/{labId}/pairs/{pairId}/marks',
        'PUT /api/labs/{labId}/pairs/{pairId}/measurements/{specimenId}',
        'POST /api/labs/{labId}/pairs/{pairId}/submit',
        'POST /api/labs/{labId}/pairs/{pairId}/sign-off',
        'POST /api/labs/{labId}/pairs/{pairId}/return',
        'POST /api/labs/{labId}/pairs/{pairId}/corrections',
        'POST /api/labs/{labId}/pairs/{pairId}/photos',
        'GET /api/labs/{labId}/photos/{photoId}',
        'GET /api/labs/{labId}/photos/{photoId}/thumbnail',
        'GET /api/labs/{labId}/rankings',
        'GET /api/labs/{labId}/rankings.csv',
        'GET /api/labs/{labId}/rankings/treatments/{key}',
        'GET /api/labs/{labId}/pairs.csv',
        'GET /api/labs/{labId}/criteria-presets',
        'GET /api/labs/{labId}/criteria-profiles',
        'POST /api/labs/{labId}/criteria-profiles',
        'POST /api/labs/{labId}/criteria-profiles/copy-preset',
        'PUT /api/labs/{labId}/criteria-profiles/{profileId}',
        'DELETE /api/labs/{labId}/criteria-profiles/{profileId}',
        'POST /api/labs/{labId}/pair-imports/preview',
        'POST /api/labs/{labId}/pair-imports/{importId}/accept',
        'DELETE /api/labs/{labId}/pair-imports/{importId}',
      ].sort(),
    );
  });
});
