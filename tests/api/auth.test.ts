import jwt from 'jsonwebtoken';
import request from 'supertest';
import { meSchema, signedInSchema } from '../../shared/schemas/auth';
import { AuditEventModel, SessionModel } from '../../server/models';
import { bearer, PASSWORD, signInForToken, signUpPerson, uniqueEmail } from '../support/accounts';
import { buildApp, withTestApp } from '../support/app';

const t = withTestApp();

function cookiesOf(res: request.Response): string[] {
  const raw = res.headers['set-cookie'] as unknown as string[] | string | undefined;
  return Array.isArray(raw) ? raw : raw ? [raw] : [];
}

describe('POST /api/auth/sign-up', () => {
  it('creates the account and a lab with its creator as manager, signed in by httpOnly cookies', async () => {
    const email = uniqueEmail();
    const agent = request.agent(t.app);
    const res = await agent.post('/api/auth/sign-up').send({
      email: `  ${email.toUpperCase()} `,
      password: PASSWORD,
      displayName: 'Ada',
      labName: 'Paper lab',
    });
    expect(res.status).toBe(201);
    const body = signedInSchema.parse(res.body);
    expect(body.accessToken).toBeUndefined();
    expect(body.me.user.email).toBe(email);
    expect(body.me.labs).toEqual([{ id: expect.any(String), name: 'Paper lab', role: 'manager' }]);
    const cookies = cookiesOf(res);
    const access = cookies.find((c) => c.startsWith('qb_access='));
    const refresh = cookies.find((c) => c.startsWith('qb_refresh='));
    expect(access).toMatch(/HttpOnly/);
    expect(access).toMatch(/SameSite=Lax/);
    expect(access).toMatch(/Path=\/api/);
    expect(access).not.toMatch(/Secure/); // local development over http; production sets Secure
    expect(refresh).toMatch(/Path=\/api\/auth/);
    expect(refresh).toMatch(/HttpOnly/);
    const me = await agent.get('/api/me');
    expect(me.status).toBe(200);
    expect(meSchema.parse(me.body).user.displayName).toBe('Ada');
  });

  it('sets Secure on the cookies when configured for production-like serving', async () => {
    const secure = buildApp(t.db, {
      config: { auth: { ...t.db.config.auth, cookieSecure: true } },
    });
    try {
      const res = await request(secure.app).post('/api/auth/sign-up').send({
        email: uniqueEmail(),
        password: PASSWORD,
        displayName: 'Bo',
        labName: 'Board lab',
      });
      expect(res.status).toBe(201);
      for (const cookie of cookiesOf(res)) expect(cookie).toMatch(/; Secure/);
    } finally {
      await secure.close();
    }
  });

  it.each([
    ['a password shorter than 10 characters', { password: 'short' }, 'password'],
    [
      'a password equal to the e-mail address',
      { email: 'same@example.test', password: 'SAME@example.test' },
      'password',
    ],
    ['an e-mail address that is not one', { email: 'not-an-address' }, 'email'],
    ['a missing lab name', { labName: undefined }, 'labName'],
  ])('answers 400 naming the field for %s', async (_label, override, field) => {
    const body = {
      email: uniqueEmail(),
      password: PASSWORD,
      displayName: 'Cy',
      labName: 'Lab',
      ...override,
    };
    const res = await request(t.app).post('/api/auth/sign-up').send(body);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_request');
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toContain(field);
  });

  it('answers 409 email_taken for an address that has an account, in any case', async () => {
    const email = uniqueEmail();
    const first = { email, password: PASSWORD, displayName: 'Di', labName: 'Lab one' };
    expect((await request(t.app).post('/api/auth/sign-up').send(first)).status).toBe(201);
    const again = await request(t.app)
      .post('/api/auth/sign-up')
      .send({ ...first, email: email.toUpperCase() });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('email_taken');
  });
});

describe('POST /api/auth/sign-in', () => {
  it('answers 401 invalid_credentials for a wrong password and records the failure', async () => {
    const lead = await signUpPerson(t);
    const res = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: lead.email, password: 'wrong password!' });
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('invalid_credentials');
    const failed = await AuditEventModel.findOne({
      where: { action: 'sign_in_failed', targetUserId: lead.userId },
    });
    expect(failed).not.toBeNull();
  });

  it('answers the same 401 for an address with no account', async () => {
    const res = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: uniqueEmail(), password: PASSWORD });
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('invalid_credentials');
  });

  it('gives API clients tokens in the body, and the Authorization header works', async () => {
    const lead = await signUpPerson(t);
    const res = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: lead.email, password: PASSWORD, tokenDelivery: 'body' });
    expect(res.status).toBe(200);
    expect(cookiesOf(res)).toEqual([]);
    const me = await request(t.app).get('/api/me').set(bearer(res.body.accessToken));
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe(lead.email);
  });
});

