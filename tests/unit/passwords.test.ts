import { execFile } from 'node:child_process';
import { pathToFileURL } from 'node:url';
import { promisify } from 'node:util';
import { OWASP_ARGON2ID, TEST_ARGON2ID } from '../../server/passwords/cost';
import { createPasswordHasher, type PasswordHasher } from '../../server/passwords/hasher';

// Reads a PHC string by hand, so the cross-check shares no decoding code with the module.
function parsePhc(encoded: string) {
  const [, variant, version, params, salt, hash] = encoded.split('$');
  const numbers = Object.fromEntries(
    (params ?? '').split(',').map((pair) => {
      const [key, value] = pair.split('=');
      return [key, Number(value)];
    }),
  );
  return {
    variant,
    version,
    m: numbers.m,
    t: numbers.t,
    p: numbers.p,
    salt: new Uint8Array(Buffer.from(salt ?? '', 'base64')),
    hash: new Uint8Array(Buffer.from(hash ?? '', 'base64')),
  };
}

type NobleOpts = { t: number; m: number; p: number; dkLen: number };

// @noble/hashes ships ES modules only, which jest's CommonJS runtime cannot load; plain Node can.
async function nobleArgon2idHex(password: string, salt: Uint8Array, opts: NobleOpts) {
  const script = `
    const { argon2id } = await import(process.argv[1]);
    const [password, saltHex, opts] = JSON.parse(process.argv[2]);
    const bytes = argon2id(password, Buffer.from(saltHex, 'hex'), opts);
    process.stdout.write(Buffer.from(bytes).toString('hex'));`;
  const noble = pathToFileURL(require.resolve('@noble/hashes/argon2.js')).href;
  const input = JSON.stringify([password, Buffer.from(salt).toString('hex'), opts]);
  const { stdout } = await promisify(execFile)(
    process.execPath,
    ['--input-type=module', '-e', script, noble, input],
    { encoding: 'utf8' },
  );
  return stdout;
}

describe('createPasswordHasher', () => {
  let cheap: PasswordHasher;
  let owasp: PasswordHasher;
  let owaspHash: string;
  // Non-ASCII on purpose: both implementations must hash the same UTF-8 bytes.
  const owaspPassword = 'Wasserstand 2,5 l — Grüße ✓';

  beforeAll(async () => {
    cheap = createPasswordHasher({ cost: TEST_ARGON2ID });
    owasp = createPasswordHasher({ cost: OWASP_ARGON2ID });
    owaspHash = await owasp.hash(owaspPassword);
  });

  afterAll(async () => {
    await cheap.close();
    await owasp.close();
  });

  it('verifies the password it hashed and refuses another', async () => {
    const encoded = await cheap.hash('correct horse battery staple');
    await expect(cheap.verify('correct horse battery staple', encoded)).resolves.toBe(true);
    await expect(cheap.verify('correct horse battery stapler', encoded)).resolves.toBe(false);
    await expect(cheap.verify('', encoded)).resolves.toBe(false);
  });

  it('salts each hash at random, so the same password hashes differently', async () => {
    const [first, second] = await Promise.all([cheap.hash('same'), cheap.hash('same')]);
    expect(first).not.toBe(second);
    expect(parsePhc(first ?? '').salt).toHaveLength(16);
    expect(parsePhc(first ?? '').hash).toHaveLength(32);
    await expect(cheap.verify('same', second ?? '')).resolves.toBe(true);
  });

  it('writes argon2id at the OWASP cost into the encoded string', async () => {
    // Source: OWASP Password Storage Cheat Sheet, Argon2id: m=19456 KiB (19 MiB), t=2, p=1
    expect(owaspHash).toMatch(
      /^\$argon2id\$v=19\$m=19456,t=2,p=1\$[A-Za-z0-9+/]{22}\$[A-Za-z0-9+/]{43}$/,
    );
    await expect(owasp.verify(owaspPassword, owaspHash)).resolves.toBe(true);
  });

  it('produces the same bytes as an independent Argon2id implementation', async () => {
    const phc = parsePhc(owaspHash);
    expect(phc).toMatchObject({ variant: 'argon2id', version: 'v=19', m: 19456, t: 2, p: 1 });
    // Source: independent implementation, @noble/hashes argon2id
    const expected = await nobleArgon2idHex(owaspPassword, phc.salt, {
      t: 2,
      m: 19456,
      p: 1,
      dkLen: 32,
    });
    expect(Buffer.from(phc.hash).toString('hex')).toBe(expected);
  });

  it('asks for a rehash only when the string was made at another cost', async () => {
    const cheapHash = await cheap.hash('pw');
    expect(owasp.needsRehash(cheapHash)).toBe(true);
    expect(cheap.needsRehash(owaspHash)).toBe(true);
    expect(owasp.needsRehash(owaspHash)).toBe(false);
    expect(cheap.needsRehash(cheapHash)).toBe(false);
    const moreTime = owaspHash.replace('t=2', 't=3');
    expect(owasp.needsRehash(moreTime)).toBe(true);
  });

  it('answers false, never throws, for strings that are not argon2id hashes', async () => {
    const good = await cheap.hash('pw');
    const malformed = [
      '',
      'pw',
      'not-a-hash',
      good.replace('$argon2id$', '$argon2i$'),
      good.replace('v=19', 'v=16'),
      good.slice(0, good.lastIndexOf('$')),
      `${good}=`,
      good.replace(/\$[^$]+\$[^$]+$/, '$c2FsdA$aGFzaGhhc2hoYXNo'),
      '$2b$12$R9h/cIPz0gi.URNNX3kh2OPST9/PgBkqquzi.Ss7KIUgO2t0jWMUW',
    ];
    for (const encoded of malformed) {
      await expect(cheap.verify('pw', encoded)).resolves.toBe(false);
      expect(cheap.needsRehash(encoded)).toBe(true);
    }
  });

  it('hashes off the main thread, so timers run while ten sign-ins queue for the pool', async () => {
    const hasher = createPasswordHasher({ cost: OWASP_ARGON2ID, maxThreads: 2 });
    let settled = 0;
    const hashes = Array.from({ length: 10 }, (_, i) =>
      hasher.hash(`user-${i}`).finally(() => {
        settled += 1;
      }),
    );
    const settledWhenTimerFired = await new Promise<number>((resolve) =>
      setTimeout(() => resolve(settled), 5),
    );
    expect(settledWhenTimerFired).toBe(0);
    expect(new Set(await Promise.all(hashes)).size).toBe(10);
    await hasher.close();
  });

  it('closes its pool: close resolves, may repeat, and later calls reject', async () => {
    const hasher = createPasswordHasher({ cost: TEST_ARGON2ID });
    await hasher.hash('pw');
    await expect(hasher.close()).resolves.toBeUndefined();
    await expect(hasher.close()).resolves.toBeUndefined();
    await expect(hasher.hash('pw')).rejects.toThrow();
  });
});
