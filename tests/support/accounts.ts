import { randomUUID } from 'node:crypto';
import request from 'supertest';
import type { Role } from '../../shared/schemas/roles';
import { createAccount } from '../../server/services/accounts';
import { addMember } from '../../server/services/members';
import type { TestApp } from './app';

export const PASSWORD = 'correct horse battery';

export function uniqueEmail(prefix = 'person'): string {
  return `${prefix}-${randomUUID().slice(0, 8)}@example.test`;
}

export type Person = { userId: string; email: string; token: string };

/** Signs in through the API as an API client and returns the bearer token. */
export async function signInForToken(
  t: TestApp,
  email: string,
  password = PASSWORD,
): Promise<string> {
  const res = await request(t.app)
    .post('/api/auth/sign-in')
    .send({ email, password, tokenDelivery: 'body' });
  if (res.status !== 200)
    throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.accessToken as string;
}

/** Someone who signed up: their own lab, as manager. */
export async function signUpPerson(
  t: TestApp,
  labName = 'Test lab',
): Promise<Person & { labId: string }> {
  const email = uniqueEmail('lead');
  const res = await request(t.app)
    .post('/api/auth/sign-up')
    .send({ email, password: PASSWORD, displayName: 'Lab Lead', labName });
  if (res.status !== 201)
    throw new Error(`sign-up failed: ${res.status} ${JSON.stringify(res.body)}`);
  const token = await signInForToken(t, email);
  return { userId: res.body.me.user.id, email, token, labId: res.body.me.labs[0].id };
}

/** A person added to a lab with a role, through the same services the app uses. */
export async function memberWithRole(t: TestApp, labId: string, role: Role): Promise<Person> {
  const email = uniqueEmail(role);
  const user = await createAccount(t.deps, { email, displayName: `A ${role}`, password: PASSWORD });
  await addMember(labId, user.id, role);
  return { userId: user.id, email, token: await signInForToken(t, email) };
}

/** A signed-in person who belongs to no lab. */
export async function outsider(t: TestApp): Promise<Person> {
  const email = uniqueEmail('outsider');
  const user = await createAccount(t.deps, {
    email,
    displayName: 'An outsider',
    password: PASSWORD,
  });
  return { userId: user.id, email, token: await signInForToken(t, email) };
}

export const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });
