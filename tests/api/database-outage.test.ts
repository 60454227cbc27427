import { randomUUID } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import { QueryTypes } from 'sequelize';
import { loadConfig } from '../../server/config';
import { createSequelize } from '../../server/db';
import { migrateUp } from '../../server/migrate';
import {
  clusterFor,
  databaseUrl,
  dropDatabase,
  ensureDatabase,
  startCluster,
  stopCluster,
  type Cluster,
} from '../../scripts/pg-cluster';
import { freePort } from '../../scripts/free-port';
import { PASSWORD, uniqueEmail } from '../support/accounts';
import {
  call,
  serverEnv,
  signUpThrough,
  startServerProcess,
  type Reply,
  type ServerProcess,
} from '../support/killable-server';
import { recordFigures, soak } from '../support/soak';

// PostgreSQL is restarted under load, on a cluster of this file's own (the shared test cluster
// serves other files meanwhile). The server is not restarted: it must answer 503 `unavailable`
// with Retry-After at once while the database is away, report it on /api/health, and serve
// again as soon as the database is back.

const RESTARTS = soak ? 5 : 1;
const DATABASE = 'quenchbook_outage';

let cluster: Cluster;
let dataDir: string;
let server: ServerProcess | undefined;

beforeAll(async () => {
  const config = loadConfig({ ...process.env, NODE_ENV: 'test' });
  cluster = clusterFor(config.dataDir, 'outage', await freePort());
  await startCluster(cluster);
  await dropDatabase(cluster, DATABASE);
  await ensureDatabase(cluster, DATABASE);
  const sequelize = createSequelize(databaseUrl(cluster, DATABASE));
  await migrateUp(sequelize);
  await sequelize.close();
  dataDir = mkdtempSync(path.join(os.tmpdir(), 'qb-outage-'));
}, 120_000);

afterAll(async () => {
  server?.kill('SIGTERM');
  await server?.exited;
  if (cluster) {
    await startCluster(cluster);
    await dropDatabase(cluster, DATABASE);
    stopCluster(cluster);
  }
  rmSync(dataDir, { recursive: true, force: true });
}, 60_000);

type Sample = { at: number; reply?: Reply; error?: string; clientId?: string };

/** Writers and readers in a loop until `stop()`; every answer is kept with its time. */
function load(url: string, token: string, labId: string) {
  const samples: Sample[] = [];
  let running = true;
  const once = async (i: number) => {
    const at = performance.now();
    const clientId = i % 2 === 0 ? randomUUID() : undefined;
    try {
      const reply = clientId
        ? await call(url, `/api/labs/${labId}/burn-sessions`, {
            method: 'POST',
            token,
            body: sessionBody(clientId),
          })
        : await call(url, '/api/me', {
            method: 'PATCH',
            token,
            body: { displayName: `Tester ${i}` },
          });
      samples.push({ at, reply, clientId });
    } catch (err) {
      samples.push({ at, error: String(err), clientId });
    }
  };
  const worker = async (w: number) => {
    for (let i = w; running; i += 4) {
      await once(i);
      await sleep(20);
    }
  };
  const done = Promise.all([0, 1, 2, 3].map(worker));
  return {
    samples,
    stop: async () => {
      running = false;
      await done;
    },
  };
}

const sessionBody = (clientId: string) => ({
  clientId,
  heldAt: new Date().toISOString(),
  place: 'Hood',
  draft: 'hood',
  igniter: 'match',
  orientation: 'vertical',
});

async function healthUntil(url: string, status: number, deadlineMs: number) {
  const started = performance.now();
  while (performance.now() - started < deadlineMs) {
    const reply = await call(url, '/api/health');
    if (reply.status === status) return { reply, afterMs: performance.now() - started };
    await sleep(100);
  }
  throw new Error(`/api/health did not answer ${status} within ${deadlineMs} ms`);
}

describe('PostgreSQL restarted under load', () => {
  it(
    'answers 503 unavailable with Retry-After at once, reports the database down, and recovers without a server restart',
    async () => {
      server = await startServerProcess(
        serverEnv({ DATABASE_URL: databaseUrl(cluster, DATABASE), QB_DATA_DIR: dataDir }),
      );
      const { token, labId } = await signUpThrough(server.url, uniqueEmail('outage'), PASSWORD);
      const traffic = load(server.url, token, labId);
      const restarts: object[] = [];
      try {
        for (let r = 0; r < RESTARTS; r++) {
          await sleep(500);
          const stoppedAt = performance.now();
          stopCluster(cluster);
          const down = await healthUntil(server.url, 503, 10_000);
          expect(down.reply.json).toMatchObject({ status: 'degraded', db: 'down' });
          await sleep(1500);
          await startCluster(cluster);
          const backAt = performance.now();
          await healthUntil(server.url, 200, 20_000);
          const firstWrite = async () => {
            for (;;) {
              const ok = traffic.samples.find(
                (s) => s.at > backAt && s.reply && s.reply.status < 300,
              );
              if (ok) return ok.at + ok.reply!.ms - backAt;
              await sleep(50);
            }
          };
          const recoveredMs = await firstWrite();
          restarts.push({
            outageMs: Math.round(backAt - stoppedAt),
            recoveredMs: Math.round(recoveredMs),
          });
        }
      } finally {
        await traffic.stop();
      }

      const replies = traffic.samples.flatMap((s) => (s.reply ? [s.reply] : []));
      expect(traffic.samples.filter((s) => s.error).map((s) => s.error)).toEqual([]);
      const unavailable = replies.filter((r) => r.status === 503);
      expect(unavailable.length).toBeGreaterThan(0);
      expect(replies.filter((r) => r.status !== 503 && (r.status < 200 || r.status > 299))).toEqual(
        [],
      );
      for (const r of unavailable) {
        expect((r.json as { error: { code: string } }).error.code).toBe('unavailable');
        expect(Number(r.headers.get('retry-after'))).toBeGreaterThan(0);
      }
      // Not a hang: a request during the outage fails within the connect timeout, not later.
      const slowest = Math.max(...replies.map((r) => r.ms));
      expect(slowest).toBeLessThan(6_000);
      // Same process throughout: it recovered on its own.
      expect(process.kill(server.pid, 0)).toBe(true);

      // A client resends the writes that got 503; each session exists once.
      const refused = traffic.samples.filter((s) => s.clientId && s.reply?.status === 503);
      for (const s of refused) {
        const again = await call(server.url, `/api/labs/${labId}/burn-sessions`, {
          method: 'POST',
          token,
          body: sessionBody(s.clientId!),
        });
        expect([200, 201]).toContain(again.status);
      }
      // Every session sent is stored once: answered at first, or after its retry.
      const sent = traffic.samples.flatMap((s) => (s.clientId ? [s.clientId] : []));
      const sequelize = createSequelize(databaseUrl(cluster, DATABASE));
      try {
        const stored = await sequelize.query<{ clientId: string }>(
          'SELECT client_id AS "clientId" FROM burn_sessions WHERE lab_id = :labId',
          { type: QueryTypes.SELECT, replacements: { labId } },
        );
        expect(stored.map((r) => r.clientId).sort()).toEqual([...sent].sort());
      } finally {
        await sequelize.close();
      }

      recordFigures('database-outage', {
        requests: replies.length,
        unavailable: unavailable.length,
        slowestMs: Math.round(slowest),
        restarts,
      });
    },
    soak ? 600_000 : 120_000,
  );
});
