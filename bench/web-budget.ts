import { spawnSync } from 'node:child_process';
import { mkdirSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import { childEnv, loadConfig, repoRoot } from '../server/config';
import { migrateUp } from '../server/migrate';
import { createRuntime } from '../server/runtime';
import { createAccount } from '../server/services/accounts';
import { createLab } from '../server/services/labs';
import { ensureWebBuild } from '../scripts/web-build';
import { launchBrowser, viewports } from '../tests/support/browser';
import { sessionWithPair } from '../tests/support/burn';
import { benchDatabase, startServerProcess } from './support';

// Issue target: the app's first-load JavaScript (what index.html loads) at most 1.3 × that of a
// bare Expo Router app of the same SDK, both exported for the web in this run. Also printed:
// the bytes a cold load of the timer route fetches, which must not include CanvasKit.
const TARGET_RATIO = 1.3;

const SKELETON: Record<string, string> = {
  'package.json': JSON.stringify({
    name: 'bare-router',
    version: '1.0.0',
    private: true,
    main: 'expo-router/entry',
  }),
  'app.json': JSON.stringify({
    expo: {
      name: 'bare-router',
      slug: 'bare-router',
      scheme: 'bare-router',
      web: { bundler: 'metro', output: 'single' },
      plugins: ['expo-router'],
    },
  }),
  'app/_layout.tsx': [
    "import { Stack } from 'expo-router';",
    '',
    'export default function Layout() {',
    '  return <Stack />;',
    '}',
  ].join('\n'),
  'app/index.tsx': [
    "import { Text } from 'react-native';",
    '',
    'export default function Home() {',
    '  return <Text>Hello</Text>;',
    '}',
  ].join('\n'),
};

function exportWeb(projectDir: string, outDir: string): void {
  const result = spawnSync('npx', ['expo', 'export', '--platform', 'web', '--output-dir', outDir], {
    cwd: projectDir,
    stdio: ['ignore', 'ignore', 'inherit'],
    env: childEnv({ EXPO_NO_TELEMETRY: '1', CI: '1' }),
  });
  if (result.status !== 0) throw new Error(`expo export failed in ${projectDir}`);
}

/** The bare app in a temp folder, with the repo's node_modules linked in (same SDK). */
function buildSkeleton(root: string): string {
  const project = path.join(root, 'bare-router');
  for (const [file, text] of Object.entries(SKELETON)) {
    mkdirSync(path.dirname(path.join(project, file)), { recursive: true });
    writeFileSync(path.join(project, file), `${text}\n`);
  }
  symlinkSync(path.join(repoRoot, 'node_modules'), path.join(project, 'node_modules'), 'dir');
  const out = path.join(root, 'bare-router-web');
  exportWeb(project, out);
  return out;
}

type FirstLoad = { files: string[]; raw: number; gzip: number };

/** The scripts index.html names: what every first visit downloads before anything renders. */
function firstLoadJs(webDir: string): FirstLoad {
  const html = readFileSync(path.join(webDir, 'index.html'), 'utf8');
  const sources = [...html.matchAll(/<script[^>]*\ssrc="([^"]+)"/g)].map((m) => m[1]!);
  let raw = 0;
  let gzip = 0;
  for (const src of sources) {
    const bytes = readFileSync(path.join(webDir, src.replace(/^\//, '')));
    raw += bytes.length;
    gzip += gzipSync(bytes).length;
  }
  return { files: sources.map((src) => path.basename(src)), raw, gzip };
}

const kb = (bytes: number) => `${(bytes / 1024).toFixed(0)} KB`;

/** A cold load of the timer route, signed in: every response body, by resource type. */
async function timerRouteBytes(webDir: string) {
  const db = await benchDatabase('qb_bench_web');
  const config = { ...loadConfig({ NODE_ENV: 'test', QB_PASSWORD_COST: 'test' }) };
  const runtime = createRuntime(config, db.url);
  const email = 'web-budget@example.test';
  const password = 'bench password 123';
  await migrateUp(runtime.sequelize);
  const user = await createAccount(
    { config, ...runtime },
    { email, displayName: 'Bench', password },
  );
  const lab = await createLab({ name: 'Web budget lab', creatorId: user.id });
  const { pair } = await sessionWithPair(lab.id, email);
  await runtime.close();
  const server = await startServerProcess({
    NODE_ENV: 'test',
    DATABASE_URL: db.url,
    QB_WEB_DIR: webDir,
    QB_PASSWORD_COST: 'test',
  });
  const browser = await launchBrowser();
  try {
    const signIn = await browser.newContext({ viewport: viewports.phone });
    const page = await signIn.newPage();
    await page.goto(`${server.url}/sign-in`);
    await page.getByTestId('field-email').fill(email);
    await page.getByTestId('field-password').fill(password);
    await page.getByTestId('sign-in-submit').click();
    await page.getByTestId('section-title').waitFor();
    const state = await signIn.storageState();
    await signIn.close();

    // A new context: the cookies of the sign-in, an empty cache.
    const cold = await browser.newContext({ viewport: viewports.phone, storageState: state });
    const timer = await cold.newPage();
    const byType: Record<string, number> = {};
    const urls: string[] = [];
    const reads: Promise<void>[] = [];
    timer.on('response', (response) => {
      urls.push(response.url());
      const type = response.request().resourceType();
      const count = async () => {
        // Redirects have no body.
        const body = await response.body().catch(() => Buffer.alloc(0));
        byType[type] = (byType[type] ?? 0) + body.length;
      };
      reads.push(count());
    });
    await timer.goto(`${server.url}/labs/${lab.id}/burn-tests/pairs/${pair.id}/timer`);
    await timer.getByTestId('lane-treated').waitFor();
    await timer.waitForLoadState('networkidle');
    await Promise.all(reads);
    await cold.close();
    return { byType, canvasKit: urls.filter((u) => /canvaskit/i.test(u)) };
  } finally {
    await browser.close();
    server.stop();
    await db.drop();
  }
}

export async function benchWebBudget(): Promise<boolean> {
  const root = path.join(os.tmpdir(), `qb-web-budget-${process.pid}`);
  rmSync(root, { recursive: true, force: true });
  mkdirSync(root, { recursive: true });
  try {
    console.log('\nweb-budget: exporting the app for the web…');
    const appWeb = path.join(root, 'app-web');
    ensureWebBuild(appWeb, { force: true });
    console.log('web-budget: exporting a bare Expo Router app (one Stack, one Text)…');
    const bareWeb = buildSkeleton(root);

    const app = firstLoadJs(appWeb);
    const bare = firstLoadJs(bareWeb);
    const rawRatio = app.raw / bare.raw;
    const gzipRatio = app.gzip / bare.gzip;
    const versions = ['expo', 'expo-router'].map(
      (name) =>
        `${name} ${(JSON.parse(readFileSync(path.join(repoRoot, 'node_modules', name, 'package.json'), 'utf8')) as { version: string }).version}`,
    );
    console.log(`Web first-load JavaScript (${versions.join(', ')})`);
    console.log(
      `  app:         ${kb(app.raw)} raw, ${kb(app.gzip)} gzip (${app.files.join(', ')})`,
    );
    console.log(
      `  bare router: ${kb(bare.raw)} raw, ${kb(bare.gzip)} gzip (${bare.files.join(', ')})`,
    );
    const ok = rawRatio <= TARGET_RATIO && gzipRatio <= TARGET_RATIO;
    console.log(
      `  ratio app / bare: raw ${rawRatio.toFixed(2)}, gzip ${gzipRatio.toFixed(2)}  (target ≤ ${TARGET_RATIO}: ${ok ? 'met' : 'NOT met'})`,
    );

    const timer = await timerRouteBytes(appWeb);
    const total = Object.values(timer.byType).reduce((a, b) => a + b, 0);
    const parts = Object.entries(timer.byType)
      .sort((a, b) => b[1] - a[1])
      .map(([type, bytes]) => `${type} ${kb(bytes)}`)
      .join(', ');
    console.log(`  timer route, cold load signed in: ${kb(total)} uncompressed (${parts})`);
    console.log(
      `  CanvasKit on the timer route: ${timer.canvasKit.length ? `LOADED (${timer.canvasKit.join(', ')})` : 'not loaded'}`,
    );
    return ok && timer.canvasKit.length === 0;
  } finally {
    rmSync(root, { recursive: true, force: true });
  }
}
