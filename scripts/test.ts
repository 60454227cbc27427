import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import { childEnv, loadConfig, repoRoot } from '../server/config';
import { ensureChromium } from '../tests/support/browser';
import { ensureWebBuild } from './web-build';

// npm test: static checks, then every jest project (unit, API, browser) on a private test
// cluster that the jest set-up starts and stops. Ends with one summary line.

type Step = { name: string; ok: boolean };
const steps: Step[] = [];

function run(name: string, cmd: string, args: string[], env: Record<string, string> = {}): boolean {
  console.log(`\n▶ ${name}`);
  const result = spawnSync(cmd, args, { cwd: repoRoot, stdio: 'inherit', env: childEnv(env) });
  const ok = result.status === 0;
  steps.push({ name, ok });
  return ok;
}

function step(name: string, fn: () => void): void {
  console.log(`\n▶ ${name}`);
  try {
    fn();
    steps.push({ name, ok: true });
  } catch (err) {
    console.error(err instanceof Error ? err.message : err);
    steps.push({ name, ok: false });
  }
}

type JestResults = {
  numPassedTests: number;
  numFailedTests: number;
  numTotalTests: number;
  success: boolean;
};

function main(): void {
  const config = loadConfig();
  // Typed routes for tsc: expo writes .expo/types/router.d.ts without touching tsconfig.json.
  run('typed routes', 'npx', ['expo', 'customize', 'tsconfig.json'], {
    CI: '1',
    EXPO_NO_TELEMETRY: '1',
  });
  run('type check (tsc --noEmit)', 'npx', ['tsc', '--noEmit']);
  run('lint (eslint)', 'npx', ['eslint', '.']);
  run('format (prettier --check)', 'npx', ['prettier', '--check', '.']);
  step('chromium for the browser tests', ensureChromium);
  step('web build', () => void ensureWebBuild(config.webDir));

  const resultsFile = path.join(config.dataDir, 'jest-results.json');
  mkdirSync(config.dataDir, { recursive: true });
  rmSync(resultsFile, { force: true });
  run('tests (jest: unit, api, e2e)', 'npx', ['jest', '--json', `--outputFile=${resultsFile}`], {
    NODE_ENV: 'test',
  });

  const results: JestResults | undefined = existsSync(resultsFile)
    ? (JSON.parse(readFileSync(resultsFile, 'utf8')) as JestResults)
    : undefined;
  console.log('\nSummary');
  for (const s of steps) console.log(`  ${s.ok ? 'ok  ' : 'FAIL'}  ${s.name}`);
  const passed = results?.numPassedTests ?? 0;
  const failed = (results?.numFailedTests ?? 0) + (results ? 0 : 1);
  const allOk = steps.every((s) => s.ok) && results?.success === true;
  if (!results) console.log('  jest wrote no results: the test run itself failed to start.');
  console.log(`tests: ${passed} passed, ${failed} failed`);
  process.exit(allOk ? 0 : 1);
}

main();
