import type { Config } from '../server/config';
import { startFakeSmtp } from '../server/mail/fake-smtp';

/**
 * Outside production without SMTP settings, mail goes to a local fake SMTP server whose
 * captures are shown at /dev/mail. Returns a stop function (a no-op when none was started).
 */
export async function startMailCatcher(config: Config): Promise<() => Promise<void>> {
  const fake = config.mail.fakeSmtp;
  if (!fake) return async () => {};
  const smtp = await startFakeSmtp({ port: fake.port, mailboxDir: fake.mailboxDir });
  return () => smtp.close();
}
