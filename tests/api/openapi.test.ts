import request from 'supertest';
import { buildApp, type TestApp } from '../support/app';
import { freshDatabase, type TestDatabase } from '../support/db';

let db: TestDatabase;
let built: TestApp;
beforeAll(async () => {
  db = await freshDatabase();
  built = buildApp(db);
});
afterAll(async () => {
  await built.close();
  await db.drop();
});

describe('GET /api/openapi.json', () => {
  it('describes the API as OpenAPI 3.1 from the shared schemas', async () => {
    const res = await request(built.app).get('/api/openapi.json');
    expect(res.status).toBe(200);
    expect(res.body.openapi).toBe('3.1.0');
    expect(res.body.info.version).toBe(db.config.version);
    expect(Object.keys(res.body.paths)).toContain('/api/health');
    const health = res.body.paths['/api/health'].get.responses;
    expect(Object.keys(health).sort()).toEqual(['200', '503']);
    expect(health['200'].content['application/json'].schema).toEqual({
      $ref: '#/components/schemas/Health',
    });
    expect(res.body.components.schemas.Health.properties.db.enum).toEqual(['ok', 'down']);
    expect(res.body.components.schemas.Error.required).toEqual(['error']);
  });
});
