import { readFileSync } from 'node:fs';
import path from 'node:path';
import { loadConfig } from '../../server/config';
import { ensureWebBuild } from '../../scripts/web-build';

// The quick form of `npm run bench`'s web budget: what index.html loads must not carry Skia.
// Charts load it on first use (lazySkiaView). Two ways it creeps back: Skia's WithSkiaWeb
// imports CanvasKit's loader statically, and Expo's export moves modules shared by two lazy
// chunks (two chart views, each with its own import()) into a common chunk that index.html
// loads up front.
const webDir = loadConfig({ ...process.env, NODE_ENV: 'test' }).webDir;

beforeAll(() => {
  ensureWebBuild(webDir);
});

function firstLoadScripts(): { src: string; text: string }[] {
  const html = readFileSync(path.join(webDir, 'index.html'), 'utf8');
  return [...html.matchAll(/<script[^>]*\ssrc="([^"]+)"/g)].map((m) => ({
    src: m[1]!,
    text: readFileSync(path.join(webDir, m[1]!.replace(/^\//, '')), 'utf8'),
  }));
}

describe('the web export', () => {
  it('loads no Skia or CanvasKit code with the first page', () => {
    const scripts = firstLoadScripts();
    expect(scripts.length).toBeGreaterThan(0);
    const carrying = scripts
      .filter((s) => /CanvasKit|JsiSk/.test(s.text))
      .map((s) => `${s.src} (${(s.text.length / 1024).toFixed(0)} KB)`);
    expect(carrying).toEqual([]);
  });
});
