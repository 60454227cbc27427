import { mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import express from 'express';
import request from 'supertest';
import { startFakeSmtp, type FakeSmtp } from '../../server/mail/fake-smtp';
import { clearMail, getMail, listMail, saveMail } from '../../server/mail/mailbox';
import { createMailer, type Mailer } from '../../server/mail/sender';
import {
  escapeHtml,
  invitationMail,
  passwordResetMail,
  roleSentences,
} from '../../server/mail/templates';
import type { CapturedMail } from '../../server/mail/types';
import { devMailRouter } from '../../server/routes/dev-mail';
import { linkIn, waitForMail } from '../support/mail';

const tempDirs: string[] = [];
function tempDir(): string {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'qb-mail-'));
  tempDirs.push(dir);
  return dir;
}
afterAll(() => {
  for (const dir of tempDirs) rmSync(dir, { recursive: true, force: true });
});

function captured(overrides: Partial<CapturedMail>): CapturedMail {
  return {
    id: 'a1b2c3d4e5f60718',
    receivedAt: '2026-12-02T14:05:09.000Z',
    from: 'Quenchbook <no-reply@quenchbook.test>',
    to: ['ada@example.org'],
    subject: 'Hello',
    text: 'Hello',
    html: '<p>Hello</p>',
    ...overrides,
  };
}

describe('fake SMTP server', () => {
  let root: string;
  let mailboxDir: string;
  let smtp: FakeSmtp;
  let mailer: Mailer;

  beforeAll(async () => {
    root = tempDir();
    // Not created on purpose: the server makes it when the first message arrives.
    mailboxDir = path.join(root, 'mailbox');
    smtp = await startFakeSmtp({ port: 0, mailboxDir, logError: () => {} });
    mailer = createMailer({
      host: '127.0.0.1',
      port: smtp.port,
      secure: false,
      from: 'Quenchbook <no-reply@quenchbook.test>',
    });
  });
  afterAll(async () => {
    mailer.close();
    await smtp.close();
  });
  beforeEach(() => clearMail(mailboxDir));

  it('captures a message sent through the mailer as JSON in the mailbox', async () => {
    await mailer.send({
      to: 'Ada.Lovelace@Example.org',
      subject: 'Burn test T-12 is ready for review',
      text: 'Open https://quenchbook.test/burn-tests/12 to review it.',
      html: '<p>Open <a href="https://quenchbook.test/burn-tests/12">the test</a>.</p>',
    });

    const mail = await waitForMail(mailboxDir, { to: 'ada.lovelace@example.org' });
    expect(mail.to).toEqual(['ada.lovelace@example.org']);
    expect(mail.from).toContain('no-reply@quenchbook.test');
    expect(mail.subject).toBe('Burn test T-12 is ready for review');
    expect(mail.text.trim()).toBe('Open https://quenchbook.test/burn-tests/12 to review it.');
    expect(mail.html).toContain('<a href="https://quenchbook.test/burn-tests/12">the test</a>');
    expect(Number.isNaN(Date.parse(mail.receivedAt))).toBe(false);

    // One finished file named by time and id, and no temporary file left behind.
    expect(readdirSync(mailboxDir)).toEqual([
      expect.stringMatching(`^\\d{8}T\\d{9}Z-${mail.id}\\.json$`),
    ]);
    await expect(getMail(mailboxDir, mail.id)).resolves.toEqual(mail);
  });

  it('lists captured messages newest first', async () => {
    for (const n of [1, 2, 3]) {
      await mailer.send({
        to: 'grace@example.org',
        subject: `Message ${n}`,
        text: `${n}`,
        html: '',
      });
    }
    const mails = await listMail(mailboxDir);
    expect(mails.map((m) => m.subject)).toEqual(['Message 3', 'Message 2', 'Message 1']);
  });

  it('accepts a sender that logs in, whatever the password', async () => {
    const withLogin = createMailer({
      host: 'localhost',
      port: smtp.port,
      secure: false,
      user: 'dev',
      pass: 'anything',
      from: 'no-reply@quenchbook.test',
    });
    try {
      await withLogin.send({ to: 'grace@example.org', subject: 'Logged in', text: 'x', html: '' });
    } finally {
      withLogin.close();
    }
    await expect(
      waitForMail(mailboxDir, { to: 'grace@example.org', subject: /^Logged in$/ }),
    ).resolves.toMatchObject({ subject: 'Logged in' });
  });

  it('refuses to listen anywhere but loopback', async () => {
    await expect(startFakeSmtp({ host: '0.0.0.0', port: 0, mailboxDir })).rejects.toThrow(
      /loopback/,
    );
  });
});

