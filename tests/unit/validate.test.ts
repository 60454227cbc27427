import express from 'express';
import request from 'supertest';
import { z } from 'zod';
import { AppError } from '../../server/errors';
import { errorHandler } from '../../server/middleware/error';
import { validate } from '../../server/middleware/validate';

function appWith(logged: unknown[]) {
  const app = express();
  app.use(express.json());
  app.post(
    '/things',
    validate({
      body: z.object({ name: z.string().min(2), grams: z.number().positive() }),
      query: z.object({ dry: z.enum(['yes', 'no']).optional() }),
    }),
    (_req, res) => {
      res.json({ body: res.locals.body, query: res.locals.query });
    },
  );
  app.get('/conflict', () => {
    throw new AppError(409, 'invalid_request', 'Already signed off.');
  });
  app.get('/boom', () => {
    throw new Error('SELECT secret FROM users -- internal detail');
  });
  app.use(errorHandler((e) => logged.push(e)));
  return app;
}

describe('validate + errorHandler', () => {
  it('passes parsed input on and leaves Express 5 req.query alone', async () => {
    const res = await request(appWith([]))
      .post('/things?dry=yes')
      .send({ name: 'Muslin', grams: 12.5 });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ body: { name: 'Muslin', grams: 12.5 }, query: { dry: 'yes' } });
  });

  it('answers 400 invalid_request naming each bad field', async () => {
    const res = await request(appWith([])).post('/things').send({ name: 'M', grams: -1 });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_request');
    expect(res.body.error.fields.map((f: { path: string }) => f.path).sort()).toEqual([
      'grams',
      'name',
    ]);
  });

  it('answers an AppError with its own status and code', async () => {
    const res = await request(appWith([])).get('/conflict');
    expect(res.status).toBe(409);
    expect(res.body.error).toEqual({ code: 'invalid_request', message: 'Already signed off.' });
  });

  it('answers 500 without internals for an unexpected error, and logs it', async () => {
    const logged: unknown[] = [];
    const res = await request(appWith(logged)).get('/boom');
    expect(res.status).toBe(500);
    expect(res.body.error.code).toBe('internal');
    expect(JSON.stringify(res.body)).not.toMatch(/SELECT|secret|at /);
    expect(logged).toHaveLength(1);
  });
});
