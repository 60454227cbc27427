import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fontFaces } from '../../components/font-faces';
import { browserTestEnv } from '../support/browser-env';
import { viewports } from '../support/browser';
import { seedLab, signInThroughUi } from '../support/ui';
import { waitUntil } from '../support/wait';

// The quick form of `npm run bench`'s web budget.
// - What index.html loads must not carry Skia: charts load it on first use (lazySkiaView). Two
//   ways it creeps back: Skia's WithSkiaWeb imports CanvasKit's loader statically, and Expo's
//   export moves modules shared by two lazy chunks into a common chunk that index.html loads.
// - Nor zod: it loads with the schema kit (components/schemas.ts). A value import of zod or a
//   shared schema outside the kit would pull it back (ESLint refuses those; this checks the build).
// - A new visitor's sign-in screen fetches no zod at all, and once the app is idle it has fetched
//   every screen's chunk and the kit, so screens opened later need no connection.
jest.setTimeout(180_000);

const env = browserTestEnv();
const ZOD = /\$ZodObject/;
const SKIA = /CanvasKit|JsiSk/;

function webDir(): string {
  return env.db.config.webDir;
}

function firstLoadScripts(): { src: string; text: string }[] {
  const html = readFileSync(path.join(webDir(), 'index.html'), 'utf8');
  return [...html.matchAll(/<script[^>]*\ssrc="([^"]+)"/g)].map((m) => ({
    src: m[1]!,
    text: readFileSync(path.join(webDir(), m[1]!.replace(/^\//, '')), 'utf8'),
  }));
}

const carrying = (scripts: { src: string; text: string }[], pattern: RegExp) =>
  scripts
    .filter((s) => pattern.test(s.text))
    .map((s) => `${path.basename(s.src)} (${(s.text.length / 1024).toFixed(0)} KB)`);

describe('the web export', () => {
  it('loads no Skia, CanvasKit or zod code with index.html', () => {
    const scripts = firstLoadScripts();
    expect(scripts.length).toBeGreaterThan(0);
    expect(carrying(scripts, SKIA)).toEqual([]);
    expect(carrying(scripts, ZOD)).toEqual([]);
  });

  it('keeps zod in the one schema-kit chunk', () => {
    const dir = path.join(webDir(), '_expo', 'static', 'js', 'web');
    const chunks = readdirSync(dir)
      .filter((f) => f.endsWith('.js'))
      .map((f) => ({ src: f, text: readFileSync(path.join(dir, f), 'utf8') }));
    expect(carrying(chunks, ZOD).map((c) => c.replace(/-[0-9a-f]{32}\.js.*/, ''))).toEqual([
      'schema-kit',
    ]);
  });
});

describe('the web faces', () => {
  it('are declared in index.html under the family names the styles use, and served as TrueType', async () => {
    const html = readFileSync(path.join(webDir(), 'index.html'), 'utf8');
    const faces = [...html.matchAll(/font-family: '([^']+)';\s*src: url\('([^']+)'\)/g)].map(
      (m) => ({ family: m[1]!, url: m[2]! }),
    );
    expect(faces.map((f) => f.family).sort()).toEqual(Object.values(fontFaces).sort());
    for (const face of faces) {
      expect(html).toMatch(new RegExp(`<link\\s+rel="preload"\\s+href="${face.url}"`));
      const res = await fetch(`${env.server.url}${face.url}`);
      expect([face.url, res.status]).toEqual([face.url, 200]);
      const bytes = Buffer.from(await res.arrayBuffer());
      // TrueType files start with the sfnt version 0x00010000 (OpenType spec, "Table Directory").
      expect(bytes.subarray(0, 4).toString('hex')).toBe('00010000');
    }
  });
});

describe('a cold visit in Chromium (390×844)', () => {
  it('shows the sign-in screen without fetching zod, then fetches every screen while idle', async () => {
    const context = await env.browser.newContext({ viewport: viewports.phone });
    const page = await context.newPage();
    const scripts: { url: string; text: Promise<string> }[] = [];
    page.on('response', (response) => {
      if (response.request().resourceType() === 'script') {
        scripts.push({ url: response.url(), text: response.text().catch(() => '') });
      }
    });
    // With the schema kit unobtainable, the sign-in screen still shows: it needs no zod.
    await page.route('**/schema-kit-*.js', (route) => route.abort('internetdisconnected'));
    await page.goto(`${env.server.url}/`);
    await page.getByTestId('field-email').waitFor();
    const beforeForm = await Promise.all(
      scripts.map(async (s) => ({ src: s.url, text: await s.text })),
    );
    expect(beforeForm.length).toBeGreaterThan(0);
    expect(carrying(beforeForm, ZOD)).toEqual([]);
    // The faces come from index.html's @font-face rules, not from expo-font in the scripts.
    expect(carrying(beforeForm, /fontfaceobserver|ExpoFontLoader/)).toEqual([]);
    await page.evaluate(() => document.fonts.ready);
    expect(
      await page.evaluate(() =>
        Array.from(document.fonts as unknown as Iterable<FontFace>)
          .filter((f) => f.status === 'loaded')
          .map((f) => f.family),
      ),
    ).toContain('Source Sans 3');
    await page.unroute('**/schema-kit-*.js');

    // Signing in checks the form with the kit, fetched now. Once idle, every route's chunk has
    // arrived too; the chart code has not.
    const seeded = await seedLab(env.server.deps, 'Budget lab');
    await signInThroughUi(page, env.server.url, seeded.people.technician.email);
    await page.getByTestId('section-title').filter({ hasText: 'Today' }).waitFor();
    const routeChunks = readdirSync(path.join(webDir(), '_expo', 'static', 'js', 'web')).filter(
      (f) => f.endsWith('.js') && !/^(__|index-|chart-views|LoadSkiaWeb)/.test(f),
    );
    expect(routeChunks.some((f) => f.startsWith('timer-'))).toBe(true);
    const missing = async () =>
      routeChunks.filter((f) => !scripts.some((s) => s.url.endsWith(`/${f}`))).join(', ');
    await waitUntil(missing, '', 20_000);
    expect(scripts.filter((s) => /chart-views|LoadSkiaWeb|canvaskit/i.test(s.url))).toEqual([]);
    await context.close();
  });
});
