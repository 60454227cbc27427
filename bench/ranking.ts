import { QueryTypes } from 'sequelize';
import { loadConfig } from '../server/config';
import { migrateUp } from '../server/migrate';
import { createRuntime } from '../server/runtime';
import { createAccount } from '../server/services/accounts';
import { createLab } from '../server/services/labs';
import { computeRankings, fetchPairRows } from '../server/services/rankings';
import { benchDatabase, fmt, percentile, startServerProcess, timedRequest } from './support';

// Issue target: 500 treatments × 20 pairs (10,000 pairs). The ranking over the API at 10
// connections on loopback: p95 ≤ 100 ms, both as the app asks (accepting gzip, as every browser
// does, ~60 kB) and uncompressed (~450 kB). A discarded warm-up burst comes first: right after the
// cold rankings the first burst paid for their garbage collection (p95 88–208 ms in runs of
// 2026-12-02, ~45–70 ms once warm); the cold cost is printed on its own line; the server's time for the ranking against the bare SQL
// fetch of the same rows, in the same run: ratio ≤ 3.
const TREATMENTS = 500;
const PAIRS = 20;
const REQUESTS = 100;
const CONNECTIONS = 10;

// Rows made in bulk with generate_series: the services would take minutes for 10,000 pairs.
const SEED = `
WITH r AS (
  INSERT INTO recipes (id, lab_id, name, substrate)
  SELECT gen_random_uuid(), :labId, 'Bench recipe ' || g, 'cotton' FROM generate_series(1, :treatments) g
  RETURNING id, name),
v AS (
  INSERT INTO recipe_revisions (id, recipe_id, number, mixing_temp_c, soak_minutes, drying_method)
  SELECT gen_random_uuid(), r.id, 1, 40, 10, 'air' FROM r RETURNING id, recipe_id),
b AS (
  INSERT INTO batches (id, lab_id, revision_id, code, client_id, target, storage_temp_c, tolerance_pct, cautions_acknowledged_at, plan)
  SELECT gen_random_uuid(), :labId, v.id, 'BENCH-' || row_number() OVER (), gen_random_uuid(),
         '{"basis":"water_mass","grams":1000}'::jsonb, 20, 2, now(), '{}'::jsonb FROM v RETURNING id)
SELECT count(*) FROM b`;

const PAIRS_SQL = `
WITH s AS (
  INSERT INTO burn_sessions (id, lab_id, client_id, held_at, place, draft, igniter, orientation, checklist_completed_at)
  VALUES (gen_random_uuid(), :labId, gen_random_uuid(), now(), 'Bench hood', 'hood', 'match', 'vertical', now()) RETURNING id),
slots AS (
  SELECT b.id AS batch_id, g AS k, row_number() OVER () AS n FROM batches b, generate_series(1, :pairs) g WHERE b.lab_id = :labId),
t AS (
  INSERT INTO specimens (id, lab_id, batch_id, client_id, code, substrate, dry_mass_before_g, dry_mass_after_g)
  SELECT gen_random_uuid(), :labId, batch_id, gen_random_uuid(), 'T' || n, 'muslin', 4, 4.3 FROM slots RETURNING id, code),
c AS (
  INSERT INTO specimens (id, lab_id, batch_id, client_id, code, substrate, dry_mass_before_g)
  SELECT gen_random_uuid(), :labId, NULL, gen_random_uuid(), 'C' || n, 'muslin', 4 FROM slots RETURNING id, code),
p AS (
  INSERT INTO burn_pairs (id, lab_id, session_id, client_id, control_specimen_id, treated_specimen_id, mode, status)
  SELECT gen_random_uuid(), :labId, s.id, gen_random_uuid(), c.id, t.id, 'simultaneous', 'signed_off'
  FROM t JOIN c ON substr(c.code, 2) = substr(t.code, 2), s RETURNING id, control_specimen_id, treated_specimen_id),
m AS (
  INSERT INTO measurements (id, lab_id, pair_id, specimen_id, char_length_mm, mass_before_g, mass_after_g)
  SELECT gen_random_uuid(), :labId, p.id, x.sid, x.ch, 4, 3.5
  FROM p, LATERAL (VALUES (p.treated_specimen_id, 40 + random() * 120), (p.control_specimen_id, 200 + random() * 100)) x(sid, ch)
  RETURNING pair_id),
k AS (
  INSERT INTO marks (id, lab_id, pair_id, specimen_id, kind, at_ms)
  SELECT gen_random_uuid(), :labId, p.id, x.sid, e.kind, e.t + x.off
  FROM p, LATERAL (VALUES (p.treated_specimen_id, 0), (p.control_specimen_id, 5)) x(sid, off),
       LATERAL (VALUES ('flame_applied', 0), ('flame_removed', 12000), ('flame_out', 12000 + random() * 8000), ('glow_out', 30000)) e(kind, t)
  RETURNING pair_id)
SELECT (SELECT count(*) FROM p) AS pairs, (SELECT count(*) FROM k) AS marks`;

