import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { ChemicalModel } from '../../server/models';
import { addSpecimen, createBatch } from '../../server/services/batches';
import { createRecipe } from '../../server/services/recipes';
import { copyPreset } from '../../server/services/criteria-profiles';
import { putMeasurement, signOffPair, submitPair } from '../../server/services/burn-tests';
import sharp from 'sharp';
import { previewImport } from '../../server/services/pair-imports';
import { sessionWithPair, treatedSpecimen } from '../support/burn';
import { pairsCsv, recipeNamed, sitting } from '../support/imports';
import { burnTreatment } from '../support/treatment';
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

/** Sends the prepared body: JSON, CSV text, or multipart with a small JPEG for the photo route. */
async function dispatch(
  test: request.Test,
  prepared: { body?: object; photo?: true; csv?: string },
) {
  if (prepared.csv !== undefined) return test.set('Content-Type', 'text/csv').send(prepared.csv);
  if (!prepared.photo) return test.send(prepared.body);
  for (const [key, value] of Object.entries(prepared.body ?? {})) test.field(key, String(value));
  const jpeg = await sharp({ create: { width: 8, height: 8, channels: 3, background: '#000' } })
    .jpeg()
    .toBuffer();
  return test.attach('photo', jpeg, { filename: 'p.jpg', contentType: 'image/jpeg' });
}

type Capability = 'read' | 'edit' | 'review' | 'manage';
type Route = {
  name: string;
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  capability: Capability;
  ok: number;
  /** Builds the path (and body) against a lab, making a fresh target where the call changes one. */
  prepare: (lab: Lab) => Promise<{ path: string; body?: object; photo?: true; csv?: string }>;
};

// Records to act on, made through the services as the lab's manager.
async function boricId(): Promise<string> {
  const row = await ChemicalModel.findOne({ where: { labId: null, referenceKey: 'boric-acid' } });
  return row!.id;
}
async function submittedPair(lab: Lab): Promise<string> {
  const { pair } = await sessionWithPair(lab.id, lab.manager.email);
  await submitPair(lab.id, pair.id, lab.manager.userId);
  return pair.id;
}
async function pendingImport(lab: Lab): Promise<string> {
  const recipe = `Imported ${randomUUID().slice(0, 8)}`;
  await recipeNamed(lab.id, lab.manager.userId, recipe);
  const csv = pairsCsv([{ ...pairRow, recipe }]);
  return (await previewImport(lab.id, lab.manager.userId, 'old.csv', csv)).importId;
}
const pairRow = {
  ...sitting,
  recipe: 'Imported soak',
  revision: 1,
  substrate: 'Muslin',
  control_char_mm: 300,
  treated_char_mm: 60,
};
async function recipeIn(lab: Lab) {
  return createRecipe(lab.id, lab.manager.userId, {
    name: `Recipe ${randomUUID().slice(0, 8)}`,
    substrate: 'paper',
    ingredients: [{ chemicalId: await boricId(), amount: 4, unit: 'g_per_100g_water' }],
    mixingTempC: 30,
    soakMinutes: 10,
    dryingMethod: 'air',
  });
}
const batchInput = (revisionId: string, chemicalId: string) => ({
  clientId: randomUUID(),
  recipeRevisionId: revisionId,
  target: { basis: 'water_mass' as const, grams: 1000 },
  storageTempC: 25,
  weighIns: [{ chemicalId, weighedG: 40 }],
  cautionsAcknowledged: true as const,
});
async function batchIn(lab: Lab) {
  const recipe = await recipeIn(lab);
  return (
    await createBatch(lab.id, lab.manager.userId, batchInput(recipe.current.id, await boricId()))
  ).batch;
}
const recipeBody = async () => ({
  name: `Recipe ${randomUUID().slice(0, 8)}`,
  substrate: 'paper',
  ingredients: [{ chemicalId: await boricId(), amount: 4, unit: 'g_per_100g_water' }],
  mixingTempC: 30,
  soakMinutes: 10,
  dryingMethod: 'air',
});
const specimenBody = () => ({
  clientId: randomUUID(),
  code: `S-${randomUUID().slice(0, 6)}`,
  substrate: 'paper',
  dryMassBeforeG: 2,
});

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

