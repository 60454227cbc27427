import type { Config } from '../config';
import type { Mailer } from '../mail/sender';
import type { PasswordHasher } from '../passwords/hasher';

/** What services need from outside: built once by the entry point, passed to createApp. */
export type ServiceDeps = { config: Config; hasher: PasswordHasher; mailer: Mailer };

/** Who is asking, for the audit log. */
export type RequestMeta = { ip: string | null; userAgent: string | null };
