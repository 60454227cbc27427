import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { childEnv, repoRoot } from '../server/config';

// npm run test:soak: the reliability checks in their long form (1,000+ hostile requests per
// write route, repeated SIGKILLs and PostgreSQL restarts, a bigger backup round trip), then the
// figures each one measured. QB_SOAK_RUNS raises the hostile requests per route further.

const FILES = [
  'tests/api/hostile-input.test.ts',
  'tests/api/crash-recovery.test.ts',
  'tests/api/database-outage.test.ts',
  'tests/api/backups.test.ts',
];

type Seen = { statuses: Record<string, number>; changes: Record<string, number> };

function read<T>(dir: string, name: string): T | undefined {
  const file = path.join(dir, `${name}.json`);
  return existsSync(file) ? (JSON.parse(readFileSync(file, 'utf8')) as T) : undefined;
}

const list = (counts: Record<string, number>) =>
  Object.entries(counts)
    .sort((a, b) => b[1] - a[1])
    .map(([k, n]) => `${k} ×${n}`)
    .join(', ');

function printHostile(dir: string): void {
  const figures = read<{ runsPerRoute: number; routes: Record<string, Seen> }>(
    dir,
    'hostile-input',
  );
  if (!figures)
    return console.log('\nHostile input: no figures (the test did not run to its end).');
  const routes = Object.entries(figures.routes);
  const total = routes.reduce(
    (n, [, s]) => n + Object.values(s.statuses).reduce((a, b) => a + b, 0),
    0,
  );
  console.log(
    `\nHostile input: ${total} requests to ${routes.length} write routes (${figures.runsPerRoute} cases each)`,
  );
  const statuses: Record<string, number> = {};
  const changes: Record<string, number> = {};
  for (const [route, seen] of routes) {
    console.log(`  ${route}\n    ${list(seen.statuses)}`);
    for (const [k, n] of Object.entries(seen.statuses)) statuses[k] = (statuses[k] ?? 0) + n;
    for (const [k, n] of Object.entries(seen.changes)) changes[k] = (changes[k] ?? 0) + n;
  }
  console.log(`  all answers: ${list(statuses)}`);
  console.log(`  changes sent: ${list(changes)}`);
}

function printOthers(dir: string): void {
  const crash = read<{ cycles: Record<string, number>[] }>(dir, 'crash-recovery');
  console.log('\nSIGKILL during a burst of writes');
  for (const c of crash?.cycles ?? []) {
    console.log(
      `  ${c.acknowledged} acknowledged (all whole), ${c.inFlightAtKill} in flight at the kill: ` +
        `${c.unansweredButStored} stored without an answer, ${c.unansweredNotStored} not stored; ` +
        `restart ${c.restartMs} ms`,
    );
  }
  const outage = read<{
    requests: number;
    unavailable: number;
    slowestMs: number;
    restarts: Record<string, number>[];
  }>(dir, 'database-outage');
  console.log('\nPostgreSQL restarts under load');
  if (outage) {
    console.log(
      `  ${outage.requests} requests, ${outage.unavailable} answered 503 unavailable, slowest ${outage.slowestMs} ms`,
    );
    for (const r of outage.restarts) {
      console.log(
        `  database away ${r.outageMs} ms; first write served ${r.recoveredMs} ms after it was back`,
      );
    }
  }
  const backups = read<{
    rows: number;
    photoFiles: number;
    dumpBytes: number;
    backupMs: number;
    restoreMs: number;
    restoreIntoNewClusterMs: number;
  }>(dir, 'backups');
  console.log('\nBackup round trip');
  if (backups) {
    console.log(
      `  ${backups.rows} rows, ${backups.photoFiles} photo files, dump ${Math.round(backups.dumpBytes / 1024)} KB; ` +
        `backup ${backups.backupMs} ms, restore ${backups.restoreMs} ms ` +
        `(${backups.restoreIntoNewClusterMs} ms into a new private cluster)`,
    );
  }
}

function main(): void {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'qb-soak-'));
  const started = Date.now();
  const result = spawnSync('npx', ['jest', ...FILES, '--selectProjects', 'api'], {
    cwd: repoRoot,
    stdio: 'inherit',
    env: childEnv({ NODE_ENV: 'test', QB_SOAK: '1', QB_FIGURES_DIR: dir }),
  });
  printHostile(dir);
  printOthers(dir);
  console.log(
    `\nSoak ${result.status === 0 ? 'passed' : 'FAILED'} in ${Math.round((Date.now() - started) / 1000)} s`,
  );
  rmSync(dir, { recursive: true, force: true });
  process.exit(result.status ?? 1);
}

main();
