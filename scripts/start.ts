import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { DEMO_LAB_NAME, DEMO_PASSWORD, demoPeople, loadDemoData } from '../fixtures/demo';
import { loadConfig } from '../server/config';
import { listen } from '../server/index';
import { migrateUp } from '../server/migrate';
import { createRuntime } from '../server/runtime';
import { prepareAppDatabase } from './local-db';
import { startMailCatcher } from './mail-catcher';
import { ClusterError, stopCluster } from './pg-cluster';
import { ensureWebBuild } from './web-build';

// npm start: private PostgreSQL, migrations, demo data on first run, web build when stale,
// then one server on one port. Ctrl-C stops the server and the cluster.

function pidAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

function portTaken(host: string, port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = net.connect({ host, port });
    socket.once('connect', () => {
      socket.destroy();
      resolve(true);
    });
    socket.once('error', () => resolve(false));
  });
}

async function main(): Promise<void> {
  const config = loadConfig();
  const url = `http://${config.host}:${config.port}`;
  const pidFile = path.join(config.dataDir, 'server.pid');
  if (existsSync(pidFile)) {
    const pid = Number(readFileSync(pidFile, 'utf8'));
    if (pidAlive(pid)) {
      console.log(`Quenchbook is already running (process ${pid}) at ${url}`);
      return;
    }
  }
  if (await portTaken(config.host, config.port)) {
    throw new Error(
      `Port ${config.port} on ${config.host} is taken by another program. Set PORT to use another port.`,
    );
  }
  // Claimed before the slow steps, so a second start during the build is told, not raced.
  mkdirSync(config.dataDir, { recursive: true });
  writeFileSync(pidFile, String(process.pid));
  process.on('exit', () => {
    if (existsSync(pidFile) && readFileSync(pidFile, 'utf8') === String(process.pid))
      rmSync(pidFile);
  });

  const db = await prepareAppDatabase(config);
  const runtime = createRuntime(config, db.url);
  const applied = await migrateUp(runtime.sequelize);
  if (applied.length) console.log(`Applied migrations: ${applied.join(', ')}`);
  const stopMail = await startMailCatcher(config);
  const demo = await loadDemoData({ config, ...runtime });
  if (demo.loaded) console.log(`Loaded the demo data (${DEMO_LAB_NAME}).`);
  ensureWebBuild(config.webDir);

  const server = await listen(config, runtime);
  console.log(`\nQuenchbook is running at ${url}`);
  console.log(`Demo lab "${DEMO_LAB_NAME}": sign in with password ${DEMO_PASSWORD} as`);
  for (const p of demoPeople) console.log(`  ${p.email.padEnd(24)} ${p.role}`);
  if (config.mail.fakeSmtp) console.log(`E-mail is captured locally: ${url}/dev/mail`);
  console.log('Press Ctrl-C to stop.\n');

  let stopping = false;
  const stop = async () => {
    if (stopping) return;
    stopping = true;
    console.log('\nStopping…');
    server.closeAllConnections();
    await new Promise((resolve) => server.close(resolve));
    await runtime.close();
    await stopMail();
    if (db.cluster) console.log(`PostgreSQL: ${stopCluster(db.cluster)}`);
    process.exit(0);
  };
  process.on('SIGINT', () => void stop());
  process.on('SIGTERM', () => void stop());
}

main().catch((err: unknown) => {
  console.error(err instanceof ClusterError || err instanceof Error ? err.message : err);
  process.exit(1);
});