describe('access tokens', () => {
  const claims = (userId: string, sessionId: string) => ({
    sid: sessionId,
    sub: userId,
    iss: 'quenchbook',
    aud: 'quenchbook-api',
  });

  async function session() {
    const lead = await signUpPerson(t);
    const decoded = jwt.decode(lead.token) as { sid: string; sub: string };
    return { lead, sid: decoded.sid };
  }

  it('refuses an expired token with code token_expired', async () => {
    const { lead, sid } = await session();
    const expired = jwt.sign(
      { ...claims(lead.userId, sid), exp: Math.floor(Date.now() / 1000) - 60 },
      t.config.auth.jwtSecret,
      { algorithm: 'HS256' },
    );
    const res = await request(t.app).get('/api/me').set(bearer(expired));
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('token_expired');
  });

  it('refuses a token whose payload was changed', async () => {
    const { lead } = await session();
    const other = await signUpPerson(t);
    const [head, , sig] = lead.token.split('.');
    const forged = Buffer.from(
      JSON.stringify({ ...(jwt.decode(lead.token) as object), sub: other.userId }),
    ).toString('base64url');
    const res = await request(t.app)
      .get('/api/me')
      .set(bearer(`${head}.${forged}.${sig}`));
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('refuses a token signed with another key', async () => {
    const { lead, sid } = await session();
    const foreign = jwt.sign(
      claims(lead.userId, sid),
      'another-secret-that-is-long-enough-0123456789',
      { algorithm: 'HS256', expiresIn: 600 },
    );
    expect((await request(t.app).get('/api/me').set(bearer(foreign))).status).toBe(401);
  });

  it('refuses a token with alg none', async () => {
    const { lead, sid } = await session();
    const header = Buffer.from(JSON.stringify({ alg: 'none', typ: 'JWT' })).toString('base64url');
    const payload = Buffer.from(
      JSON.stringify({ ...claims(lead.userId, sid), exp: Math.floor(Date.now() / 1000) + 600 }),
    ).toString('base64url');
    expect(
      (
        await request(t.app)
          .get('/api/me')
          .set(bearer(`${header}.${payload}.`))
      ).status,
    ).toBe(401);
  });

  it('refuses a token for another audience', async () => {
    const { lead, sid } = await session();
    const wrongAud = jwt.sign(
      { ...claims(lead.userId, sid), aud: 'somebody-else' },
      t.config.auth.jwtSecret,
      { algorithm: 'HS256', expiresIn: 600 },
    );
    expect((await request(t.app).get('/api/me').set(bearer(wrongAud))).status).toBe(401);
  });
});

describe('cookie sessions', () => {
  async function cookieAgent() {
    const agent = request.agent(t.app);
    const res = await agent
      .post('/api/auth/sign-up')
      .send({ email: uniqueEmail(), password: PASSWORD, displayName: 'Ed', labName: 'Cotton lab' });
    return {
      agent,
      csrf: res.body.me.csrfToken as string,
      labId: res.body.me.labs[0].id as string,
    };
  }

  it('refuses a cookie-authenticated write without the CSRF token, and accepts it with the token', async () => {
    const { agent, csrf } = await cookieAgent();
    const without = await agent.patch('/api/me').send({ units: 'us' });
    expect(without.status).toBe(403);
    expect(without.body.error.code).toBe('csrf_failed');
    const wrong = await agent
      .patch('/api/me')
      .set('X-CSRF-Token', 'x'.repeat(43))
      .send({ units: 'us' });
    expect(wrong.status).toBe(403);
    const ok = await agent.patch('/api/me').set('X-CSRF-Token', csrf).send({ units: 'us' });
    expect(ok.status).toBe(200);
    expect(ok.body.units).toBe('us');
  });

  it('rotates the refresh token: the new one works, the old one is refused', async () => {
    const lead = await signUpPerson(t);
    const first = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: lead.email, password: PASSWORD, tokenDelivery: 'body' });
    const old = first.body.refreshToken as string;
    const rotated = await request(t.app)
      .post('/api/auth/refresh')
      .send({ refreshToken: old, tokenDelivery: 'body' });
    expect(rotated.status).toBe(200);
    expect(rotated.body.refreshToken).not.toBe(old);
    expect((await request(t.app).get('/api/me').set(bearer(rotated.body.accessToken))).status).toBe(
      200,
    );
    const replay = await request(t.app)
      .post('/api/auth/refresh')
      .send({ refreshToken: old, tokenDelivery: 'body' });
    expect(replay.status).toBe(401);
  });

  it('refreshes from the cookie for the web app', async () => {
    const { agent } = await cookieAgent();
    const res = await agent.post('/api/auth/refresh').send({});
    expect(res.status).toBe(200);
    expect(cookiesOf(res).some((c) => c.startsWith('qb_access='))).toBe(true);
  });

  it('signs out: the session ends and its access token is refused at once', async () => {
    const { agent, csrf } = await cookieAgent();
    expect((await agent.post('/api/auth/sign-out').set('X-CSRF-Token', csrf)).status).toBe(204);
    expect((await agent.get('/api/me')).status).toBe(401);
  });
});

describe('POST /api/auth/sign-out-everywhere', () => {
  it('ends every session of the user, on every device', async () => {
    const lead = await signUpPerson(t);
    const second = await signInForToken(t, lead.email);
    expect(
      (await request(t.app).post('/api/auth/sign-out-everywhere').set(bearer(lead.token))).status,
    ).toBe(204);
    expect((await request(t.app).get('/api/me').set(bearer(second))).status).toBe(401);
    expect(await SessionModel.count({ where: { userId: lead.userId, revokedAt: null } })).toBe(0);
  });
});

