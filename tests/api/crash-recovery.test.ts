import { randomBytes, randomUUID } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import { freshDatabase, type TestDatabase } from '../support/db';
import {
  call,
  serverEnv,
  signUpThrough,
  startServerProcess,
  type ServerProcess,
} from '../support/killable-server';
import { recordFigures, soak } from '../support/soak';
import { PASSWORD, uniqueEmail } from '../support/accounts';

// The real server is killed with SIGKILL while writes are in flight. Every write it acknowledged
// must be in the database afterwards, and no write may be half there: each one is a transaction
// (a recipe with its revision and ingredients, a batch with its weigh-in, a set of timer marks).

const CYCLES = soak ? 10 : 1;
const WORKERS = 6;

let db: TestDatabase;
let dataDir: string;
let env: Record<string, string>;
let server: ServerProcess | undefined;

beforeAll(async () => {
  db = await freshDatabase();
  dataDir = mkdtempSync(path.join(os.tmpdir(), 'qb-crash-'));
  env = serverEnv({
    DATABASE_URL: db.url,
    QB_DATA_DIR: dataDir,
    // Tokens stay valid across the restart, as they would with a configured secret.
    QB_JWT_SECRET: randomBytes(32).toString('base64url'),
  });
});

afterAll(async () => {
  server?.kill('SIGKILL');
  await server?.exited;
  await db?.drop();
  rmSync(dataDir, { recursive: true, force: true });
});

type Lab = {
  token: string;
  labId: string;
  chemicalIds: string[];
  revisionId: string;
  pair: { id: string; specimenId: string };
};

async function prepareLab(url: string): Promise<Lab> {
  const { token, labId } = await signUpThrough(url, uniqueEmail('crash'), PASSWORD);
  const lab = `/api/labs/${labId}`;
  const chemicals = (await call(url, `${lab}/chemicals`, { token })).json as {
    chemicals: { id: string; reference: boolean }[];
  };
  const chemicalIds = chemicals.chemicals.filter((c) => c.reference).map((c) => c.id);
  const recipe = await call(url, `${lab}/recipes`, {
    method: 'POST',
    token,
    body: recipeBody('Base recipe', chemicalIds),
  });
  const revisionId = (recipe.json as { current: { id: string } }).current.id;
  const batch = await call(url, `${lab}/batches`, {
    method: 'POST',
    token,
    body: batchBody(revisionId, chemicalIds),
  });
  const batchId = (batch.json as { id: string }).id;
  const specimen = await call(url, `${lab}/batches/${batchId}/specimens`, {
    method: 'POST',
    token,
    body: { clientId: randomUUID(), code: 'T-1', substrate: 'Muslin', dryMassBeforeG: 4 },
  });
  const session = await call(url, `${lab}/burn-sessions`, {
    method: 'POST',
    token,
    body: {
      clientId: randomUUID(),
      heldAt: new Date().toISOString(),
      place: 'Hood',
      draft: 'hood',
      igniter: 'match',
      orientation: 'vertical',
    },
  });
  const sessionId = (session.json as { id: string }).id;
  const ticks = {
    extinguisher: true,
    ventilation: true,
    tongs: true,
    secondPerson: true,
    flammablesCleared: true,
  };
  await call(url, `${lab}/burn-sessions/${sessionId}`, {
    method: 'PATCH',
    token,
    body: { checklist: ticks },
  });
  const pair = await call(url, `${lab}/burn-sessions/${sessionId}/pairs`, {
    method: 'POST',
    token,
    body: {
      clientId: randomUUID(),
      treatedSpecimenId: (specimen.json as { id: string }).id,
      control: { clientId: randomUUID(), code: 'C-1', substrate: 'Muslin', dryMassG: 4 },
    },
  });
  const pairJson = pair.json as { id: string; lanes: { specimen: { id: string } }[] };
  return {
    token,
    labId,
    chemicalIds,
    revisionId,
    pair: { id: pairJson.id, specimenId: pairJson.lanes[0]!.specimen.id },
  };
}

const recipeBody = (name: string, chemicalIds: string[]) => ({
  name,
  substrate: 'cotton',
  ingredients: chemicalIds
    .slice(0, 3)
    .map((chemicalId) => ({ chemicalId, amount: 2, unit: 'g_per_100g_water' })),
  mixingTempC: 40,
  soakMinutes: 10,
  dryingMethod: 'rack',
});

const batchBody = (revisionId: string, chemicalIds: string[], clientId: string = randomUUID()) => ({
  clientId,
  recipeRevisionId: revisionId,
  target: { basis: 'water_mass', grams: 1000 },
  storageTempC: 25,
  weighIns: chemicalIds.slice(0, 3).map((chemicalId) => ({ chemicalId, weighedG: 20 })),
  cautionsAcknowledged: true,
});

/** One write of the burst: what was sent, so it can be found (or resent) afterwards. */
type Write = { path: string; body: unknown } & (
  | { kind: 'recipe'; name: string }
  | { kind: 'batch'; clientId: string }
  | { kind: 'marks'; ids: string[] }
);