describe('the mailbox folder', () => {
  it('reads a folder that does not exist as an empty mailbox', async () => {
    await expect(listMail(path.join(tempDir(), 'missing'))).resolves.toEqual([]);
  });

  it('refuses ids that try to leave the folder', async () => {
    const root = tempDir();
    const mailboxDir = path.join(root, 'mailbox');
    await saveMail(mailboxDir, captured({}));
    writeFileSync(path.join(root, 'secret.json'), JSON.stringify(captured({ id: 'secret' })));

    await expect(getMail(mailboxDir, '../x')).resolves.toBeUndefined();
    await expect(getMail(mailboxDir, '../secret')).resolves.toBeUndefined();
    await expect(getMail(mailboxDir, 'a1b2c3d4e5f60718/../x')).resolves.toBeUndefined();
    await expect(getMail(mailboxDir, 'a1b2c3d4e5f60718')).resolves.toMatchObject({
      subject: 'Hello',
    });
  });

  it('clears captured messages and leaves other files alone', async () => {
    const mailboxDir = tempDir();
    await saveMail(mailboxDir, captured({}));
    writeFileSync(path.join(mailboxDir, 'notes.txt'), 'mine');
    await clearMail(mailboxDir);
    expect(readdirSync(mailboxDir)).toEqual(['notes.txt']);
  });
});

describe('mail templates', () => {
  const invitation = {
    labName: 'North Coast Textiles',
    inviterName: 'Mira Okafor',
    role: 'technician' as const,
    link: 'https://quenchbook.test/invite/tok_123?lab=7&x=1',
    expiresAt: new Date('2026-12-02T14:05:00Z'),
  };

  /** Every line of the plain text must also be in the HTML: the two versions say the same. */
  function expectSameContent(mail: { text: string; html: string }) {
    const lines = mail.text.split('\n').filter((l) => l.trim() !== '');
    for (const line of lines) expect(mail.html).toContain(escapeHtml(line.replace(/:$/, '')));
  }

  it('invites with the inviter, the lab, the role and what that role may do', () => {
    const mail = invitationMail(invitation);
    expect(mail.subject).toContain('Mira Okafor');
    expect(mail.subject).toContain('North Coast Textiles');
    for (const body of [mail.text, mail.html]) {
      expect(body).toContain('Mira Okafor');
      expect(body).toContain('North Coast Textiles');
      expect(body).toContain('technician');
      expect(body).toContain(escapeHtml(roleSentences.technician));
    }
    expect(mail.text).toContain(invitation.link);
    expect(mail.html).toContain(`href="${escapeHtml(invitation.link)}"`);
    expectSameContent(mail);
  });

  it('tells each role in one sentence what it may do', () => {
    expect(invitationMail(invitation).text).toContain(
      'A technician writes recipes, prepares batches, and runs burn tests',
    );
    for (const role of ['manager', 'technician', 'reviewer', 'viewer'] as const) {
      const mail = invitationMail({ ...invitation, role });
      expect(mail.text).toContain(`as a ${role}.`);
      expect(mail.text).toContain(roleSentences[role]);
    }
    expect(invitationMail({ ...invitation, role: 'viewer' }).text).toContain('changes nothing');
  });

  it('says the invitation link works once and when it expires, in UTC', () => {
    const mail = invitationMail(invitation);
    expect(mail.text).toContain('works once');
    expect(mail.text).toContain('2 December 2026, 14:05 UTC');
    expect(mail.text).toMatch(/ignore this e-mail/);
  });

  it('escapes a lab name with markup in the HTML version', () => {
    const mail = invitationMail({ ...invitation, labName: '<script>alert("x")</script> Lab' });
    expect(mail.html).not.toContain('<script>');
    expect(mail.html).toContain('&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt; Lab');
  });

  it('refuses a link that is not http(s)', () => {
    expect(() => invitationMail({ ...invitation, link: 'javascript:alert(1)' })).toThrow(/http/);
  });

  it('explains a password reset: one use, minutes left, devices signed out', () => {
    const link = 'https://quenchbook.test/reset-password/tok_456';
    const mail = passwordResetMail({ displayName: 'Ada', link, expiresInMinutes: 30 });
    expect(mail.subject).toMatch(/password/i);
    expect(mail.text).toContain('Hello Ada,');
    expect(mail.text).toContain(link);
    expect(mail.html).toContain(`href="${link}"`);
    expect(mail.text).toContain('works once and expires in 30 minutes');
    expect(mail.text).toMatch(/every device .* signed out/);
    expect(mail.text).toMatch(/did not ask/);
    expectSameContent(mail);
  });
});

describe('development mail viewer', () => {
  const mailboxDir = tempDir();
  const app = express().use(devMailRouter(mailboxDir));
  const link = 'https://quenchbook.test/invite/tok_789?lab=7&x=1';
  const mail = captured({
    id: 'f00dfeedcafe0001',
    to: ['ada@example.org'],
    subject: 'You are invited to <North Coast>',
    text: `Accept the invitation:\n${link}.\n\nBold <b>not</b> bold.`,
  });
  beforeAll(() => saveMail(mailboxDir, mail));

  it('lists captured messages with time, recipient and subject, each linking to it', async () => {
    const res = await request(app).get('/dev/mail');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/html/);
    expect(res.headers['cache-control']).toBe('no-store');
    expect(res.text).toContain('<title>Captured mail (development)</title>');
    expect(res.text).toContain('ada@example.org');
    expect(res.text).toContain('2 December 2026, 14:05:09 UTC');
    expect(res.text).toContain(
      '<a href="/dev/mail/f00dfeedcafe0001">You are invited to &lt;North Coast&gt;</a>',
    );
    expect(res.text).not.toContain('<script');
  });

  it('shows a message with its link clickable and everything else escaped', async () => {
    const res = await request(app).get('/dev/mail/f00dfeedcafe0001');
    expect(res.status).toBe(200);
    const href = escapeHtml(link);
    expect(res.text).toContain(`<a href="${href}">${href}</a>.`);
    expect(res.text).toContain('Bold &lt;b&gt;not&lt;/b&gt; bold.');
    expect(res.text).toContain('no-reply@quenchbook.test');
    expect(res.text).toContain('<a href="/dev/mail">');
    expect(res.text).not.toContain('<script');
  });

  it('answers 404 with a page for an unknown or malformed id', async () => {
    for (const id of ['0000000000000000', '..%2Fsecret']) {
      const res = await request(app).get(`/dev/mail/${id}`);
      expect(res.status).toBe(404);
      expect(res.text).toContain('Message not found');
      expect(res.text).toContain('<a href="/dev/mail">');
    }
  });

  it('returns the captured messages as JSON', async () => {
    const res = await request(app).get('/api/dev/mail');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ messages: [mail] });
  });

  it('finds the link in a message for tests that follow it', async () => {
    const found = await waitForMail(mailboxDir, { to: 'ADA@example.org', subject: /invited/ });
    expect(linkIn(found, '/invite/')).toBe(link);
    expect(() => linkIn(found, '/reset-password/')).toThrow(/No link .*\/reset-password\//);
  });
});
