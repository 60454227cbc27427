import { PASSWORD, uniqueEmail } from '../support/accounts';
import { browserTestEnv } from '../support/browser-env';
import { viewports } from '../support/browser';
import { linkIn, waitForMail } from '../support/mail';
import { collectPageErrors } from '../support/page-errors';
import { screenshot } from '../support/screenshots';
import { seedLab, signInThroughUi } from '../support/ui';

jest.setTimeout(240_000);

const env = browserTestEnv();

let mailbox: string;

beforeAll(async () => {
  mailbox = env.server.deps.config.mail.fakeSmtp!.mailboxDir;
});

describe.each(Object.entries(viewports))('accounts at %s size', (name, viewport) => {
  it('signs up, invites a second person who joins from the e-mailed link with the given role', async () => {
    const lead = await env.browser.newContext({ viewport });
    const page = await lead.newPage();
    const errors = collectPageErrors(page);
    const leadEmail = uniqueEmail('founder');
    const labName = `Muslin trials ${name}`;

    await page.goto(`${env.server.url}/sign-up`);
    await page.getByTestId('field-displayName').fill('Frida Founder');
    await page.getByTestId('field-email').fill(leadEmail);
    await page.getByTestId('field-password').fill(PASSWORD);
    await page.getByTestId('field-labName').fill(labName);
    await screenshot(page, `sign-up-${name}`);
    await page.getByTestId('sign-up-submit').click();
    await page.getByTestId('section-title').filter({ hasText: 'Today' }).waitFor();
    await expect(page.getByTestId('current-role').textContent()).resolves.toContain('Manager');

    await page.getByTestId('nav-lab').click();
    const invitee = uniqueEmail('invitee');
    await page.getByTestId('field-email').fill(invitee);
    await page.getByTestId('invite-role-reviewer').click();
    await page.getByTestId('invite-submit').click();
    await page.getByTestId('invite-sent').waitFor();
    await page.getByTestId(`invitation-${invitee}`).waitFor();
    await screenshot(page, `lab-members-${name}`);

    const mail = await waitForMail(mailbox, { to: invitee, subject: /invit/i });
    const link = linkIn(mail, '/invitations/');
    expect(link.startsWith(env.server.url)).toBe(true);

    const second = await env.browser.newContext({ viewport });
    const page2 = await second.newPage();
    const errors2 = collectPageErrors(page2);
    await page2.goto(link);
    await page2
      .getByTestId('screen-title')
      .filter({ hasText: `Join ${labName}` })
      .waitFor();
    await page2.getByTestId('field-displayName').fill('Ingrid Invitee');
    await page2.getByTestId('field-password').fill(PASSWORD);
    await screenshot(page2, `accept-invitation-${name}`);
    await page2.getByTestId('accept-submit').click();
    await page2.getByTestId('section-title').filter({ hasText: 'Today' }).waitFor();

    // Sign out and back in: the lab is there with the role given.
    await page2.getByTestId('nav-account').click();
    await page2.getByTestId('sign-out').click();
    await page2.getByTestId('screen-title').filter({ hasText: 'Sign in' }).waitFor();
    await page2.getByTestId('field-email').fill(invitee);
    await page2.getByTestId('field-password').fill(PASSWORD);
    await page2.getByTestId('sign-in-submit').click();
    await page2.getByTestId('section-title').filter({ hasText: 'Today' }).waitFor();
    await expect(page2.getByTestId('lab-switcher').textContent()).resolves.toContain(labName);
    await expect(page2.getByTestId('current-role').textContent()).resolves.toContain('Reviewer');

    // The manager sees the new member with that role.
    await page.reload();
    await page.getByTestId(`role-${invitee}-reviewer`).waitFor();
    await expect(
      page.getByTestId(`role-${invitee}-reviewer`).getAttribute('aria-checked'),
    ).resolves.toBe('true');

    expect(errors).toEqual([]);
    expect(errors2).toEqual([]);
    await lead.close();
    await second.close();
  });

  it('shows a viewer the members but no controls to change anything', async () => {
    const seeded = await seedLab(env.server.deps, `Viewer lab ${name}`);
    const context = await env.browser.newContext({ viewport });
    const page = await context.newPage();
    const errors = collectPageErrors(page);
    await signInThroughUi(page, env.server.url, seeded.people.viewer.email);
    await page.getByTestId('section-title').filter({ hasText: 'Today' }).waitFor();
    await page.getByTestId('nav-lab').click();
    await page.getByTestId(`role-text-${seeded.people.manager.email}`).waitFor();
    await screenshot(page, `lab-as-viewer-${name}`);
    expect(await page.getByRole('radiogroup').count()).toBe(0);
    expect(await page.getByRole('button', { name: /remove|invite|withdraw/i }).count()).toBe(0);
    expect(await page.getByTestId('invite').count()).toBe(0);
    expect(await page.getByTestId('link-audit').count()).toBe(0);
    expect(errors).toEqual([]);
    await context.close();
  });
});

describe('password reset in the browser', () => {
  it('follows the e-mailed link to a new password and signs in with it', async () => {
    const seeded = await seedLab(env.server.deps, 'Reset lab');
    const email = seeded.people.technician.email;
    const context = await env.browser.newContext({ viewport: viewports.phone });
    const page = await context.newPage();
    await page.goto(`${env.server.url}/sign-in`);
    await page.getByTestId('link-forgot').click();
    await page.getByTestId('field-email').fill(email);
    await page.getByTestId('reset-request-submit').click();
    await page.getByTestId('reset-sent').waitFor();

    const mail = await waitForMail(mailbox, { to: email, subject: /password/i });
    await page.goto(linkIn(mail, '/reset-password'));
    await page.getByTestId('field-newPassword').fill('a brand new passphrase');
    await page.getByTestId('reset-confirm-submit').click();
    await page.getByTestId('reset-done').waitFor();

    await signInThroughUi(page, env.server.url, email, 'a brand new passphrase');
    await page.getByTestId('section-title').filter({ hasText: 'Today' }).waitFor();
    await context.close();
  });

  it('shows the wrong-password message in a banner without losing the typed address', async () => {
    const seeded = await seedLab(env.server.deps, 'Banner lab');
    const context = await env.browser.newContext({ viewport: viewports.phone });
    const page = await context.newPage();
    await signInThroughUi(page, env.server.url, seeded.people.viewer.email, 'not the password');
    await page
      .getByTestId('form-banner')
      .getByText('That e-mail address and password do not match an account.')
      .waitFor();
    await expect(page.getByTestId('field-email').inputValue()).resolves.toBe(
      seeded.people.viewer.email,
    );
    await screenshot(page, 'sign-in-wrong-password-phone');
    await context.close();
  });
});
