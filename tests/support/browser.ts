import { execFileSync, spawnSync } from 'node:child_process';
import { chromium, type Browser } from 'playwright-core';

// Debian's Chromium, never a downloaded browser. These flags keep it off the closed network.
const FLAGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

export function chromiumPath(): string {
  try {
    return execFileSync('sh', ['-c', 'command -v chromium'], { encoding: 'utf8' }).trim();
  } catch {
    throw new Error(
      'Chromium is not installed. Install the Debian package "chromium" (apt-get install chromium); ' +
        '`npm test` does this by itself when run as root.',
    );
  }
}

/** Installs Debian's Chromium when it is missing and we may (root with apt). */
export function ensureChromium(): void {
  if (spawnSync('sh', ['-c', 'command -v chromium']).status === 0) return;
  if (process.getuid?.() !== 0) return;
  console.log("Installing Debian's Chromium for the browser tests…");
  spawnSync('apt-get', ['update', '-qq'], { stdio: 'inherit' });
  spawnSync('apt-get', ['install', '-y', '-qq', 'chromium'], {
    stdio: 'inherit',
    env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
  });
}

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: chromiumPath(), args: FLAGS, headless: true });
}

export const viewports = {
  phone: { width: 390, height: 844 },
  wide: { width: 1280, height: 800 },
} as const;
