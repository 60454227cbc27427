import { benchHealthDuringSignIns } from './health-during-sign-ins';
import { benchLoad } from './load';
import { benchRanking } from './ranking';
import { benchTimerAccuracy } from './timer-accuracy';
import { benchWebBudget } from './web-budget';

// npm run bench: every benchmark, each printing its figures against a baseline measured in
// the same run. Exits non-zero when a target is missed.
async function main(): Promise<void> {
  const results = [
    await benchHealthDuringSignIns(),
    await benchTimerAccuracy(),
    await benchRanking(),
    await benchLoad(),
    await benchWebBudget(),
  ];
  process.exit(results.every(Boolean) ? 0 : 1);
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
