import request from 'supertest';
import { PasswordResetModel } from '../../server/models';
import { listMail } from '../../server/mail/mailbox';
import { bearer, PASSWORD, signInForToken, signUpPerson, uniqueEmail } from '../support/accounts';
import { withTestApp } from '../support/app';
import { linkIn, waitForMail } from '../support/mail';

const t = withTestApp();
const mailbox = () => t.config.mail.fakeSmtp!.mailboxDir;

async function requestReset(email: string): Promise<string> {
  const res = await request(t.app).post('/api/auth/password-reset/request').send({ email });
  expect(res.status).toBe(202);
  const mail = await waitForMail(mailbox(), { to: email, subject: /password/i });
  return new URL(linkIn(mail, '/reset-password')).searchParams.get('token')!;
}

describe('password reset by e-mail', () => {
  it('follows the e-mailed link to set a new password, and ends every session', async () => {
    const lead = await signUpPerson(t);
    const token = await requestReset(lead.email);
    const res = await request(t.app)
      .post('/api/auth/password-reset/confirm')
      .send({ token, newPassword: 'brand new password' });
    expect(res.status).toBe(204);
    expect((await request(t.app).get('/api/me').set(bearer(lead.token))).status).toBe(401);
    await expect(signInForToken(t, lead.email, 'brand new password')).resolves.toEqual(
      expect.any(String),
    );
    await expect(signInForToken(t, lead.email, PASSWORD)).rejects.toThrow(/401/);
  });

  it('works once: the same link a second time answers 400 invalid_link', async () => {
    const lead = await signUpPerson(t);
    const token = await requestReset(lead.email);
    const confirm = () =>
      request(t.app)
        .post('/api/auth/password-reset/confirm')
        .send({ token, newPassword: 'brand new password' });
    expect((await confirm()).status).toBe(204);
    const again = await confirm();
    expect(again.status).toBe(400);
    expect(again.body.error.code).toBe('invalid_link');
  });

  it('does not work after 30 minutes', async () => {
    const lead = await signUpPerson(t);
    const token = await requestReset(lead.email);
    const row = await PasswordResetModel.findOne({ where: { userId: lead.userId } });
    // Both stamps are taken a moment apart while the row is made: allow a second between them.
    const lifetime = row!.expiresAt.getTime() - row!.createdAt.getTime();
    expect(lifetime).toBeGreaterThan(30 * 60 * 1000 - 1000);
    expect(lifetime).toBeLessThanOrEqual(30 * 60 * 1000 + 1000);
    await row!.update({ expiresAt: new Date(Date.now() - 1000) });
    const res = await request(t.app)
      .post('/api/auth/password-reset/confirm')
      .send({ token, newPassword: 'brand new password' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_link');
    await expect(signInForToken(t, lead.email)).resolves.toEqual(expect.any(String));
  });

  it('answers the same for an unknown address and sends nothing', async () => {
    const email = uniqueEmail('nobody');
    const res = await request(t.app).post('/api/auth/password-reset/request').send({ email });
    expect(res.status).toBe(202);
    await new Promise((resolve) => setTimeout(resolve, 300));
    expect((await listMail(mailbox())).some((m) => m.to.includes(email))).toBe(false);
  });

  it('refuses a made-up token', async () => {
    const res = await request(t.app)
      .post('/api/auth/password-reset/confirm')
      .send({ token: 'x'.repeat(43), newPassword: 'brand new password' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_link');
  });
});
