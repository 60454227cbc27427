import { mkdirSync } from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { repoRoot } from '../../server/config';

// Git-ignored; kept after the run for people to look at.
export const SCREENSHOT_DIR = path.join(repoRoot, 'artifacts', 'screenshots');

export async function screenshot(page: Page, name: string): Promise<void> {
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  await page.screenshot({ path: path.join(SCREENSHOT_DIR, `${name}.png`), fullPage: true });
}
