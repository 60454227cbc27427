import type { AddressInfo } from 'node:net';
import { simpleParser } from 'mailparser';
import { SMTPServer, type SMTPServerDataStream, type SMTPServerSession } from 'smtp-server';
import { newMailId, saveMail } from './mailbox';
import { isLoopbackHost } from './sender';
import type { CapturedMail } from './types';

// Common practice, no source: well above any mail we send, small enough to stop a runaway loop.
const MAX_MESSAGE_BYTES = 5 * 1024 * 1024;

export type FakeSmtp = {
  port: number;
  close(): Promise<void>;
};

export type FakeSmtpOptions = {
  /** Loopback only; defaults to 127.0.0.1. */
  host?: string;
  /** 0 picks any free port. */
  port: number;
  mailboxDir: string;
  logError?: (err: unknown) => void;
};

function smtpError(message: string, responseCode: number): Error {
  return Object.assign(new Error(message), { responseCode });
}

// Names in the mailbox sort by receivedAt, so two messages in the same millisecond would come
// out in random order; nudging the clock forward keeps them in the order they arrived.
let lastReceivedMs = 0;
function nextReceivedAt(): string {
  lastReceivedMs = Math.max(Date.now(), lastReceivedMs + 1);
  return new Date(lastReceivedMs).toISOString();
}

async function capture(
  stream: SMTPServerDataStream,
  session: SMTPServerSession,
  mailboxDir: string,
): Promise<void> {
  const parsed = await simpleParser(stream);
  if (stream.sizeExceeded) throw smtpError('Message is larger than 5 MB.', 552);
  const envelopeFrom = session.envelope.mailFrom ? session.envelope.mailFrom.address : '';
  const mail: CapturedMail = {
    id: newMailId(),
    receivedAt: nextReceivedAt(),
    from: parsed.from?.text ?? envelopeFrom,
    // The envelope, not the To header: it is who the message was really delivered to.
    to: session.envelope.rcptTo.map((rcpt) => rcpt.address.toLowerCase()),
    subject: parsed.subject ?? '',
    text: parsed.text ?? '',
    html: parsed.html || '',
  };
  try {
    await saveMail(mailboxDir, mail);
  } catch (err) {
    // 451: the sender may try again; the message is not lost on their side.
    throw Object.assign(smtpError('Could not store the message.', 451), { cause: err });
  }
}

/**
 * A mail catcher for development and tests: accepts anything from loopback clients and writes
 * each message into `mailboxDir`, where other processes read it (see mailbox.ts).
 */
export async function startFakeSmtp(opts: FakeSmtpOptions): Promise<FakeSmtp> {
  const host = opts.host ?? '127.0.0.1';
  // It accepts any sender and any password, so it must never be reachable from the network.
  if (!isLoopbackHost(host)) {
    throw new Error(`The fake SMTP server listens on loopback only, not on ${host}.`);
  }
  const logError = opts.logError ?? console.error;

  const server = new SMTPServer({
    name: 'quenchbook-mail-catcher',
    banner: 'Quenchbook development mail catcher',
    logger: false,
    disableReverseLookup: true,
    disabledCommands: ['STARTTLS'],
    // A development config may carry SMTP credentials: accept them rather than fail the send.
    authOptional: true,
    allowInsecureAuth: true,
    onAuth: (auth, _session, callback) => callback(null, { user: auth.username ?? 'dev' }),
    size: MAX_MESSAGE_BYTES,
    rejectOversized: true,
    // Closing must not wait the default 30 s for an idle client, or test runs hang on exit.
    closeTimeout: 1_000,
    onData(stream, session, callback) {
      capture(stream, session, opts.mailboxDir).then(
        () => callback(),
        (err: unknown) => {
          // An oversized message is the client's problem; anything else is ours to look into.
          if ((err as { responseCode?: number } | undefined)?.responseCode !== 552) logError(err);
          callback(err instanceof Error ? err : smtpError('Could not read the message.', 451));
        },
      );
    },
  });

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port, host, () => {
      server.off('error', reject);
      resolve();
    });
  });
  // A client dropping its connection emits 'error'; without a listener that would end the process.
  server.on('error', logError);

  const { port } = server.server.address() as AddressInfo;
  let closing: Promise<void> | undefined;
  return {
    port,
    close() {
      closing ??= new Promise((resolve) => server.close(() => resolve()));
      return closing;
    },
  };
}
