import { loadConfig } from '../server/config';
import { migrateUp } from '../server/migrate';
import { MarkModel } from '../server/models';
import { createRuntime } from '../server/runtime';
import { createAccount } from '../server/services/accounts';
import { createLab } from '../server/services/labs';
import { ensureWebBuild } from '../scripts/web-build';
import { launchBrowser, viewports } from '../tests/support/browser';
import { sessionWithPair } from '../tests/support/burn';
import { benchDatabase, fmt, percentile, startServerProcess } from './support';

// The timer's recorded interval error: 20 marks tapped at scripted intervals inside the page,
// compared with the times stored on the server. Baseline, same run: the page's own scheduling
// jitter for the same intervals, measured without the app.
const MARKS = 20;
const INTERVAL_MS = 400;

export async function benchTimerAccuracy(): Promise<boolean> {
  console.log('\ntimer-accuracy: preparing…');
  const db = await benchDatabase('qb_bench_timer');
  const config = { ...loadConfig({ NODE_ENV: 'test' }), databaseUrl: db.url };
  const runtime = createRuntime(
    { ...config, auth: { ...config.auth, passwordCost: 'test' } },
    db.url,
  );
  await migrateUp(runtime.sequelize);
  const email = 'timer-bench@example.test';
  const password = 'bench password 123';
  const user = await createAccount(
    { config, ...runtime },
    { email, displayName: 'Bench', password },
  );
  const lab = await createLab({ name: 'Bench lab', creatorId: user.id });
  const { pair, treatedId } = await sessionWithPair(lab.id, email);
  ensureWebBuild(config.webDir);
  const server = await startServerProcess({
    NODE_ENV: 'test',
    DATABASE_URL: db.url,
    QB_PASSWORD_COST: 'test',
    QB_RATE_LIMIT_MAX: '1000',
  });
  const browser = await launchBrowser();
  try {
    const page = await browser.newPage({ viewport: viewports.phone });
    // tsx keeps function names with an __name helper that the page does not have.
    await page.addInitScript('globalThis.__name = (f) => f');
    await page.goto(`${server.url}/sign-in`);
    await page.getByTestId('field-email').fill(email);
    await page.getByTestId('field-password').fill(password);
    await page.getByTestId('sign-in-submit').click();
    await page.getByTestId('section-title').waitFor();
    await page.goto(`${server.url}/labs/${lab.id}/burn-tests/pairs/${pair.id}/timer`);
    await page.getByTestId('lane-treated').waitFor();

    // Flame on, flame off, then out / re-ignited alternately: 20 marks on one lane.
    const sequence = [
      'flame_applied',
      'flame_removed',
      ...Array.from({ length: MARKS - 2 }, (_, i) => (i % 2 ? 'reignited' : 'flame_out')),
    ];
    const { scripted, baseline } = await page.evaluate(
      async ([kinds, interval]) => {
        const list = kinds as string[];
        const gap = interval as number;
        const find = (kind: string) =>
          document.querySelector<HTMLElement>(`[data-testid="mark-treated-${kind}"]`);
        const sleepUntil = (t: number) =>
          new Promise<void>((resolve) => {
            const tick = () => (performance.now() >= t ? resolve() : requestAnimationFrame(tick));
            tick();
          });
        // Baseline: the same waits, no app: how late does the page wake?
        const base: number[] = [];
        let start = performance.now();
        for (let i = 1; i < list.length; i++) {
          await sleepUntil(start + i * gap);
          base.push(performance.now() - (start + i * gap));
        }
        const taps: number[] = [];
        start = performance.now();
        for (let i = 0; i < list.length; i++) {
          await sleepUntil(start + i * gap);
          for (;;) {
            const button = find(list[i]!);
            if (button) {
              taps.push(performance.now());
              button.click();
              break;
            }
            await new Promise((r) => requestAnimationFrame(r));
          }
        }
        return { scripted: taps, baseline: base };
      },
      [sequence, INTERVAL_MS] as const,
    );
    await page.getByTestId('sync-ok').waitFor({ timeout: 30_000 });
    const marks = (
      await MarkModel.findAll({
        where: { pairId: pair.id, specimenId: treatedId },
        order: [['atMs', 'ASC']],
      })
    ).map((m) => m.atMs);
    if (marks.length !== MARKS) throw new Error(`expected ${MARKS} marks, stored ${marks.length}`);
    // Intervals as the taps happened (page clock) against the intervals stored.
    const errors = marks
      .slice(1)
      .map((at, i) => Math.abs(at - marks[i]! - (scripted[i + 1]! - scripted[i]!)));
    const median = percentile(errors, 50);
    const max = Math.max(...errors);
    const baseMedian = percentile(baseline.map(Math.abs), 50);
    console.log(
      `Timer: recorded interval error over ${MARKS} scripted marks (${INTERVAL_MS} ms apart)`,
    );
    console.log(`  app:      median ${fmt(median)}  max ${fmt(max)}`);
    console.log(
      `  baseline: page wake-up lateness median ${fmt(baseMedian)}  max ${fmt(Math.max(...baseline))}`,
    );
    console.log(
      `  ratio app/baseline median: ${(median / Math.max(baseMedian, 0.1)).toFixed(2)}; target max ≤ 50 ms: ${max <= 50 ? 'met' : 'NOT met'}`,
    );
    return max <= 50;
  } finally {
    await browser.close();
    server.stop();
    await runtime.close();
    await db.drop();
  }
}