export async function benchRanking(): Promise<boolean> {
  console.log('\nranking: seeding 500 treatments × 20 pairs…');
  const db = await benchDatabase('qb_bench_ranking');
  const config = { ...loadConfig({ NODE_ENV: 'test' }), databaseUrl: db.url };
  const runtime = createRuntime(
    { ...config, auth: { ...config.auth, passwordCost: 'test' } },
    db.url,
  );
  await migrateUp(runtime.sequelize);
  const email = 'ranking-bench@example.test';
  const password = 'bench password 123';
  const user = await createAccount(
    { config, ...runtime },
    { email, displayName: 'Bench', password },
  );
  const lab = await createLab({ name: 'Ranking bench lab', creatorId: user.id });
  const q = runtime.sequelize;
  await q.query(SEED, {
    replacements: { labId: lab.id, treatments: TREATMENTS },
    type: QueryTypes.SELECT,
  });
  const [made] = await q.query<{ pairs: string; marks: string }>(PAIRS_SQL, {
    replacements: { labId: lab.id, pairs: PAIRS },
    type: QueryTypes.SELECT,
  });
  console.log(`ranking: ${made!.pairs} pairs, ${made!.marks} marks`);
  await q.query('ANALYZE');

  // In-process: the bare SQL fetch against the whole ranking, same rows, same run.
  const query = { sort: 'treated_char' as const };
  const time = async (run: () => Promise<unknown>, n: number) => {
    const out: number[] = [];
    for (let i = 0; i < n; i++) {
      const t0 = performance.now();
      await run();
      out.push(performance.now() - t0);
    }
    return out;
  };
  // Both uncached: the ratio is the cost of ranking itself, not of serving a stored answer.
  await time(() => computeRankings(lab.id, query), 3);
  const sqlOnly = await time(() => fetchPairRows(lab.id, query), 20);
  const full = await time(() => computeRankings(lab.id, query), 20);

  const server = await startServerProcess({
    NODE_ENV: 'test',
    DATABASE_URL: db.url,
    QB_PASSWORD_COST: 'test',
    QB_RATE_LIMIT_MAX: '1000',
  });
  try {
    const signIn = await fetch(`${server.url}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ email, password, tokenDelivery: 'body' }),
    });
    if (!signIn.ok) throw new Error(`sign-in answered ${signIn.status}: ${await signIn.text()}`);
    const { accessToken } = (await signIn.json()) as { accessToken: string };
    const url = `${server.url}/api/labs/${lab.id}/rankings`;
    const get = (encoding = 'identity') =>
      timedRequest(url, {
        headers: { Authorization: `Bearer ${accessToken}`, 'Accept-Encoding': encoding },
      });
    // A write moves the lab's data version: the next request ranks again from the database.
    const touch = () =>
      q.query(
        'UPDATE recipes SET name = name WHERE id = (SELECT id FROM recipes WHERE lab_id = :labId LIMIT 1)',
        {
          replacements: { labId: lab.id },
        },
      );
    const cold: number[] = [];
    for (let i = 0; i < 5; i++) {
      await touch();
      cold.push((await get()).ms);
    }
    // 10 connections, REQUESTS in all: as the app asks (gzip, ~60 kB), then uncompressed.
    const burst = async (encoding: string) => {
      const times: number[] = [];
      let next = 0;
      await Promise.all(
        Array.from({ length: CONNECTIONS }, async () => {
          while (next < REQUESTS) {
            next++;
            const { status, ms } = await get(encoding);
            if (status !== 200) throw new Error(`rankings answered ${status}`);
            times.push(ms);
          }
        }),
      );
      return times;
    };
    await burst('gzip');
    const gzipped = await burst('gzip');
    const uncompressed = await burst('identity');
    const p95 = percentile(gzipped, 95);
    const p95Uncompressed = percentile(uncompressed, 95);
    const ratio = percentile(full, 50) / percentile(sqlOnly, 50);
    console.log(`Ranking of ${TREATMENTS} treatments × ${PAIRS} pairs`);
    console.log(
      `  API at ${CONNECTIONS} connections, ${REQUESTS} requests, gzip as the app asks: p50 ${fmt(percentile(gzipped, 50))}  p95 ${fmt(p95)}  (target p95 ≤ 100 ms: ${p95 <= 100 ? 'met' : 'NOT met'})`,
    );
    console.log(
      `  the same, uncompressed: p50 ${fmt(percentile(uncompressed, 50))}  p95 ${fmt(p95Uncompressed)}  (target p95 ≤ 100 ms: ${p95Uncompressed <= 100 ? 'met' : 'NOT met'})`,
    );
    console.log(
      `  first request after a write (ranks again): median ${fmt(percentile(cold, 50))} of ${cold.length}`,
    );
    console.log(
      `  in process: bare SQL fetch median ${fmt(percentile(sqlOnly, 50))}, whole ranking median ${fmt(percentile(full, 50))}`,
    );
    console.log(
      `  ratio ranking / SQL: ${ratio.toFixed(2)}  (target ≤ 3: ${ratio <= 3 ? 'met' : 'NOT met'})`,
    );
    return p95 <= 100 && p95Uncompressed <= 100 && ratio <= 3;
  } finally {
    server.stop();
    await runtime.close();
    await db.drop();
  }
}
