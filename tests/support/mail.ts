import { listMail } from '../../server/mail/mailbox';
import type { CapturedMail } from '../../server/mail/types';

/**
 * The newest captured message to `match.to` (and with a matching subject, when given). Polls,
 * because the app may answer a request before its mail has reached the mailbox.
 */
export async function waitForMail(
  mailboxDir: string,
  match: { to: string; subject?: RegExp },
  timeoutMs = 10_000,
): Promise<CapturedMail> {
  const to = match.to.toLowerCase();
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const mails = await listMail(mailboxDir);
    const found = mails.find(
      (m) => m.to.includes(to) && (match.subject === undefined || match.subject.test(m.subject)),
    );
    if (found) return found;
    if (Date.now() >= deadline) {
      const seen = mails.map((m) => `  ${m.to.join(', ')}: ${m.subject}`).join('\n') || '  (none)';
      const wanted = match.subject ? ` with a subject matching ${match.subject}` : '';
      throw new Error(
        `No mail to ${to}${wanted} within ${timeoutMs} ms in ${mailboxDir}. Mail there:\n${seen}`,
      );
    }
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
}

/** The first URL in the plain-text body whose path starts with `pathPrefix`, e.g. `/invite/`. */
export function linkIn(mail: CapturedMail, pathPrefix: string): string {
  // A sentence may end right after a URL; its full stop is not part of the link.
  const urls = (mail.text.match(/https?:\/\/[^\s<>"']+/g) ?? []).map((u) =>
    u.replace(/[.,;:!?)\]]+$/, ''),
  );
  const link = urls.find((u) => URL.canParse(u) && new URL(u).pathname.startsWith(pathPrefix));
  if (link === undefined) {
    const found = urls.length ? urls.join(', ') : 'none';
    throw new Error(
      `No link with a path starting ${pathPrefix} in the mail "${mail.subject}" (links: ${found}).`,
    );
  }
  return link;
}
