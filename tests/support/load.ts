import { randomUUID } from 'node:crypto';
import autocannon from 'autocannon';
import { loadDemoRecipesAndBatches } from '../../fixtures/demo-batches';
import { loadDemoBurns } from '../../fixtures/demo-burns';
import { ChemicalModel } from '../../server/models';
import { createAccount } from '../../server/services/accounts';
import { addSpecimen, createBatch } from '../../server/services/batches';
import { createPair, createSession, updateSession } from '../../server/services/burn-tests';
import type { ServiceDeps } from '../../server/services/deps';
import { createLab } from '../../server/services/labs';
import { addMember } from '../../server/services/members';
import { createRecipe } from '../../server/services/recipes';
import { openSession } from '../../server/services/sessions';
import { checklistItems } from '../../shared/schemas/burn';
import type { Role } from '../../shared/schemas/roles';
import { PASSWORD, uniqueEmail } from './accounts';

// The load scenario shared by tests/api/load.test.ts (a few seconds) and bench/load.ts (60 s):
// technicians tap timer marks and save measurements on their own pairs while viewers reload the
// rankings. Everything is made through the app's services; tokens come from openSession, not
// from sign-ins, so the sign-in rate limit is not part of the load.

export type LoadPair = { id: string; controlId: string; treatedId: string };
export type LoadTechnician = { token: string; pairs: LoadPair[] };
export type LoadLab = {
  labId: string;
  technicians: LoadTechnician[];
  viewerTokens: string[];
};

async function person(deps: ServiceDeps, labId: string, role: Role) {
  const user = await createAccount(deps, {
    email: uniqueEmail(`load-${role}`),
    displayName: `Load ${role}`,
    password: PASSWORD,
  });
  await addMember(labId, user.id, role);
  const { accessToken } = await openSession(deps.config, user.id, {
    ip: '127.0.0.1',
    userAgent: 'load test',
  });
  return { userId: user.id, token: accessToken };
}

/**
 * A lab with the demo's signed-off burns (so the rankings have treatments to rank) and, per
 * technician, a burn session with draft pairs of their own.
 */
export async function seedLoadLab(
  deps: ServiceDeps,
  size: { technicians: number; viewers: number; pairsPerTechnician: number },
): Promise<LoadLab> {
  const lead = await createAccount(deps, {
    email: uniqueEmail('load-manager'),
    displayName: 'Load manager',
    password: PASSWORD,
  });
  const lab = await createLab({ name: `Load lab ${randomUUID().slice(0, 6)}`, creatorId: lead.id });
  await loadDemoRecipesAndBatches(lab.id, lead.id);
  await loadDemoBurns(lab.id, lead.id, lead.id);

  const boric = await ChemicalModel.findOne({ where: { labId: null, referenceKey: 'boric-acid' } });
  const recipe = await createRecipe(lab.id, lead.id, {
    name: 'Load test soak',
    substrate: 'cotton',
    ingredients: [{ chemicalId: boric!.id, amount: 4, unit: 'g_per_100g_water' }],
    mixingTempC: 40,
    soakMinutes: 10,
    dryingMethod: 'rack',
  });
  const { batch } = await createBatch(lab.id, lead.id, {
    clientId: randomUUID(),
    recipeRevisionId: recipe.current.id,
    target: { basis: 'water_mass', grams: 1000 },
    storageTempC: 22,
    weighIns: [{ chemicalId: boric!.id, weighedG: 40 }],
    cautionsAcknowledged: true,
  });

  const technicians: LoadTechnician[] = [];
  for (let t = 0; t < size.technicians; t++) {
    const { userId, token } = await person(deps, lab.id, 'technician');
    const { session } = await createSession(lab.id, userId, {
      clientId: randomUUID(),
      heldAt: new Date().toISOString(),
      place: `Hood ${t + 1}`,
      draft: 'hood',
      igniter: 'butane_lighter',
      orientation: 'vertical',
      exposureS: 12,
    });
    await updateSession(lab.id, session.id, userId, {
      checklist: Object.fromEntries(checklistItems.map((i) => [i.key, true])),
    });
    const pairs: LoadPair[] = [];
    for (let p = 0; p < size.pairsPerTechnician; p++) {
      const { specimen } = await addSpecimen(lab.id, batch.id, {
        clientId: randomUUID(),
        code: `L${t + 1}-${p + 1}`,
        substrate: 'Muslin',
        lengthMm: 300,
        widthMm: 75,
        dryMassBeforeG: 4,
        dryMassAfterG: 4.3,
      });
      const { pair } = await createPair(lab.id, session.id, {
        clientId: randomUUID(),
        treatedSpecimenId: specimen.id,
        control: {
          clientId: randomUUID(),
          code: `L${t + 1}-C${p + 1}`,
          substrate: 'Muslin',
          dryMassG: 4.1,
        },
      });
      pairs.push({
        id: pair.id,
        controlId: pair.lanes[0]!.specimen.id,
        treatedId: pair.lanes[1]!.specimen.id,
      });
    }
    technicians.push({ token, pairs });
  }
  const viewerTokens: string[] = [];
  for (let v = 0; v < size.viewers; v++) {
    viewerTokens.push((await person(deps, lab.id, 'viewer')).token);
  }
  return { labId: lab.id, technicians, viewerTokens };
}

