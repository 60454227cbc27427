import request from 'supertest';
import type { Role } from '../../shared/schemas/roles';
import {
  bearer,
  memberWithRole,
  signUpPerson,
  uniqueEmail,
  type Person,
} from '../support/accounts';
import { withTestApp } from '../support/app';

// Every lab route × every role × own lab / another lab, with the exact status expected.
// Not a member (another lab): 404, so another lab's records do not show that they exist.

const t = withTestApp();
type Lab = { id: string; manager: Person; people: Record<Role, Person> };
let labs: { own: Lab; other: Lab };

async function makeLab(name: string): Promise<Lab> {
  const lead = await signUpPerson(t, name);
  const people: Record<Role, Person> = {
    manager: lead,
    technician: await memberWithRole(t, lead.labId, 'technician'),
    reviewer: await memberWithRole(t, lead.labId, 'reviewer'),
    viewer: await memberWithRole(t, lead.labId, 'viewer'),
  };
  return { id: lead.labId, manager: lead, people };
}

beforeAll(async () => {
  labs = { own: await makeLab('Own lab'), other: await makeLab('Other lab') };
});

const call = (method: Route['method'], path: string) => request(t.app)[method](path);

type Capability = 'read' | 'manage';
type Route = {
  name: string;
  method: 'get' | 'post' | 'patch' | 'delete';
  capability: Capability;
  ok: number;
  /** Builds the path (and body) against a lab, making a fresh target where the call changes one. */
  prepare: (lab: Lab) => Promise<{ path: string; body?: object }>;
};

const routes: Route[] = [
  {
    name: 'read the lab',
    method: 'get',
    capability: 'read',
    ok: 200,
    prepare: async (lab) => ({ path: `/api/labs/${lab.id}` }),
  },
  {
    name: 'list members',
    method: 'get',
    capability: 'read',
    ok: 200,
    prepare: async (lab) => ({ path: `/api/labs/${lab.id}/members` }),
  },
  {
    name: 'change a role',
    method: 'patch',
    capability: 'manage',
    ok: 200,
    prepare: async (lab) => {
      const target = await memberWithRole(t, lab.id, 'viewer');
      return { path: `/api/labs/${lab.id}/members/${target.userId}`, body: { role: 'technician' } };
    },
  },
  {
    name: 'remove a member',
    method: 'delete',
    capability: 'manage',
    ok: 204,
    prepare: async (lab) => {
      const target = await memberWithRole(t, lab.id, 'viewer');
      return { path: `/api/labs/${lab.id}/members/${target.userId}` };
    },
  },
  {
    name: 'list invitations',
    method: 'get',
    capability: 'manage',
    ok: 200,
    prepare: async (lab) => ({ path: `/api/labs/${lab.id}/invitations` }),
  },
  {
    name: 'invite',
    method: 'post',
    capability: 'manage',
    ok: 201,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/invitations`,
      body: { email: uniqueEmail('invitee'), role: 'viewer' },
    }),
  },
  {
    name: 'withdraw an invitation',
    method: 'delete',
    capability: 'manage',
    ok: 204,
    prepare: async (lab) => {
      const res = await request(t.app)
        .post(`/api/labs/${lab.id}/invitations`)
        .set(bearer(lab.manager.token))
        .send({ email: uniqueEmail('invitee'), role: 'viewer' });
      return { path: `/api/labs/${lab.id}/invitations/${res.body.id}` };
    },
  },
  {
    name: 'read the audit log',
    method: 'get',
    capability: 'manage',
    ok: 200,
    prepare: async (lab) => ({ path: `/api/labs/${lab.id}/audit` }),
  },
];

const roles: Role[] = ['manager', 'technician', 'reviewer', 'viewer'];
const allowed = (role: Role, capability: Capability) => capability === 'read' || role === 'manager';

const cases = routes.flatMap((route) =>
  roles.flatMap((role) =>
    (['own', 'other'] as const).map((where) => ({
      label: `${route.method.toUpperCase()} ${route.name} as ${role} in ${where} lab`,
      route,
      role,
      where,
      expected: where === 'other' ? 404 : allowed(role, route.capability) ? route.ok : 403,
    })),
  ),
);

describe('lab routes by role', () => {
  it.each(cases)('$label → $expected', async ({ route, role, where, expected }) => {
    const caller = labs.own.people[role];
    const { path, body } = await route.prepare(labs[where]);
    const res = await request(t.app)[route.method](path).set(bearer(caller.token)).send(body);
    expect(res.status).toBe(expected);
    if (expected === 403) expect(res.body.error.code).toBe('forbidden');
    if (expected === 404) expect(res.body.error.code).toBe('not_found');
  });

  it.each(routes)('$name without signing in → 401', async (route) => {
    const { path, body } = await route.prepare(labs.own);
    const res = await request(t.app)[route.method](path).send(body);
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it.each(routes)('$name for a lab id that does not exist → 404', async (route) => {
    const { path, body } = await route.prepare(labs.own);
    const missing = path.replace(labs.own.id, '00000000-0000-4000-8000-000000000000');
    const res = await call(route.method, missing).set(bearer(labs.own.manager.token)).send(body);
    expect(res.status).toBe(404);
  });
});

describe('account routes', () => {
  const accountRoutes = [
    { method: 'get' as const, path: '/api/me', ok: 200 },
    { method: 'patch' as const, path: '/api/me', body: { units: 'us' }, ok: 200 },
    { method: 'post' as const, path: '/api/labs', body: { name: 'Another lab' }, ok: 201 },
    {
      method: 'post' as const,
      path: '/api/auth/password',
      body: { currentPassword: 'wrong one!', newPassword: 'some new password' },
      ok: 400,
    },
  ];

  it.each(roles)('answer every role alike (%s)', async (role) => {
    const caller = labs.own.people[role];
    for (const r of accountRoutes) {
      const res = await request(t.app)[r.method](r.path).set(bearer(caller.token)).send(r.body);
      expect([r.path, res.status]).toEqual([r.path, r.ok]);
    }
  });

  it.each(accountRoutes)('$method $path without signing in → 401', async (r) => {
    expect((await request(t.app)[r.method](r.path).send(r.body)).status).toBe(401);
  });
});
