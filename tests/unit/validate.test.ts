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

// Found by the hostile-input tests: each of these used to be accepted (and stored) or a 500.
describe('validate: what a schema alone lets through', () => {
  it('answers 400 naming a field the schema does not know, such as isAdmin or __proto__', async () => {
    const res = await request(appWith([]))
      .post('/things')
      .set('Content-Type', 'application/json')
      .send('{"name":"Muslin","grams":2,"isAdmin":true,"__proto__":{"x":1}}');
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual([
      { path: 'isAdmin', message: 'Unknown field' },
      { path: '__proto__', message: 'Unknown field' },
    ]);
  });

  it('answers 400 for text with a NUL or half a surrogate pair, which cannot be saved as sent', async () => {
    for (const name of ['Mus\u0000lin', 'Mus\uD800lin', 'Mus\uDFFFlin']) {
      const res = await request(appWith([])).post('/things').send({ name, grams: 2 });
      expect(res.status).toBe(400);
      expect(res.body.error.fields.map((f: { path: string }) => f.path)).toEqual(['name']);
    }
    const emoji = await request(appWith([])).post('/things').send({ name: 'Muslin 🔥', grams: 2 });
    expect(emoji.status).toBe(200);
  });

  it('answers 415 for a typed body that is not JSON, rather than reading it as no fields', async () => {
    const res = await request(appWith([]))
      .post('/things')
      .field('name', 'Muslin')
      .field('grams', '2');
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('unsupported_media_type');
  });
});
