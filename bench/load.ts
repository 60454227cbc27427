import { randomBytes } from 'node:crypto';
import { loadConfig } from '../server/config';
import { migrateUp } from '../server/migrate';
import { createRuntime } from '../server/runtime';
import {
  formatResults,
  mib,
  runLoad,
  seedLoadLab,
  type LoadLab,
  type RouteResult,
} from '../tests/support/load';
import { benchDatabase, startServerWithMemory } from './support';

// Issue target: 50 technicians posting timer marks and measurements while 10 viewers read the
// rankings, for 60 s on loopback: 0 errors and 0 non-2xx answers. Each connection is one
// person at a brisk human pace (a technician taps 2 marks and saves 1 measurement a second, a
// viewer reloads the rankings every second). Baseline, same run: one technician and one viewer
// alone, same pace, same server.
const TECHNICIANS = 50;
const VIEWERS = 10;
const PAIRS_PER_TECHNICIAN = 3;
const SECONDS = 60;
const BASELINE_SECONDS = 10;
const RATES = { marks: 2, measurements: 1, rankings: 1 };

const clean = (rs: RouteResult[]) => rs.every((r) => r.errors === 0 && r.non2xx === 0);

export async function benchLoad(): Promise<boolean> {
  console.log(
    `\nload: seeding ${TECHNICIANS} technicians × ${PAIRS_PER_TECHNICIAN} pairs, ${VIEWERS} viewers…`,
  );
  const db = await benchDatabase('qb_bench_load');
  const secret = randomBytes(32).toString('base64url');
  const config = {
    ...loadConfig({ NODE_ENV: 'test', QB_JWT_SECRET: secret, QB_PASSWORD_COST: 'test' }),
    databaseUrl: db.url,
  };
  const runtime = createRuntime(config, db.url);
  let lab: LoadLab;
  try {
    await migrateUp(runtime.sequelize);
    lab = await seedLoadLab(
      { config, hasher: runtime.hasher, mailer: runtime.mailer },
      { technicians: TECHNICIANS, viewers: VIEWERS, pairsPerTechnician: PAIRS_PER_TECHNICIAN },
    );
  } finally {
    await runtime.close();
  }

  const server = await startServerWithMemory({
    NODE_ENV: 'test',
    DATABASE_URL: db.url,
    QB_JWT_SECRET: secret,
    QB_PASSWORD_COST: 'test',
  });
  try {
    console.log(`load: baseline, 1 technician and 1 viewer for ${BASELINE_SECONDS} s…`);
    const alone: LoadLab = {
      ...lab,
      technicians: lab.technicians.slice(0, 1),
      viewerTokens: lab.viewerTokens.slice(0, 1),
    };
    const baseline = await runLoad(alone, {
      url: server.url,
      durationS: BASELINE_SECONDS,
      rates: RATES,
    });
    const before = await server.memory();
    console.log(`load: ${TECHNICIANS} technicians and ${VIEWERS} viewers for ${SECONDS} s…`);
    const loaded = await runLoad(lab, { url: server.url, durationS: SECONDS, rates: RATES });
    const after = await server.memory();

    const requests = loaded.reduce((n, r) => n + r.requests, 0);
    // A connection waits for each answer before the next request, so a slow server answers
    // fewer requests than the pace offers.
    const offered = TECHNICIANS * (RATES.marks + RATES.measurements) + VIEWERS * RATES.rankings;
    console.log(
      `Load: ${TECHNICIANS} technicians (marks ${RATES.marks}/s, measurements ${RATES.measurements}/s each) + ${VIEWERS} viewers (rankings ${RATES.rankings}/s each), ${SECONDS} s`,
    );
    console.log(`  offered ${offered} requests/s, answered ${(requests / SECONDS).toFixed(0)}/s`);
    console.log(formatResults(loaded).join('\n'));
    console.log('  baseline (1 technician, 1 viewer):');
    console.log(formatResults(baseline).join('\n'));
    for (const [i, r] of loaded.entries()) {
      const b = baseline[i]!;
      console.log(
        `  p99 ratio loaded / baseline, ${r.route.split(' ')[0]} ${r.route.split('/').pop()}: ${(r.p99 / Math.max(b.p99, 1)).toFixed(1)}`,
      );
    }
    console.log(
      `  server memory after a full GC, before → after: rss ${mib(before.rss)} → ${mib(after.rss)}, heap used ${mib(before.heapUsed)} → ${mib(after.heapUsed)}`,
    );
    const ok = clean(loaded) && clean(baseline);
    console.log(`  target 0 errors and 0 non-2xx: ${ok ? 'met' : 'NOT met'}`);
    return ok;
  } finally {
    server.stop();
    await db.drop();
  }
}