describe('POST /api/auth/password', () => {
  it('answers 400 on the current-password field when it is wrong', async () => {
    const lead = await signUpPerson(t);
    const res = await request(t.app)
      .post('/api/auth/password')
      .set(bearer(lead.token))
      .send({ currentPassword: 'not it at all', newPassword: 'a new long password' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual([
      { path: 'currentPassword', message: 'This is not your current password' },
    ]);
  });

  it('refuses the e-mail address as the new password', async () => {
    const lead = await signUpPerson(t);
    const res = await request(t.app)
      .post('/api/auth/password')
      .set(bearer(lead.token))
      .send({ currentPassword: PASSWORD, newPassword: lead.email });
    expect(res.status).toBe(400);
  });

  it('changes the password, keeps this session and ends the others', async () => {
    const lead = await signUpPerson(t);
    const other = await signInForToken(t, lead.email);
    const res = await request(t.app)
      .post('/api/auth/password')
      .set(bearer(lead.token))
      .send({ currentPassword: PASSWORD, newPassword: 'a new long password' });
    expect(res.status).toBe(204);
    expect((await request(t.app).get('/api/me').set(bearer(lead.token))).status).toBe(200);
    expect((await request(t.app).get('/api/me').set(bearer(other))).status).toBe(401);
    expect(
      (
        await request(t.app)
          .post('/api/auth/sign-in')
          .send({ email: lead.email, password: PASSWORD })
      ).status,
    ).toBe(401);
    await expect(signInForToken(t, lead.email, 'a new long password')).resolves.toEqual(
      expect.any(String),
    );
  });
});

describe('rate limits', () => {
  it('answers 429 with Retry-After and a clear message after the limit of sign-in tries', async () => {
    const limited = buildApp(t.db, { config: { auth: { ...t.db.config.auth, rateLimitMax: 3 } } });
    try {
      const email = uniqueEmail();
      // Counts live in the database and outlast an app instance: an address of this test's own
      // keeps the sign-ins of earlier tests out of the count.
      const tryOnce = () =>
        request(limited.app)
          .post('/api/auth/sign-in')
          .set('X-Forwarded-For', '192.0.2.10')
          .send({ email, password: 'wrong password' });
      for (let i = 0; i < 3; i++) {
        const res = await tryOnce();
        expect(res.status).toBe(401);
      }
      const res = await tryOnce();
      expect(res.status).toBe(429);
      expect(res.body.error.code).toBe('rate_limited');
      expect(res.body.error.message).toMatch(/Too many tries\. Wait \d+ minutes? and try again\./);
      expect(Number(res.headers['retry-after'])).toBeGreaterThan(0);
    } finally {
      await limited.close();
    }
  });

  it('limits tries per account even when they come from different addresses', async () => {
    const limited = buildApp(t.db, { config: { auth: { ...t.db.config.auth, rateLimitMax: 2 } } });
    try {
      const email = uniqueEmail();
      // The server trusts X-Forwarded-For from loopback (a local reverse proxy), so each try
      // below arrives from another client address.
      const tryFrom = (ip: string) =>
        request(limited.app)
          .post('/api/auth/sign-in')
          .set('X-Forwarded-For', ip)
          .send({ email, password: 'wrong password' });
      expect((await tryFrom('203.0.113.1')).status).toBe(401);
      expect((await tryFrom('203.0.113.2')).status).toBe(401);
      expect((await tryFrom('203.0.113.3')).status).toBe(429);
      const otherAccount = await request(limited.app)
        .post('/api/auth/sign-in')
        .set('X-Forwarded-For', '203.0.113.4')
        .send({ email: uniqueEmail(), password: 'wrong password' });
      expect(otherAccount.status).toBe(401);
    } finally {
      await limited.close();
    }
  });
});

describe('GET /api/auth/session', () => {
  it('answers 200 with me null when nobody is signed in', async () => {
    const res = await request(t.app).get('/api/auth/session');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ me: null });
  });

  it('renews the sign-in from the refresh cookie alone, as after the access cookie lapsed', async () => {
    const signUp = await request(t.app)
      .post('/api/auth/sign-up')
      .send({ email: uniqueEmail(), password: PASSWORD, displayName: 'Fay', labName: 'Wood lab' });
    const refresh = cookiesOf(signUp)
      .find((c) => c.startsWith('qb_refresh='))!
      .split(';')[0]!;
    const res = await request(t.app).get('/api/auth/session').set('Cookie', refresh);
    expect(res.status).toBe(200);
    expect(res.body.me.user.displayName).toBe('Fay');
    expect(cookiesOf(res).some((c) => c.startsWith('qb_access='))).toBe(true);
    // The refresh token was rotated: the old one no longer works.
    const again = await request(t.app).get('/api/auth/session').set('Cookie', refresh);
    expect(again.body).toEqual({ me: null });
  });
});
