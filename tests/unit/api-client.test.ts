import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { z } from 'zod';
import { ApiError, apiRequest } from '../../components/api/client';
import { bannerMessage } from '../../components/api/error-messages';
import { isSignedOutAnswer } from '../../components/api/session';
import { sessionStateSchema } from '../../shared/schemas/auth';

type Reply = { status: number; body: string; type?: string };
let reply: Reply;
let lastBody = '';
let lastType = '';
const server = http.createServer((req, res) => {
  let data = '';
  req.on('data', (c) => (data += c));
  req.on('end', () => {
    lastBody = data;
    lastType = req.headers['content-type'] ?? '';
    res.writeHead(reply.status, { 'Content-Type': reply.type ?? 'application/json' });
    res.end(reply.body);
  });
});
let base = '';
beforeAll(async () => {
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(() => new Promise((resolve) => server.close(resolve)));

const thing = z.object({ id: z.number() });
const fail = (p: Promise<unknown>) =>
  p.then(
    () => {
      throw new Error('expected a rejection');
    },
    (e: unknown) => e as ApiError,
  );

describe('apiRequest', () => {
  it('returns the parsed body and sends JSON', async () => {
    reply = { status: 200, body: '{"id":7}' };
    await expect(
      apiRequest('/x', () => thing, { baseUrl: base, method: 'POST', body: { a: 1 } }),
    ).resolves.toEqual({ id: 7 });
    expect(lastBody).toBe('{"a":1}');
  });

  it('sends a raw body as it is, with its own content type', async () => {
    reply = { status: 200, body: '{"id":8}' };
    const text = 'held_at,recipe\n2025-11-03,"Drape, soak"\n';
    await apiRequest('/x', () => thing, {
      baseUrl: base,
      method: 'POST',
      rawBody: { contentType: 'text/csv', text },
    });
    expect([lastType, lastBody]).toEqual(['text/csv', text]);
  });

  it('keeps the request id of an unexpected failure and shows its start as a reference', async () => {
    reply = {
      status: 500,
      body: JSON.stringify({
        error: {
          code: 'internal',
          message: 'Something went wrong on our side. Please try again.',
          requestId: '6d0afa75-b977-4f1a-ad1f-928c0e156ddd',
        },
      }),
    };
    const err = await fail(apiRequest('/x', () => thing, { baseUrl: base }));
    expect(err.requestId).toBe('6d0afa75-b977-4f1a-ad1f-928c0e156ddd');
    expect(bannerMessage(err)).toMatch(/quote reference 6d0afa75\.$/);
  });

  it('turns an error body into an ApiError with its code, status and fields', async () => {
    reply = {
      status: 400,
      body: JSON.stringify({
        error: {
          code: 'invalid_request',
          message: 'Some fields are not valid.',
          fields: [{ path: 'name', message: 'Required' }],
        },
      }),
    };
    const err = await fail(apiRequest('/x', () => thing, { baseUrl: base }));
    expect(err).toBeInstanceOf(ApiError);
    expect(err).toMatchObject({
      status: 400,
      code: 'invalid_request',
      fields: [{ path: 'name', message: 'Required' }],
    });
  });

  it('gives code unexpected_response for a non-JSON error page', async () => {
    reply = { status: 502, body: '<html>Bad gateway</html>', type: 'text/html' };
    expect(await fail(apiRequest('/x', () => thing, { baseUrl: base }))).toMatchObject({
      status: 502,
      code: 'unexpected_response',
    });
  });

  it('gives code unexpected_response when a 2xx body does not match the schema', async () => {
    reply = { status: 200, body: '{"id":"seven"}' };
    expect(await fail(apiRequest('/x', () => thing, { baseUrl: base }))).toMatchObject({
      code: 'unexpected_response',
    });
  });

  it('accepts a listed non-2xx status whose body is an answer', async () => {
    reply = { status: 503, body: '{"id":1}' };
    await expect(
      apiRequest('/x', () => thing, { baseUrl: base, acceptStatuses: [503] }),
    ).resolves.toEqual({ id: 1 });
  });

  it('gives code network when the server cannot be reached', async () => {
    const err = await fail(apiRequest('/x', () => thing, { baseUrl: 'http://127.0.0.1:1' }));
    expect(err).toMatchObject({ status: 0, code: 'network' });
  });

  it('picks the schema out of the schema kit', async () => {
    reply = { status: 200, body: '{"status":"ok","db":"ok","version":"1"}' };
    await expect(apiRequest('/x', (k) => k.healthSchema, { baseUrl: base })).resolves.toEqual({
      status: 'ok',
      db: 'ok',
      version: '1',
    });
  });
});

describe('a signed-out session answer', () => {
  it('is returned as it is without picking a schema', async () => {
    reply = { status: 200, body: '{"me":null}' };
    const pick = jest.fn(() => sessionStateSchema);
    await expect(
      apiRequest('/x', pick, { baseUrl: base, plainAnswer: isSignedOutAnswer }),
    ).resolves.toEqual({ me: null });
    expect(pick).not.toHaveBeenCalled();
  });

  it('is exactly what the shared schema accepts unchanged', () => {
    expect(sessionStateSchema.parse({ me: null })).toEqual({ me: null });
    for (const other of [{ me: null, extra: 1 }, { me: undefined }, { me: {} }, [null], null, {}]) {
      expect([other, isSignedOutAnswer(other)]).toEqual([other, false]);
    }
  });

  it('leaves any other answer to the schema', async () => {
    reply = { status: 200, body: '{"me":{"id":"not a user"}}' };
    expect(
      await fail(
        apiRequest('/x', (k) => k.sessionStateSchema, {
          baseUrl: base,
          plainAnswer: isSignedOutAnswer,
        }),
      ),
    ).toMatchObject({ code: 'unexpected_response' });
  });
});
