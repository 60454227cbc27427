import { spawn, type ChildProcess } from 'node:child_process';
import { DEMO_LAB_NAME, loadDemoData } from '../fixtures/demo';
import { childEnv, loadConfig, repoRoot } from '../server/config';
import { migrateUp } from '../server/migrate';
import { createRuntime } from '../server/runtime';
import { prepareAppDatabase } from './local-db';
import { startMailCatcher } from './mail-catcher';
import { stopCluster } from './pg-cluster';

// npm run dev: the API under tsx watch (reloads on change) plus the Expo web dev server on
// port 8081, which forwards /api to the API (metro.config.js).
const WEB_DEV_PORT = '8081';

async function main(): Promise<void> {
  const config = loadConfig();
  const db = await prepareAppDatabase(config);
  const runtime = createRuntime(config, db.url);
  await migrateUp(runtime.sequelize);
  if ((await loadDemoData({ config, ...runtime })).loaded)
    console.log(`Loaded the demo data (${DEMO_LAB_NAME}).`);
  await runtime.close();
  // The catcher lives here, not in the API process that tsx watch restarts.
  const stopMail = await startMailCatcher(config);

  const apiUrl = `http://${config.host}:${config.port}`;
  const children: ChildProcess[] = [
    // Each child leads its own process group so that stopping reaches its children too.
    spawn('npx', ['tsx', 'watch', '--clear-screen=false', 'scripts/dev-api.ts'], {
      cwd: repoRoot,
      stdio: 'inherit',
      detached: true,
      env: childEnv({ DATABASE_URL: db.url }),
    }),
    spawn('npx', ['expo', 'start', '--web', '--port', WEB_DEV_PORT], {
      cwd: repoRoot,
      stdio: 'inherit',
      detached: true,
      env: childEnv({ QB_DEV_API_URL: apiUrl, EXPO_NO_TELEMETRY: '1' }),
    }),
  ];
  console.log(
    `\nDev: app at http://localhost:${WEB_DEV_PORT}, API at ${apiUrl}. Ctrl-C stops both.\n`,
  );

  const stop = () => {
    for (const child of children) {
      if (child.pid) process.kill(-child.pid, 'SIGTERM');
    }
    if (db.cluster) stopCluster(db.cluster);
    void stopMail().finally(() => process.exit(0));
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
