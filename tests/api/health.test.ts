import request from 'supertest';
import { createApp } from '../../server/app';
import { createSequelize } from '../../server/db';
import { withTestApp } from '../support/app';
import { healthSchema } from '../../shared/schemas/health';

const built = withTestApp();

describe('GET /api/health', () => {
  it('answers 200 with the database ok and the package version', async () => {
    const res = await request(built.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/application\/json/);
    expect(healthSchema.parse(res.body)).toEqual({
      status: 'ok',
      db: 'ok',
      version: built.db.config.version,
    });
  });

  it('answers 503 with db down when PostgreSQL does not answer', async () => {
    // A real connection attempt to a loopback port where no server listens: what the app sees
    // when its database is stopped.
    const down = createSequelize('postgres://quenchbook:x@127.0.0.1:1/none');
    try {
      const res = await request(createApp({ ...built.deps, sequelize: down })).get('/api/health');
      expect(res.status).toBe(503);
      expect(res.body).toEqual({
        status: 'degraded',
        db: 'down',
        version: built.db.config.version,
      });
    } finally {
      await down.close();
    }
  });
});