routes.push(
  {
    name: 'list chemicals',
    method: 'get',
    capability: 'read',
    ok: 200,
    prepare: async (lab) => ({ path: `/api/labs/${lab.id}/chemicals` }),
  },
  {
    name: 'read a chemical',
    method: 'get',
    capability: 'read',
    ok: 200,
    prepare: async (lab) => ({ path: `/api/labs/${lab.id}/chemicals/${await boricId()}` }),
  },
  {
    name: 'add a chemical',
    method: 'post',
    capability: 'edit',
    ok: 201,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/chemicals`,
      body: { name: `Salt ${randomUUID().slice(0, 8)}` },
    }),
  },
  {
    name: 'list recipes',
    method: 'get',
    capability: 'read',
    ok: 200,
    prepare: async (lab) => ({ path: `/api/labs/${lab.id}/recipes` }),
  },
  {
    name: 'write a recipe',
    method: 'post',
    capability: 'edit',
    ok: 201,
    prepare: async (lab) => ({ path: `/api/labs/${lab.id}/recipes`, body: await recipeBody() }),
  },
  {
    name: 'read a recipe',
    method: 'get',
    capability: 'read',
    ok: 200,
    prepare: async (lab) => ({ path: `/api/labs/${lab.id}/recipes/${(await recipeIn(lab)).id}` }),
  },
  {
    name: 'edit a recipe',
    method: 'put',
    capability: 'edit',
    ok: 200,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/recipes/${(await recipeIn(lab)).id}`,
      body: await recipeBody(),
    }),
  },
  {
    name: 'read recipe history',
    method: 'get',
    capability: 'read',
    ok: 200,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/recipes/${(await recipeIn(lab)).id}/revisions`,
    }),
  },
  {
    name: 'plan a batch',
    method: 'post',
    capability: 'read',
    ok: 200,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/batch-plans`,
      body: {
        recipeRevisionId: (await recipeIn(lab)).current.id,
        target: { basis: 'water_mass', grams: 500 },
        storageTempC: 20,
      },
    }),
  },
  {
    name: 'list batches',
    method: 'get',
    capability: 'read',
    ok: 200,
    prepare: async (lab) => ({ path: `/api/labs/${lab.id}/batches` }),
  },
  {
    name: 'record a batch',
    method: 'post',
    capability: 'edit',
    ok: 201,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/batches`,
      body: batchInput((await recipeIn(lab)).current.id, await boricId()),
    }),
  },
  {
    name: 'read a batch',
    method: 'get',
    capability: 'read',
    ok: 200,
    prepare: async (lab) => ({ path: `/api/labs/${lab.id}/batches/${(await batchIn(lab)).id}` }),
  },
  {
    name: 'update a batch',
    method: 'patch',
    capability: 'edit',
    ok: 200,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/batches/${(await batchIn(lab)).id}`,
      body: { notes: 'Stirred twice' },
    }),
  },
  {
    name: 'log a specimen',
    method: 'post',
    capability: 'edit',
    ok: 201,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/batches/${(await batchIn(lab)).id}/specimens`,
      body: specimenBody(),
    }),
  },
  {
    name: 'weigh a specimen after drying',
    method: 'patch',
    capability: 'edit',
    ok: 200,
    prepare: async (lab) => {
      const batch = await batchIn(lab);
      const { specimen } = await addSpecimen(lab.id, batch.id, specimenBody());
      return {
        path: `/api/labs/${lab.id}/batches/${batch.id}/specimens/${specimen.id}`,
        body: { dryMassAfterG: 2.1 },
      };
    },
  },
  {
    name: 'list burn sessions',
    method: 'get',
    capability: 'read',
    ok: 200,
    prepare: async (lab) => ({ path: `/api/labs/${lab.id}/burn-sessions` }),
  },
  {
    name: 'open a burn session',
    method: 'post',
    capability: 'edit',
    ok: 201,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/burn-sessions`,
      body: {
        clientId: randomUUID(),
        heldAt: new Date().toISOString(),
        place: 'Hood',
        draft: 'hood',
        igniter: 'match',
        orientation: 'vertical',
      },
    }),
  },
  {
    name: 'read a burn session',
    method: 'get',
    capability: 'read',
    ok: 200,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/burn-sessions/${(await sessionWithPair(lab.id, lab.manager.email)).session.id}`,
    }),
  },
  {
    name: 'tick the checklist',
    method: 'patch',
    capability: 'edit',
    ok: 200,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/burn-sessions/${(await sessionWithPair(lab.id, lab.manager.email, { checklist: false })).session.id}`,
      body: { checklist: { extinguisher: true } },
    }),
  },
  {
    name: 'add a pair',
    method: 'post',
    capability: 'edit',
    ok: 201,
    prepare: async (lab) => {
      const { session } = await sessionWithPair(lab.id, lab.manager.email);
      const treated = await treatedSpecimen(lab.id, lab.manager.userId);
      return {
        path: `/api/labs/${lab.id}/burn-sessions/${session.id}/pairs`,
        body: {
          clientId: randomUUID(),
          treatedSpecimenId: treated.id,
          control: {
            clientId: randomUUID(),
            code: `C-${randomUUID().slice(0, 6)}`,
            substrate: 'cotton',
            dryMassG: 4,
          },
        },
      };
    },
  },
  {
    name: 'list unburned specimens',
    method: 'get',
    capability: 'read',
    ok: 200,
    prepare: async (lab) => ({ path: `/api/labs/${lab.id}/specimens/unburned` }),
  },
  {
    name: 'read the review queue',
    method: 'get',
    capability: 'read',
    ok: 200,
    prepare: async (lab) => ({ path: `/api/labs/${lab.id}/review-queue` }),
  },
  {
    name: 'read a burn test',
    method: 'get',
    capability: 'read',
    ok: 200,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/pairs/${(await sessionWithPair(lab.id, lab.manager.email)).pair.id}`,
    }),
  },
  {
    name: 'record timer marks',
    method: 'post',
    capability: 'edit',
    ok: 200,
    prepare: async (lab) => {
      const { pair, treatedId } = await sessionWithPair(lab.id, lab.manager.email);
      return {
        path: `/api/labs/${lab.id}/pairs/${pair.id}/marks`,
        body: {
          marks: [{ id: randomUUID(), specimenId: treatedId, kind: 'flame_applied', atMs: 1000 }],
        },
      };
    },
  },
  {
    name: 'save a measurement',
    method: 'put',
    capability: 'edit',
    ok: 200,
    prepare: async (lab) => {
      const { pair, treatedId } = await sessionWithPair(lab.id, lab.manager.email);
      return {
        path: `/api/labs/${lab.id}/pairs/${pair.id}/measurements/${treatedId}`,
        body: { charLengthMm: 40 },
      };
    },
  },
  {
    name: 'submit a test',
    method: 'post',
    capability: 'edit',
    ok: 200,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/pairs/${(await sessionWithPair(lab.id, lab.manager.email)).pair.id}/submit`,
    }),
  },
  {
    name: 'sign off a test',
    method: 'post',
    capability: 'review',
    ok: 200,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/pairs/${await submittedPair(lab)}/sign-off`,
    }),
  },
  {
    name: 'return a test',
    method: 'post',
    capability: 'review',
    ok: 200,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/pairs/${await submittedPair(lab)}/return`,
      body: { comment: 'Measure the control' },
    }),
  },
  {
    name: 'correct a signed-off test',
    method: 'post',
    capability: 'review',
    ok: 200,
    prepare: async (lab) => {
      const { pair, treatedId } = await sessionWithPair(lab.id, lab.manager.email);
      await putMeasurement(lab.id, pair.id, treatedId, { charLengthMm: 40 });
      await submitPair(lab.id, pair.id, lab.manager.userId);
      await signOffPair(lab.id, pair.id, lab.manager.userId);
      return {
        path: `/api/labs/${lab.id}/pairs/${pair.id}/corrections`,
        body: {
          specimenId: treatedId,
          changes: { charLengthMm: 44 },
          reason: 'Re-measured on the scale',
        },
      };
    },
  },
  {
    name: 'upload a photo',
    method: 'post',
    capability: 'edit',
    ok: 201,
    prepare: async (lab) => {
      const { pair, treatedId } = await sessionWithPair(lab.id, lab.manager.email);
      return {
        path: `/api/labs/${lab.id}/pairs/${pair.id}/photos`,
        body: { clientId: randomUUID(), specimenId: treatedId, stage: 'before' },
        photo: true,
      };
    },
  },
  {
    name: 'list criteria profiles',
    method: 'get',
    capability: 'read',
    ok: 200,
    prepare: async (lab) => ({ path: `/api/labs/${lab.id}/criteria-profiles` }),
  },
  {
    name: 'write a criteria profile',
    method: 'post',
    capability: 'manage',
    ok: 201,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/criteria-profiles`,
      body: {
        name: `Rule ${randomUUID().slice(0, 8)}`,
        minSpecimens: 1,
        rules: [{ kind: 'no_flaming_drips', appliesTo: 'each' }],
      },
    }),
  },
  {
    name: 'copy a preset',
    method: 'post',
    capability: 'manage',
    ok: 201,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/criteria-profiles/copy-preset`,
      body: { presetKey: 'ul94-v0' },
    }),
  },
  {
    name: 'edit a criteria profile',
    method: 'put',
    capability: 'manage',
    ok: 200,
    prepare: async (lab) => {
      const p = await copyPreset(lab.id, 'fmvss-302');
      return {
        path: `/api/labs/${lab.id}/criteria-profiles/${p.id}`,
        body: { name: `Edited ${randomUUID().slice(0, 8)}`, minSpecimens: 2, rules: p.rules },
      };
    },
  },
  {
    name: 'delete a criteria profile',
    method: 'delete',
    capability: 'manage',
    ok: 204,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/criteria-profiles/${(await copyPreset(lab.id, 'nfpa-705-field')).id}`,
    }),
  },
  {
    name: 'read the ranking',
    method: 'get',
    capability: 'read',
    ok: 200,
    prepare: async (lab) => ({ path: `/api/labs/${lab.id}/rankings` }),
  },
  {
    name: 'read a treatment of the ranking',
    method: 'get',
    capability: 'read',
    ok: 200,
    prepare: async (lab) => {
      const { key } = await burnTreatment(lab.id, lab.manager.userId, {
        substrate: 'Muslin',
        pairs: [{ controlMm: 300, treatedMm: 60, treatedAfterflameS: 1 }],
      });
      return { path: `/api/labs/${lab.id}/rankings/treatments/${encodeURIComponent(key)}` };
    },
  },
  {
    name: 'download the ranking',
    method: 'get',
    capability: 'read',
    ok: 200,
    prepare: async (lab) => ({ path: `/api/labs/${lab.id}/rankings.csv` }),
  },
  {
    name: 'download the pairs',
    method: 'get',
    capability: 'read',
    ok: 200,
    prepare: async (lab) => ({ path: `/api/labs/${lab.id}/pairs.csv` }),
  },
  {
    name: 'list criteria presets',
    method: 'get',
    capability: 'read',
    ok: 200,
    prepare: async (lab) => ({ path: `/api/labs/${lab.id}/criteria-presets` }),
  },
  {
    name: 'preview a pairs file',
    method: 'post',
    capability: 'edit',
    ok: 201,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/pair-imports/preview`,
      csv: pairsCsv([pairRow]),
    }),
  },
  {
    name: 'accept a pairs file',
    method: 'post',
    capability: 'edit',
    ok: 200,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/pair-imports/${await pendingImport(lab)}/accept`,
    }),
  },
  {
    name: 'discard a pairs file',
    method: 'delete',
    capability: 'edit',
    ok: 204,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/pair-imports/${await pendingImport(lab)}`,
    }),
  },
  {
    name: 'change lab settings',
    method: 'patch',
    capability: 'manage',
    ok: 200,
    prepare: async (lab) => ({
      path: `/api/labs/${lab.id}/settings`,
      body: { weighTolerancePct: 3 },
    }),
  },
);

const roles: Role[] = ['manager', 'technician', 'reviewer', 'viewer'];
const allowed = (role: Role, capability: Capability) =>
  capability === 'read' ||
  role === 'manager' ||
  (capability === 'edit' && role === 'technician') ||
  (capability === 'review' && role === 'reviewer');

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
    const prepared = await route.prepare(labs[where]);
    const res = await dispatch(
      call(route.method, prepared.path).set(bearer(caller.token)),
      prepared,
    );
    expect(res.status).toBe(expected);
    if (expected === 403) expect(res.body.error.code).toBe('forbidden');
    if (expected === 404) expect(res.body.error.code).toBe('not_found');
  });

  it.each(routes)('$name without signing in → 401', async (route) => {
    const prepared = await route.prepare(labs.own);
    const res = await dispatch(call(route.method, prepared.path), prepared);
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it.each(routes)('$name for a lab id that does not exist → 404', async (route) => {
    const prepared = await route.prepare(labs.own);
    const missing = prepared.path.replace(labs.own.id, '00000000-0000-4000-8000-000000000000');
    const res = await dispatch(
      call(route.method, missing).set(bearer(labs.own.manager.token)),
      prepared,
    );
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
