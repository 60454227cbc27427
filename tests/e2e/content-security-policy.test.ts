import { mkdtempSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { DEMO_LAB_NAME, DEMO_PASSWORD, demoPeople } from '../../fixtures/demo';
import {
  BatchModel,
  BurnSessionModel,
  ChemicalModel,
  LabModel,
  PhotoModel,
  RecipeModel,
} from '../../server/models';
import { browserTestEnv } from '../support/browser-env';
import { viewports } from '../support/browser';
import { sessionWithPair } from '../support/burn';
import { collectPageErrors } from '../support/page-errors';
import { signInThroughUi } from '../support/ui';
import { waitUntil } from '../support/wait';

jest.setTimeout(300_000);

const env = browserTestEnv({ demo: true });

const manager = demoPeople.find((p) => p.role === 'manager')!;
const technician = demoPeople.find((p) => p.role === 'technician')!;

describe('the Content-Security-Policy of the web app', () => {
  it('allows no inline script, no eval and nothing from another origin', async () => {
    const res = await fetch(`${env.server.url}/sign-in`);
    const policy = res.headers.get('content-security-policy') ?? '';
    expect(policy).toContain("default-src 'self'");
    expect(policy).toContain("script-src 'self' 'wasm-unsafe-eval';");
    expect(policy).toContain("script-src-attr 'none'");
    expect(policy).not.toContain("'unsafe-eval'");
    expect(policy).not.toMatch(/https?:|\*/);
    expect(policy).toContain("frame-ancestors 'none'");
  });

  it('is not violated on any screen, including the chart (CanvasKit) and a photo upload', async () => {
    const lab = await LabModel.findOne({ where: { name: DEMO_LAB_NAME } });
    const labId = lab!.id;
    const recipe = await RecipeModel.findOne({ where: { labId } });
    const batch = await BatchModel.findOne({ where: { labId } });
    const session = await BurnSessionModel.findOne({ where: { labId } });
    const chemical = await ChemicalModel.findOne({ where: { labId: null } });
    const { pair, treatedId } = await sessionWithPair(labId, technician.email);
    const treatedCode = pair.lanes.find((l) => l.specimen.id === treatedId)!.specimen.code;

    const context = await env.browser.newContext({ viewport: viewports.wide });
    const violations: string[] = [];
    // Reported from inside every page, so a violation on any screen reaches the test.
    await context.exposeFunction('reportCspViolation', (v: string) => violations.push(v));
    await context.addInitScript(() => {
      document.addEventListener('securitypolicyviolation', (e) => {
        const report = (window as unknown as { reportCspViolation: (v: string) => void })
          .reportCspViolation;
        report(`${e.violatedDirective} blocked ${e.blockedURI} in ${e.sourceFile}:${e.lineNumber}`);
      });
    });
    const page = await context.newPage();
    const errors = collectPageErrors(page);

    for (const screen of ['/sign-in', '/sign-up', '/forgot-password']) {
      await page.goto(`${env.server.url}${screen}`, { waitUntil: 'networkidle' });
    }
    await signInThroughUi(page, env.server.url, manager.email, DEMO_PASSWORD);
    await page.getByTestId('section-title').filter({ hasText: 'Today' }).waitFor();

    const base = `${env.server.url}/labs/${labId}`;
    const screens = [
      '',
      '/recipes',
      `/recipes/${recipe!.id}`,
      `/recipes/${recipe!.id}/history`,
      '/recipes/new',
      '/batches',
      `/batches/${batch!.id}`,
      `/batches/${batch!.id}/sheet`,
      '/batches/new',
      '/chemicals',
      `/chemicals/${chemical!.id}`,
      '/burn-tests',
      `/burn-tests/sessions/${session!.id}`,
      `/burn-tests/pairs/${pair.id}/timer`,
      '/burn-tests/review',
      '/lab',
      '/lab/criteria',
      '/lab/audit',
      '/account',
      '/rankings/report',
    ];
    for (const screen of screens) {
      await page.goto(`${base}${screen}`, { waitUntil: 'networkidle' });
    }
    // The chart: CanvasKit's wasm is fetched, compiled and draws.
    await page.goto(`${base}/rankings`, { waitUntil: 'networkidle' });
    await page.getByTestId('ranking-chart').locator('canvas').waitFor({ timeout: 60_000 });
    await page.waitForTimeout(500);

    // A photo is chosen, previewed, uploaded and shown from the API.
    await page.goto(`${base}/burn-tests/pairs/${pair.id}`, { waitUntil: 'networkidle' });
    const dir = mkdtempSync(path.join(os.tmpdir(), 'qb-csp-photo-'));
    const file = path.join(dir, 'before.jpg');
    writeFileSync(
      file,
      await sharp({ create: { width: 60, height: 40, channels: 3, background: '#335577' } })
        .jpeg()
        .toBuffer(),
    );
    const chooser = page.waitForEvent('filechooser');
    await page.getByTestId(`add-photo-before-${treatedCode}`).click();
    await (await chooser).setFiles(file);
    await waitUntil(() => PhotoModel.count({ where: { pairId: pair.id } }), 1);
    await page.reload({ waitUntil: 'networkidle' });
    await page.locator('img[src*="/thumbnail"]').first().waitFor();

    expect(violations).toEqual([]);
    expect(errors).toEqual([]);
    await context.close();
  });
});
