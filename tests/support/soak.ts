import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';

// `npm run test:soak` runs the reliability tests in their long form: the same files, with more
// cases, and each file writes the figures it measured for the soak script to print.

export const soak = process.env.QB_SOAK === '1';

/** Hostile requests per write route: 100 in `npm test`, 1,000 or more in the soak. */
export const hostileRunsPerRoute = soak
  ? Math.max(1000, Number(process.env.QB_SOAK_RUNS ?? 0))
  : 100;

/** Writes one test file's figures where the soak script collects them (nothing otherwise). */
export function recordFigures(name: string, figures: unknown): void {
  const dir = process.env.QB_FIGURES_DIR;
  if (!dir) return;
  mkdirSync(dir, { recursive: true });
  writeFileSync(path.join(dir, `${name}.json`), JSON.stringify(figures, null, 2));
}
