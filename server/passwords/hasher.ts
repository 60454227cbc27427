import { randomBytes } from 'node:crypto';
import path from 'node:path';
import { Piscina } from 'piscina';
import type { Argon2Cost } from './cost';

export type PasswordHasher = {
  /** Argon2id with a random 16-byte salt and a 32-byte hash, as a PHC string. */
  hash(password: string): Promise<string>;
  /** False for a wrong password and for anything that is not a well-formed argon2id string. */
  verify(password: string, encoded: string): Promise<boolean>;
  /** True when the string was made at another cost than the configured one, or is malformed. */
  needsRehash(encoded: string): boolean;
  /** Destroys the worker pool; further hash and verify calls reject. */
  close(): Promise<void>;
};

const SALT_BYTES = 16;
const HASH_BYTES = 32;
// Two cores in production: more threads would only make the hashes compete with each other and
// with the event loop. Further sign-ins queue.
const DEFAULT_MAX_THREADS = 2;
// Each worker keeps its Argon2 memory (about 35 MiB at OWASP cost) until it exits.
const IDLE_TIMEOUT_MS = 30_000;

type Decoded = { cost: Argon2Cost };

// The exact shape argon2 writes. Limits follow the reference implementation's argon2.h, so a
// string accepted here is one argon2 can decode.
const PHC =
  /^\$argon2id\$v=19\$m=(\d{1,10}),t=(\d{1,10}),p=(\d{1,8})\$([A-Za-z0-9+/]+)\$([A-Za-z0-9+/]+)$/;
const MIN_SALT_BYTES = 8;
const MIN_HASH_BYTES = 4;
const MAX_LANES = 0xffffff;

// argon2 rejects padding and non-zero trailing bits; Buffer.from would quietly accept both.
function canonicalBase64Length(text: string): number | undefined {
  const bytes = Buffer.from(text, 'base64');
  return bytes.toString('base64').replace(/=+$/, '') === text ? bytes.length : undefined;
}

function decode(encoded: string): Decoded | undefined {
  const match = PHC.exec(encoded);
  if (!match) return undefined;
  const [, m, t, p, salt, hash] = match;
  const cost = { memoryKiB: Number(m), iterations: Number(t), parallelism: Number(p) };
  const saltLength = canonicalBase64Length(salt ?? '');
  const hashLength = canonicalBase64Length(hash ?? '');
  const valid =
    cost.iterations >= 1 &&
    cost.iterations <= 0xffffffff &&
    cost.parallelism >= 1 &&
    cost.parallelism <= MAX_LANES &&
    cost.memoryKiB >= 8 * cost.parallelism &&
    cost.memoryKiB <= 0xffffffff &&
    saltLength !== undefined &&
    saltLength >= MIN_SALT_BYTES &&
    hashLength !== undefined &&
    hashLength >= MIN_HASH_BYTES;
  return valid ? { cost } : undefined;
}

export function createPasswordHasher(opts: {
  cost: Argon2Cost;
  maxThreads?: number;
}): PasswordHasher {
  const { cost } = opts;
  const pool = new Piscina({
    filename: path.join(__dirname, 'worker.js'),
    maxThreads: opts.maxThreads ?? DEFAULT_MAX_THREADS,
    // Idle workers exit, so a quiet server (or a finished test) holds no threads.
    minThreads: 0,
    idleTimeout: IDLE_TIMEOUT_MS,
  });
  let closing: Promise<void> | undefined;

  // A destroyed piscina pool still accepts tasks and quietly starts new threads for them.
  function assertOpen(): void {
    if (closing) throw new Error('The password hasher is closed.');
  }

  return {
    async hash(password) {
      assertOpen();
      const salt = new Uint8Array(randomBytes(SALT_BYTES));
      const encoded: string = await pool.run(
        { password, salt, hashBytes: HASH_BYTES, cost },
        { name: 'hash' },
      );
      return encoded;
    },

    async verify(password, encoded) {
      assertOpen();
      // A string that cannot be decoded cannot match any password; a stored value mangled this
      // way says nothing about the caller.
      if (decode(encoded) === undefined) return false;
      const matches: boolean = await pool.run({ password, encoded }, { name: 'verify' });
      return matches;
    },

    needsRehash(encoded) {
      const decoded = decode(encoded);
      if (decoded === undefined) return true;
      return (
        decoded.cost.memoryKiB !== cost.memoryKiB ||
        decoded.cost.iterations !== cost.iterations ||
        decoded.cost.parallelism !== cost.parallelism
      );
    },

    close() {
      // The pool is an async resource that destroy() never ends; ending it tells async_hooks
      // (and jest's open-handle check) that nothing is left running.
      closing ??= pool.destroy().then(() => pool.emitDestroy());
      return closing;
    },
  };
}
