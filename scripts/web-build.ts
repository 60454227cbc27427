import { spawnSync } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { childEnv, loadConfig, repoRoot } from '../server/config';

const SOURCES = [
  'app',
  'components',
  'shared',
  'assets',
  'index.ts',
  'app.json',
  'package.json',
  'tsconfig.json',
  'metro.config.js',
  'metro-zod-locales.js',
  'metro-simple-statistics.js',
  'public/index.html',
];

function newestMtime(target: string): number {
  if (!existsSync(target)) return 0;
  const stat = statSync(target);
  if (!stat.isDirectory()) return stat.mtimeMs;
  return readdirSync(target).reduce(
    (newest, entry) => Math.max(newest, newestMtime(path.join(target, entry))),
    stat.mtimeMs,
  );
}

export function webBuildIsStale(webDir: string): boolean {
  const index = path.join(webDir, 'index.html');
  if (!existsSync(index)) return true;
  const sources = Math.max(...SOURCES.map((s) => newestMtime(path.join(repoRoot, s))));
  return sources > statSync(index).mtimeMs;
}

/** The faces public/index.html declares, copied from the font package to public/fonts/. */
export const WEB_FONTS = [
  '400Regular/SourceSans3_400Regular.ttf',
  '600SemiBold/SourceSans3_600SemiBold.ttf',
  '700Bold/SourceSans3_700Bold.ttf',
];

function copyWebFonts(): void {
  const from = path.join(repoRoot, 'node_modules', '@expo-google-fonts', 'source-sans-3');
  const to = path.join(repoRoot, 'public', 'fonts');
  mkdirSync(to, { recursive: true });
  for (const file of WEB_FONTS)
    copyFileSync(path.join(from, file), path.join(to, path.basename(file)));
}

/** Exports the web app with Expo when it is missing or older than its sources. */
export function ensureWebBuild(webDir: string, opts: { force?: boolean } = {}): 'built' | 'fresh' {
  if (!opts.force && !webBuildIsStale(webDir)) return 'fresh';
  console.log('Building the web app (a cold build takes about two minutes)…');
  // CanvasKit's wasm goes to public/, which the export copies to the site root.
  const skia = spawnSync('npx', ['setup-skia-web', 'public'], {
    cwd: repoRoot,
    stdio: 'inherit',
    env: childEnv({}),
  });
  if (skia.status !== 0) throw new Error('Copying canvaskit.wasm failed; see the output above.');
  copyWebFonts();
  const result = spawnSync('npx', ['expo', 'export', '--platform', 'web', '--output-dir', webDir], {
    cwd: repoRoot,
    stdio: 'inherit',
    env: childEnv({ EXPO_NO_TELEMETRY: '1', CI: '1' }),
  });
  if (result.status !== 0) throw new Error('The web build failed; see the output above.');
  return 'built';
}

if (require.main === module) {
  ensureWebBuild(loadConfig().webDir, { force: process.argv.includes('--force') });
}
