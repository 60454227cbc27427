import { randomBytes } from 'node:crypto';
import { mkdir, readFile, readdir, rename, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { z } from 'zod';
import type { CapturedMail } from './types';

// The mailbox folder is shared between processes (the dev server, jest workers), so the folder
// itself is the contract: one `<stamp>-<id>.json` per message, where the stamp sorts by name.

const ID_PATTERN = /^[A-Za-z0-9_-]{1,64}$/;
const FILE_PATTERN = /^(\d{8}T\d{9}Z)-([A-Za-z0-9_-]{1,64})\.json$/;
const TEMP_SUFFIX = '.partial';

const capturedMailSchema = z.object({
  id: z.string(),
  receivedAt: z.string(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
  html: z.string(),
});

export function newMailId(): string {
  return randomBytes(8).toString('hex');
}

/** `2026-12-02T14:05:09.123Z` → `20261202T140509123Z`: fixed width, so names sort by time. */
function stamp(receivedAt: string): string {
  return new Date(receivedAt).toISOString().replace(/[-:.]/g, '');
}

function isMissing(err: unknown): boolean {
  return (err as NodeJS.ErrnoException | undefined)?.code === 'ENOENT';
}

async function mailFileNames(mailboxDir: string): Promise<string[]> {
  try {
    return (await readdir(mailboxDir)).filter((name) => FILE_PATTERN.test(name));
  } catch (err) {
    if (isMissing(err)) return [];
    throw err;
  }
}

async function readMailFile(file: string): Promise<CapturedMail | undefined> {
  try {
    const parsed = capturedMailSchema.safeParse(JSON.parse(await readFile(file, 'utf8')));
    return parsed.success ? parsed.data : undefined;
  } catch (err) {
    // Another process may clear the mailbox between listing and reading; a file that is not
    // ours (or not JSON) is not mail either. Neither should break the list.
    if (isMissing(err) || err instanceof SyntaxError) return undefined;
    throw err;
  }
}

/**
 * Writes under a temporary name and renames within the same folder, which is atomic, so a
 * reader in another process sees either no file or the whole message.
 */
export async function saveMail(mailboxDir: string, mail: CapturedMail): Promise<void> {
  if (!ID_PATTERN.test(mail.id)) throw new Error(`Not a usable mail id: ${mail.id}`);
  await mkdir(mailboxDir, { recursive: true });
  const name = `${stamp(mail.receivedAt)}-${mail.id}.json`;
  const temp = path.join(mailboxDir, `.${name}.${process.pid}${TEMP_SUFFIX}`);
  await writeFile(temp, JSON.stringify(mail, null, 2), { mode: 0o600 });
  try {
    await rename(temp, path.join(mailboxDir, name));
  } catch (err) {
    await rm(temp, { force: true });
    throw err;
  }
}

/** Newest first; a mailbox folder that does not exist yet is simply empty. */
export async function listMail(mailboxDir: string): Promise<CapturedMail[]> {
  const names = (await mailFileNames(mailboxDir)).sort().reverse();
  const mails = await Promise.all(names.map((name) => readMailFile(path.join(mailboxDir, name))));
  return mails.filter((mail): mail is CapturedMail => mail !== undefined);
}

export async function getMail(mailboxDir: string, id: string): Promise<CapturedMail | undefined> {
  // The id comes from a URL: only our own id alphabet may reach the file system.
  if (!ID_PATTERN.test(id)) return undefined;
  const name = (await mailFileNames(mailboxDir)).find((n) => FILE_PATTERN.exec(n)?.[2] === id);
  return name === undefined ? undefined : readMailFile(path.join(mailboxDir, name));
}

/**
 * Removes captured messages only, so pointing it at the wrong folder cannot do much harm. Files
 * still being written are left alone: their rename would fail and the sender would see an error.
 */
export async function clearMail(mailboxDir: string): Promise<void> {
  let names: string[];
  try {
    names = await readdir(mailboxDir);
  } catch (err) {
    if (isMissing(err)) return;
    throw err;
  }
  const ours = names.filter((n) => FILE_PATTERN.test(n));
  await Promise.all(ours.map((n) => rm(path.join(mailboxDir, n), { force: true })));
}
