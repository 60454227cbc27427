import request from 'supertest';
import { InvitationModel } from '../../server/models';
import {
  bearer,
  PASSWORD,
  signInForToken,
  signUpPerson,
  uniqueEmail,
  memberWithRole,
} from '../support/accounts';
import { withTestApp } from '../support/app';
import { linkIn, waitForMail } from '../support/mail';

const t = withTestApp();
const mailbox = () => t.config.mail.fakeSmtp!.mailboxDir;

async function invite(
  lead: { token: string; labId: string },
  email: string,
  role = 'reviewer',
): Promise<string> {
  const res = await request(t.app)
    .post(`/api/labs/${lead.labId}/invitations`)
    .set(bearer(lead.token))
    .send({ email, role });
  expect(res.status).toBe(201);
  const mail = await waitForMail(mailbox(), { to: email, subject: /invit/i });
  return new URL(linkIn(mail, '/invitations/')).pathname.split('/').pop()!;
}

describe('invitations by e-mail', () => {
  it('lets a new person follow the e-mailed link, create an account and join with the given role', async () => {
    const lead = await signUpPerson(t, 'Board lab');
    const email = uniqueEmail('newcomer');
    const token = await invite(lead, email, 'reviewer');

    const preview = await request(t.app).get(`/api/invitations/${token}`);
    expect(preview.status).toBe(200);
    expect(preview.body).toMatchObject({
      labName: 'Board lab',
      email,
      role: 'reviewer',
      accountExists: false,
    });

    const accepted = await request(t.app)
      .post(`/api/invitations/${token}/accept`)
      .send({ displayName: 'Newcomer', password: PASSWORD });
    expect(accepted.status).toBe(201);
    expect(accepted.body.me.labs).toEqual([
      { id: lead.labId, name: 'Board lab', role: 'reviewer' },
    ]);
    const token2 = await signInForToken(t, email);
    expect(
      (await request(t.app).get(`/api/labs/${lead.labId}`).set(bearer(token2))).body.role,
    ).toBe('reviewer');
  });

  it('works once', async () => {
    const lead = await signUpPerson(t);
    const token = await invite(lead, uniqueEmail());
    const accept = () =>
      request(t.app)
        .post(`/api/invitations/${token}/accept`)
        .send({ displayName: 'X', password: PASSWORD });
    expect((await accept()).status).toBe(201);
    const again = await accept();
    expect(again.status).toBe(400);
    expect(again.body.error.code).toBe('invalid_link');
  });

  it('expires after 7 days', async () => {
    const lead = await signUpPerson(t);
    const email = uniqueEmail();
    const token = await invite(lead, email);
    const row = await InvitationModel.findOne({ where: { email } });
    // Both stamps are taken a moment apart while the row is made: allow a second between them.
    const lifetime = row!.expiresAt.getTime() - row!.createdAt.getTime();
    expect(lifetime).toBeGreaterThan(7 * 24 * 60 * 60 * 1000 - 1000);
    expect(lifetime).toBeLessThanOrEqual(7 * 24 * 60 * 60 * 1000 + 1000);
    await row!.update({ expiresAt: new Date(Date.now() - 1000) });
    expect((await request(t.app).get(`/api/invitations/${token}`)).status).toBe(400);
    const res = await request(t.app)
      .post(`/api/invitations/${token}/accept`)
      .send({ displayName: 'X', password: PASSWORD });
    expect(res.body.error.code).toBe('invalid_link');
  });

  it('asks someone who already has an account to sign in first, then lets them join', async () => {
    const lead = await signUpPerson(t, 'Cotton lab');
    const other = await signUpPerson(t, 'Their own lab');
    const token = await invite(lead, other.email, 'technician');
    expect((await request(t.app).get(`/api/invitations/${token}`)).body.accountExists).toBe(true);

    const anonymous = await request(t.app).post(`/api/invitations/${token}/accept`).send({});
    expect(anonymous.status).toBe(401);
    expect(anonymous.body.error.code).toBe('sign_in_required');

    const joined = await request(t.app)
      .post(`/api/invitations/${token}/accept`)
      .set(bearer(other.token))
      .send({});
    expect(joined.status).toBe(200);
    expect(joined.body).toEqual({ labId: lead.labId });
    const me = await request(t.app).get('/api/me').set(bearer(other.token));
    expect(me.body.labs.map((l: { name: string; role: string }) => [l.name, l.role])).toEqual([
      ['Cotton lab', 'technician'],
      ['Their own lab', 'manager'],
    ]);
  });

  it('refuses a signed-in person whose address is not the invited one', async () => {
    const lead = await signUpPerson(t);
    const stranger = await signUpPerson(t);
    const invited = await signUpPerson(t);
    const token = await invite(lead, invited.email);
    const res = await request(t.app)
      .post(`/api/invitations/${token}/accept`)
      .set(bearer(stranger.token))
      .send({});
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('wrong_account');
  });

  it('answers 409 when inviting someone who is already a member', async () => {
    const lead = await signUpPerson(t);
    const tech = await memberWithRole(t, lead.labId, 'technician');
    const res = await request(t.app)
      .post(`/api/labs/${lead.labId}/invitations`)
      .set(bearer(lead.token))
      .send({ email: tech.email, role: 'viewer' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('already_member');
  });

  it('stops a withdrawn invitation from working', async () => {
    const lead = await signUpPerson(t);
    const email = uniqueEmail();
    const token = await invite(lead, email);
    const list = await request(t.app)
      .get(`/api/labs/${lead.labId}/invitations`)
      .set(bearer(lead.token));
    const id = list.body.invitations.find((i: { email: string }) => i.email === email).id;
    expect(
      (
        await request(t.app)
          .delete(`/api/labs/${lead.labId}/invitations/${id}`)
          .set(bearer(lead.token))
      ).status,
    ).toBe(204);
    const res = await request(t.app)
      .post(`/api/invitations/${token}/accept`)
      .send({ displayName: 'X', password: PASSWORD });
    expect(res.body.error.code).toBe('invalid_link');
  });

  it('asks a newcomer for a name and a password that is not their address', async () => {
    const lead = await signUpPerson(t);
    const email = uniqueEmail();
    const token = await invite(lead, email);
    const res = await request(t.app)
      .post(`/api/invitations/${token}/accept`)
      .send({ password: email });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path).sort()).toEqual([
      'displayName',
      'password',
    ]);
  });
});