// One run of the timer on a pair: both lanes lit, the flame taken away, out, glow out.
const TAPS = [
  ['control', 'flame_applied', 0],
  ['treated', 'flame_applied', 200],
  ['control', 'flame_removed', 12_000],
  ['treated', 'flame_removed', 12_200],
  ['treated', 'flame_out', 13_500],
  ['control', 'flame_out', 31_000],
  ['treated', 'glow_out', 18_000],
  ['control', 'glow_out', 33_000],
] as const;

const headers = (token: string) => ({
  authorization: `Bearer ${token}`,
  'content-type': 'application/json',
});

/**
 * Every connection is one person: a technician's connection walks the timer across their pairs,
 * one mark per request, each mark with a fresh id; measurements are PUT (idempotent by nature).
 */
function perConnection(
  people: number,
  requestsFor: (index: number) => autocannon.Request[],
): (client: autocannon.Client) => void {
  let next = 0;
  return (client) => client.setRequests(requestsFor(next++ % people));
}

function markRequests(labId: string, tech: LoadTechnician): autocannon.Request[] {
  let tap = 0;
  return [
    {
      method: 'POST',
      headers: headers(tech.token),
      setupRequest: (req) => {
        const run = Math.floor(tap / TAPS.length);
        const pair = tech.pairs[run % tech.pairs.length]!;
        const [lane, kind, offset] = TAPS[tap % TAPS.length]!;
        tap++;
        const mark = {
          id: randomUUID(),
          specimenId: lane === 'control' ? pair.controlId : pair.treatedId,
          kind,
          atMs: run * 60_000 + offset,
        };
        return {
          ...req,
          path: `/api/labs/${labId}/pairs/${pair.id}/marks`,
          body: JSON.stringify({ marks: [mark] }),
        };
      },
    },
  ];
}

function measurementRequests(labId: string, tech: LoadTechnician): autocannon.Request[] {
  let n = 0;
  return [
    {
      method: 'PUT',
      headers: headers(tech.token),
      setupRequest: (req) => {
        const pair = tech.pairs[Math.floor(n / 2) % tech.pairs.length]!;
        const treated = n % 2 === 0;
        n++;
        const specimen = treated ? pair.treatedId : pair.controlId;
        return {
          ...req,
          path: `/api/labs/${labId}/pairs/${pair.id}/measurements/${specimen}`,
          body: JSON.stringify({
            charLengthMm: treated ? 40 + (n % 30) : 250 + (n % 50),
            massBeforeG: 4.2,
            massAfterG: treated ? 3.9 : 1.5,
          }),
        };
      },
    },
  ];
}

export type RouteResult = {
  route: string;
  connections: number;
  requests: number;
  ok: number;
  non2xx: number;
  errors: number;
  timeouts: number;
  p50: number;
  p99: number;
  statusCodes: Record<string, number>;
};

export type LoadOptions = {
  url: string;
  durationS: number;
  /** Requests per second of each connection; unset: as fast as the answers come. */
  rates?: { marks?: number; measurements?: number; rankings?: number };
};

function summarise(route: string, r: autocannon.Result): RouteResult {
  const statusCodes: Record<string, number> = {};
  for (const [code, { count }] of Object.entries(r.statusCodeStats ?? {}))
    statusCodes[code] = count ?? 0;
  return {
    route,
    connections: r.connections,
    requests: r.requests.total,
    ok: r['2xx'],
    non2xx: r.non2xx,
    errors: r.errors,
    timeouts: r.timeouts,
    p50: r.latency.p50,
    p99: r.latency.p99,
    statusCodes,
  };
}

/** The three route groups, each its own autocannon instance, all at once. */
export async function runLoad(lab: LoadLab, options: LoadOptions): Promise<RouteResult[]> {
  const common = { url: options.url, duration: options.durationS, timeout: 10 };
  const techs = lab.technicians;
  const groups: [string, autocannon.Options][] = [
    [
      'POST /api/labs/:labId/pairs/:pairId/marks',
      {
        ...common,
        connections: techs.length,
        connectionRate: options.rates?.marks,
        setupClient: perConnection(techs.length, (i) => markRequests(lab.labId, techs[i]!)),
      },
    ],
    [
      'PUT /api/labs/:labId/pairs/:pairId/measurements/:specimenId',
      {
        ...common,
        connections: techs.length,
        connectionRate: options.rates?.measurements,
        setupClient: perConnection(techs.length, (i) => measurementRequests(lab.labId, techs[i]!)),
      },
    ],
    [
      'GET /api/labs/:labId/rankings',
      {
        ...common,
        connections: lab.viewerTokens.length,
        connectionRate: options.rates?.rankings,
        setupClient: perConnection(lab.viewerTokens.length, (i) => [
          {
            method: 'GET',
            path: `/api/labs/${lab.labId}/rankings`,
            headers: headers(lab.viewerTokens[i]!),
          },
        ]),
      },
    ],
  ];
  return Promise.all(groups.map(async ([route, opts]) => summarise(route, await autocannon(opts))));
}

export const mib = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(1)} MiB`;

export function formatResults(results: RouteResult[]): string[] {
  return results.map(
    (r) =>
      `  ${r.route}\n    ${r.connections} connections, ${r.requests} requests: p50 ${r.p50} ms  p99 ${r.p99} ms  ` +
      `errors ${r.errors} (timeouts ${r.timeouts})  non-2xx ${r.non2xx}  status ${JSON.stringify(r.statusCodes)}`,
  );
}