function nextWrite(lab: Lab, n: number): Write {
  const base = `/api/labs/${lab.labId}`;
  switch (n % 3) {
    case 0: {
      const name = `Crash recipe ${randomUUID()}`;
      return {
        kind: 'recipe',
        name,
        path: `${base}/recipes`,
        body: recipeBody(name, lab.chemicalIds),
      };
    }
    case 1: {
      const clientId = randomUUID();
      return {
        kind: 'batch',
        clientId,
        path: `${base}/batches`,
        body: batchBody(lab.revisionId, lab.chemicalIds, clientId),
      };
    }
    default: {
      const ids = [randomUUID(), randomUUID(), randomUUID()];
      return {
        kind: 'marks',
        ids,
        path: `${base}/pairs/${lab.pair.id}/marks`,
        body: {
          marks: ids.map((id, i) => ({
            id,
            specimenId: lab.pair.specimenId,
            kind: 'flaming_drip',
            atMs: n * 10 + i,
          })),
        },
      };
    }
  }
}

/**
 * Writers send writes back to back; once `killAfter` have been acknowledged, the server gets
 * SIGKILL while the others are still in flight.
 */
async function burstAndKill(url: string, lab: Lab, target: ServerProcess, killAfter: number) {
  const acknowledged: Write[] = [];
  const unanswered: Write[] = [];
  let inFlightAtKill = 0;
  let inFlight = 0;
  let n = 0;
  let killed = false;
  const worker = async () => {
    while (!killed) {
      const write = nextWrite(lab, n++);
      inFlight++;
      try {
        const reply = await call(url, write.path, {
          method: 'POST',
          token: lab.token,
          body: write.body,
        });
        if (reply.status >= 200 && reply.status < 300) acknowledged.push(write);
        else throw new Error(`write refused: ${reply.status} ${JSON.stringify(reply.json)}`);
      } catch (err) {
        if (!killed) throw err;
        unanswered.push(write);
      } finally {
        inFlight--;
      }
      if (!killed && acknowledged.length >= killAfter && inFlight > 0) {
        killed = true;
        inFlightAtKill = inFlight;
        target.kill('SIGKILL');
      }
    }
  };
  await Promise.all(Array.from({ length: WORKERS }, worker));
  return { acknowledged, unanswered, inFlightAtKill };
}

const rows = <T extends object>(sql: string, replacements: Record<string, unknown> = {}) =>
  db.sequelize.query<T>(sql, { type: QueryTypes.SELECT, replacements });

/** How much of a write is in the database: 'whole', 'none', or 'part' (which must never be). */
async function presence(write: Write): Promise<'whole' | 'none' | 'part'> {
  if (write.kind === 'recipe') {
    const found = await rows<{ ingredients: number }>(
      `SELECT count(i.id)::int AS ingredients FROM recipes r
         LEFT JOIN recipe_revisions v ON v.recipe_id = r.id
         LEFT JOIN ingredients i ON i.revision_id = v.id
        WHERE r.name = :name GROUP BY r.id`,
      { name: write.name },
    );
    if (found.length === 0) return 'none';
    return found.length === 1 && found[0]!.ingredients === 3 ? 'whole' : 'part';
  }
  if (write.kind === 'batch') {
    const found = await rows<{ weighIns: number }>(
      `SELECT count(w.id)::int AS "weighIns" FROM batches b
         LEFT JOIN weigh_ins w ON w.batch_id = b.id
        WHERE b.client_id = :clientId GROUP BY b.id`,
      { clientId: write.clientId },
    );
    if (found.length === 0) return 'none';
    return found[0]!.weighIns === 3 ? 'whole' : 'part';
  }
  const [count] = await rows<{ n: number }>(
    'SELECT count(*)::int AS n FROM marks WHERE id IN (:ids)',
    {
      ids: write.ids,
    },
  );
  return count!.n === 0 ? 'none' : count!.n === 3 ? 'whole' : 'part';
}

describe('a server killed with SIGKILL during a burst of writes', () => {
  it(
    'keeps every acknowledged write whole, leaves none half-written, and takes retries once',
    async () => {
      server = await startServerProcess(env);
      const lab = await prepareLab(server.url);
      const cycles: object[] = [];
      for (let cycle = 0; cycle < CYCLES; cycle++) {
        const killAfter = 20 + Math.floor(Math.random() * 40);
        const burst = await burstAndKill(server.url, lab, server, killAfter);
        expect(await server.exited).toBe('SIGKILL');

        const acknowledged = await Promise.all(burst.acknowledged.map(presence));
        expect(acknowledged.filter((p) => p !== 'whole')).toEqual([]);
        const unanswered = await Promise.all(burst.unanswered.map(presence));
        expect(unanswered.filter((p) => p === 'part')).toEqual([]);

        const restartedAt = performance.now();
        server = await startServerProcess(env);
        const restartMs = performance.now() - restartedAt;
        expect((await call(server.url, '/api/health')).status).toBe(200);

        // The client resends what got no answer; batches and marks are idempotent by their ids.
        for (const write of burst.unanswered) {
          if (write.kind === 'recipe') continue;
          const again = await call(server.url, write.path, {
            method: 'POST',
            token: lab.token,
            body: write.body,
          });
          expect([200, 201]).toContain(again.status);
          expect(await presence(write)).toBe('whole');
        }
        const [dupes] = await rows<{ n: number }>(
          'SELECT count(*)::int AS n FROM (SELECT client_id FROM batches GROUP BY lab_id, client_id HAVING count(*) > 1) d',
        );
        expect(dupes!.n).toBe(0);
        cycles.push({
          acknowledged: burst.acknowledged.length,
          inFlightAtKill: burst.inFlightAtKill,
          unansweredButStored: unanswered.filter((p) => p === 'whole').length,
          unansweredNotStored: unanswered.filter((p) => p === 'none').length,
          restartMs: Math.round(restartMs),
        });
      }
      recordFigures('crash-recovery', { cycles });
    },
    soak ? 900_000 : 120_000,
  );
});
