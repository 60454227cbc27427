import type { BrowserContext, Page } from 'playwright-core';
import { DEMO_LAB_NAME, DEMO_PASSWORD, demoPeople } from '../../fixtures/demo';
import {
  BatchModel,
  BurnPairModel,
  BurnSessionModel,
  ChemicalModel,
  LabModel,
  RecipeModel,
} from '../../server/models';
import { seriousViolations, tabThrough } from '../support/axe';
import { browserTestEnv } from '../support/browser-env';
import { viewports } from '../support/browser';
import { sessionWithPair } from '../support/burn';
import { signInThroughUi } from '../support/ui';

// axe-core on every main screen at phone size (390×844) with the demo data: no serious or
// critical findings. Then the keyboard: Tab reaches every control, and each has a name.
// Source: axe-core's rule set (WCAG 2.0–2.2 level A and AA, plus its best practices) and the
// impact it gives each finding; accessible names as axe-core computes them.
jest.setTimeout(300_000);

const env = browserTestEnv({ demo: true });

let signedIn: BrowserContext;
let page: Page;
type Ids = Record<
  'lab' | 'recipe' | 'batch' | 'session' | 'pair' | 'draftPair' | 'chemical',
  string
>;
let ids: Ids;

const screens: [string, (i: Ids) => string][] = [
  ['Today', (i) => i.lab],
  ['recipes', (i) => `${i.lab}/recipes`],
  ['recipe', (i) => `${i.lab}/recipes/${i.recipe}`],
  ['new recipe', (i) => `${i.lab}/recipes/new`],
  ['recipe history', (i) => `${i.lab}/recipes/${i.recipe}/history`],
  ['batches', (i) => `${i.lab}/batches`],
  ['batch', (i) => `${i.lab}/batches/${i.batch}`],
  ['new batch', (i) => `${i.lab}/batches/new`],
  ['batch sheet', (i) => `${i.lab}/batches/${i.batch}/sheet`],
  ['chemicals', (i) => `${i.lab}/chemicals`],
  ['chemical', (i) => `${i.lab}/chemicals/${i.chemical}`],
  ['burn tests', (i) => `${i.lab}/burn-tests`],
  ['new burn session', (i) => `${i.lab}/burn-tests/new`],
  ['burn session', (i) => `${i.lab}/burn-tests/sessions/${i.session}`],
  ['pair', (i) => `${i.lab}/burn-tests/pairs/${i.pair}`],
  ['timer', (i) => `${i.lab}/burn-tests/pairs/${i.draftPair}/timer`],
  ['review queue', (i) => `${i.lab}/burn-tests/review`],
  ['rankings', (i) => `${i.lab}/rankings`],
  ['ranking report', (i) => `${i.lab}/rankings/report`],
  ['lab members', (i) => `${i.lab}/lab`],
  ['audit log', (i) => `${i.lab}/lab/audit`],
  ['criteria profiles', (i) => `${i.lab}/lab/criteria`],
  ['account', (i) => `${i.lab}/account`],
];
const pathOf = (name: string) => screens.find(([n]) => n === name)![1](ids);

const manager = demoPeople.find((p) => p.role === 'manager')!;
const technician = demoPeople.find((p) => p.role === 'technician')!;

beforeAll(async () => {
  const lab = await LabModel.findOne({ where: { name: DEMO_LAB_NAME } });
  const labId = lab!.id;
  const recipe = await RecipeModel.findOne({ where: { labId, name: 'Muslin drape soak' } });
  const batch = await BatchModel.findOne({ where: { labId } });
  const session = await BurnSessionModel.findOne({ where: { labId } });
  const signedOff = await BurnPairModel.findOne({ where: { labId, status: 'signed_off' } });
  const chemical = await ChemicalModel.findOne({ where: { referenceKey: 'boric-acid' } });
  // A draft pair, so the timer shows its buttons.
  const draft = await sessionWithPair(labId, technician.email);
  ids = {
    lab: `/labs/${labId}`,
    recipe: recipe!.id,
    batch: batch!.id,
    session: session!.id,
    pair: signedOff!.id,
    draftPair: draft.pair.id,
    chemical: chemical!.id,
  };

  signedIn = await env.browser.newContext({ viewport: viewports.phone });
  page = await signedIn.newPage();
  await signInThroughUi(page, env.server.url, manager.email, DEMO_PASSWORD);
  await page.getByTestId('section-title').filter({ hasText: 'Today' }).waitFor();
});

/** Opens a screen and waits until its title is drawn and its data has arrived. */
async function open(target: Page, path: string): Promise<void> {
  await target.goto(`${env.server.url}${path}`);
  await target
    .locator('[data-testid="section-title"], [data-testid="screen-title"]')
    .first()
    .waitFor();
  await target.waitForLoadState('networkidle');
  await target.waitForTimeout(200);
}

function expectNoViolations(
  name: string,
  violations: Awaited<ReturnType<typeof seriousViolations>>,
) {
  if (violations.length) console.log(`${name}:\n${JSON.stringify(violations, null, 2)}`);
  expect(violations).toEqual([]);
}

describe('every main screen at 390×844', () => {
  it.each(['sign-in', 'sign-up', 'forgot-password'])(
    'has no serious or critical axe violations on /%s (signed out)',
    async (path) => {
      const context = await env.browser.newContext({ viewport: viewports.phone });
      const signedOut = await context.newPage();
      await open(signedOut, `/${path}`);
      expectNoViolations(path, await seriousViolations(signedOut));
      await context.close();
    },
  );

  it.each(screens.map(([name]) => name))(
    'has no serious or critical axe violations on %s',
    async (name) => {
      await open(page, pathOf(name));
      expectNoViolations(name, await seriousViolations(page));
    },
  );
});

describe('the keyboard at 390×844', () => {
  it.each([
    ['sign-in', '/sign-in'],
    ['new recipe', 'new recipe'],
    ['timer', 'timer'],
    ['rankings', 'rankings'],
    ['lab members', 'lab members'],
  ])('reaches every control on %s by Tab, each with an accessible name', async (name, where) => {
    const path = where.startsWith('/') ? where : pathOf(where);
    let target = page;
    let context: BrowserContext | undefined;
    if (where.startsWith('/')) {
      context = await env.browser.newContext({ viewport: viewports.phone });
      target = await context.newPage();
    }
    await open(target, path);
    const { stops, unreached } = await tabThrough(target);
    expect(stops.length).toBeGreaterThan(2);
    const nameless = stops.filter((s) => !s.name);
    if (nameless.length || unreached.length)
      console.log(
        `${name}: nameless ${JSON.stringify(nameless)} unreached ${JSON.stringify(unreached)}`,
      );
    expect(nameless).toEqual([]);
    expect(unreached).toEqual([]);
    await context?.close();
  });
});

describe('the timer at 390×844', () => {
  it('names each lane, so the buttons of the two lanes are told apart', async () => {
    await open(page, pathOf('timer'));
    for (const lane of [/^Control \(untreated\)/, /^Treated/]) {
      await page
        .getByRole('group', { name: lane })
        .getByRole('button', { name: 'Flame applied' })
        .waitFor({ timeout: 5000 });
    }
  });
});
