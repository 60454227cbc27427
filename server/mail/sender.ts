import { isIP } from 'node:net';
import { createTransport } from 'nodemailer';
import type { OutgoingMail } from './types';

export type Mailer = {
  send(mail: OutgoingMail): Promise<void>;
  close(): void;
};

export type MailerOptions = {
  host: string;
  port: number;
  /** TLS from the first byte (port 465 style). */
  secure: boolean;
  user?: string;
  pass?: string;
  /** The From header, e.g. `Quenchbook <no-reply@example.org>`. */
  from: string;
};

export function isLoopbackHost(host: string): boolean {
  const bare = host.replace(/^\[(.*)\]$/, '$1').toLowerCase();
  if (bare === 'localhost' || bare === '::1') return true;
  return isIP(bare) === 4 && bare.startsWith('127.');
}

export function createMailer(opts: MailerOptions): Mailer {
  const loopback = isLoopbackHost(opts.host);
  const transport = createTransport({
    host: opts.host,
    port: opts.port,
    secure: opts.secure,
    // The local mail catcher speaks plain SMTP. Anywhere else, links that sign people in must
    // not cross the network in clear text, so a server without STARTTLS is an error.
    ignoreTLS: !opts.secure && loopback,
    requireTLS: !opts.secure && !loopback,
    // An empty user (an unset variable in a .env file) means no login, not a blank one.
    auth: opts.user ? { user: opts.user, pass: opts.pass ?? '' } : undefined,
    // Sending happens inside a request: fail within seconds rather than nodemailer's minutes.
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 30_000,
    // Our messages carry only strings; never let content be read from a path or a URL.
    disableFileAccess: true,
    disableUrlAccess: true,
  });
  return {
    async send(mail) {
      await transport.sendMail({
        from: opts.from,
        to: mail.to,
        subject: mail.subject,
        text: mail.text,
        html: mail.html,
      });
    },
    close() {
      transport.close();
    },
  };
}
