import request from 'supertest';
import { auditPageSchema } from '../../shared/schemas/audit';
import { bearer, memberWithRole, PASSWORD, signUpPerson } from '../support/accounts';
import { withTestApp } from '../support/app';

const t = withTestApp();

describe('PATCH /api/labs/:labId/members/:userId', () => {
  it('refuses to demote the last manager, with a clear message', async () => {
    const lead = await signUpPerson(t);
    const res = await request(t.app)
      .patch(`/api/labs/${lead.labId}/members/${lead.userId}`)
      .set(bearer(lead.token))
      .send({ role: 'technician' });
    expect(res.status).toBe(409);
    expect(res.body.error).toEqual({
      code: 'last_manager',
      message: 'A lab needs at least one manager. Make someone else a manager first.',
      requestId: expect.any(String),
    });
  });

  it('lets a manager step down once someone else manages', async () => {
    const lead = await signUpPerson(t);
    const second = await memberWithRole(t, lead.labId, 'technician');
    const promote = await request(t.app)
      .patch(`/api/labs/${lead.labId}/members/${second.userId}`)
      .set(bearer(lead.token))
      .send({ role: 'manager' });
    expect(promote.status).toBe(200);
    expect(promote.body.role).toBe('manager');
    const stepDown = await request(t.app)
      .patch(`/api/labs/${lead.labId}/members/${lead.userId}`)
      .set(bearer(lead.token))
      .send({ role: 'reviewer' });
    expect(stepDown.status).toBe(200);
    // Now a reviewer: managing members is refused.
    const after = await request(t.app)
      .get(`/api/labs/${lead.labId}/invitations`)
      .set(bearer(lead.token));
    expect(after.status).toBe(403);
  });

  it('keeps one manager when two managers demote each other at the same moment', async () => {
    const lead = await signUpPerson(t);
    const second = await memberWithRole(t, lead.labId, 'manager');
    const [a, b] = await Promise.all([
      request(t.app)
        .patch(`/api/labs/${lead.labId}/members/${second.userId}`)
        .set(bearer(lead.token))
        .send({ role: 'viewer' }),
      request(t.app)
        .patch(`/api/labs/${lead.labId}/members/${lead.userId}`)
        .set(bearer(second.token))
        .send({ role: 'viewer' }),
    ]);
    const members = await request(t.app)
      .get(`/api/labs/${lead.labId}/members`)
      .set(bearer(lead.token));
    const managers = members.body.members.filter((m: { role: string }) => m.role === 'manager');
    expect(managers).toHaveLength(1);
    expect([a.status, b.status].sort((x, y) => x - y)).toEqual([200, 409]);
  });

  it('answers 400 for a role that does not exist', async () => {
    const lead = await signUpPerson(t);
    const tech = await memberWithRole(t, lead.labId, 'technician');
    const res = await request(t.app)
      .patch(`/api/labs/${lead.labId}/members/${tech.userId}`)
      .set(bearer(lead.token))
      .send({ role: 'owner' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].path).toBe('role');
  });
});

describe('DELETE /api/labs/:labId/members/:userId', () => {
  it("ends the removed member's access at once, though their token is still valid", async () => {
    const lead = await signUpPerson(t);
    const tech = await memberWithRole(t, lead.labId, 'technician');
    expect(
      (await request(t.app).get(`/api/labs/${lead.labId}`).set(bearer(tech.token))).status,
    ).toBe(200);
    const removed = await request(t.app)
      .delete(`/api/labs/${lead.labId}/members/${tech.userId}`)
      .set(bearer(lead.token));
    expect(removed.status).toBe(204);
    expect(
      (await request(t.app).get(`/api/labs/${lead.labId}`).set(bearer(tech.token))).status,
    ).toBe(404);
    const me = await request(t.app).get('/api/me').set(bearer(tech.token));
    expect(me.body.labs).toEqual([]);
  });

  it('refuses to remove the last manager', async () => {
    const lead = await signUpPerson(t);
    const res = await request(t.app)
      .delete(`/api/labs/${lead.labId}/members/${lead.userId}`)
      .set(bearer(lead.token));
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('last_manager');
  });
});

describe('GET /api/labs/:labId/audit', () => {
  it("lists who did what, newest first, in pages, including members' sign-ins", async () => {
    const lead = await signUpPerson(t, 'Audited lab');
    const tech = await memberWithRole(t, lead.labId, 'technician');
    await request(t.app)
      .patch(`/api/labs/${lead.labId}/members/${tech.userId}`)
      .set(bearer(lead.token))
      .send({ role: 'reviewer' });
    await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: tech.email, password: 'not the password' });
    await request(t.app).post('/api/auth/sign-in').send({ email: tech.email, password: PASSWORD });

    const res = await request(t.app)
      .get(`/api/labs/${lead.labId}/audit?page=1&pageSize=3`)
      .set(bearer(lead.token));
    expect(res.status).toBe(200);
    const page = auditPageSchema.parse(res.body);
    expect(page.events.map((e) => e.action)).toEqual(['sign_in', 'sign_in_failed', 'role_changed']);
    expect(page.events[2]).toMatchObject({
      actor: { email: lead.email },
      target: { email: tech.email },
      detail: { from: 'technician', to: 'reviewer' },
      ip: expect.stringContaining('127.0.0.1'),
    });
    expect(page.total).toBeGreaterThan(3);
    const next = auditPageSchema.parse(
      (
        await request(t.app)
          .get(`/api/labs/${lead.labId}/audit?page=2&pageSize=3`)
          .set(bearer(lead.token))
      ).body,
    );
    expect(next.events.map((e) => e.id)).not.toContain(page.events[0]!.id);
  });

  it("does not show another lab's events", async () => {
    const a = await signUpPerson(t, 'Lab A');
    const b = await signUpPerson(t, 'Lab B');
    const res = await request(t.app)
      .get(`/api/labs/${a.labId}/audit?pageSize=100`)
      .set(bearer(a.token));
    const people = res.body.events.flatMap((e: { actor: { id: string } | null }) =>
      e.actor ? [e.actor.id] : [],
    );
    expect(people).not.toContain(b.userId);
  });

  it('answers 400 for a page size over 100', async () => {
    const lead = await signUpPerson(t);
    const res = await request(t.app)
      .get(`/api/labs/${lead.labId}/audit?pageSize=500`)
      .set(bearer(lead.token));
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].path).toBe('pageSize');
  });
});
