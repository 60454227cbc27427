import { benchHealthDuringSignIns } from './health-during-sign-ins';
import { benchLoad } from './load';
import { benchRanking } from './ranking';
import { benchTimerAccuracy } from './timer-accuracy';
import { benchWebBudget } from './web-budget';

const benchmarks: Record<string, () => Promise<boolean>> = {
  'health-during-sign-ins': benchHealthDuringSignIns,
  'timer-accuracy': benchTimerAccuracy,
  ranking: benchRanking,
  load: benchLoad,
  'web-budget': benchWebBudget,
};

// npm run bench: every benchmark, each printing its figures against a baseline measured in
// the same run. Exits non-zero when a target is missed. `npm run bench -- web-budget ranking`
// runs the ones named.
async function main(): Promise<void> {
  const names = process.argv.slice(2);
  const unknown = names.filter((n) => !(n in benchmarks));
  if (unknown.length) {
    console.error(
      `Unknown benchmark ${unknown.join(', ')}; known: ${Object.keys(benchmarks).join(', ')}`,
    );
    process.exit(2);
  }
  const results: boolean[] = [];
  for (const [name, run] of Object.entries(benchmarks)) {
    if (names.length === 0 || names.includes(name)) results.push(await run());
  }
  process.exit(results.every(Boolean) ? 0 : 1);
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
