import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';
import type { AxeResults, ImpactValue } from 'axe-core';

const AXE_SOURCE = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');
const BLOCKING: ImpactValue[] = ['serious', 'critical'];

export type Violation = { rule: string; impact: string; help: string; targets: string[] };

async function injectAxe(page: Page): Promise<void> {
  const present = await page.evaluate(() => 'axe' in window);
  // Evaluated, not added as a script tag: the app's Content-Security-Policy refuses inline
  // scripts, as it should.
  if (!present) await page.evaluate(AXE_SOURCE);
}

/** axe-core's serious and critical findings on the page as it is now. */
export async function seriousViolations(page: Page): Promise<Violation[]> {
  await injectAxe(page);
  const results = await page.evaluate(() =>
    (window as unknown as { axe: { run: (ctx: Document) => Promise<AxeResults> } }).axe.run(
      document,
    ),
  );
  return results.violations
    .filter((v) => v.impact && BLOCKING.includes(v.impact))
    .map((v) => ({
      rule: v.id,
      impact: v.impact!,
      help: v.help,
      targets: v.nodes.map((n) =>
        [n.target.join(' '), n.html.slice(0, 300), n.failureSummary ?? ''].join('\n'),
      ),
    }));
}

export type FocusStop = { tag: string; role: string | null; name: string; testId: string | null };

/**
 * Presses Tab from the top of the page until focus comes back round (or `max` presses), and
 * returns each element focused with its accessible name as axe-core computes it, plus the
 * visible controls that focus never reached.
 */
export async function tabThrough(
  page: Page,
  max = 150,
): Promise<{ stops: FocusStop[]; unreached: string[] }> {
  await injectAxe(page);
  await page.evaluate(() => {
    (document.activeElement as HTMLElement | null)?.blur();
    window.scrollTo(0, 0);
  });
  const stops: FocusStop[] = [];
  const seen = new Set<string>();
  for (let i = 0; i < max; i++) {
    await page.keyboard.press('Tab');
    const stop = await page.evaluate(() => {
      type Axe = {
        setup: (n: Document) => void;
        teardown: () => void;
        commons: { text: { accessibleText: (el: Element) => string } };
      };
      const el = document.activeElement;
      if (!el || el === document.body) return null;
      const axe = (window as unknown as { axe: Axe }).axe;
      axe.setup(document);
      const name = axe.commons.text.accessibleText(el).trim();
      axe.teardown();
      // A stable key for this element, so a second visit means focus went round.
      let key = (el as HTMLElement).dataset.qbFocusKey;
      if (!key) {
        key = String(Math.random());
        (el as HTMLElement).dataset.qbFocusKey = key;
      }
      return {
        key,
        tag: el.tagName.toLowerCase(),
        role: el.getAttribute('role'),
        name,
        testId: el.getAttribute('data-testid'),
      };
    });
    if (!stop) continue;
    if (seen.has(stop.key)) break;
    seen.add(stop.key);
    stops.push({ tag: stop.tag, role: stop.role, name: stop.name, testId: stop.testId });
  }
  const unreached = await page.evaluate(() => {
    const controls = document.querySelectorAll<HTMLElement>(
      'a[href], button, input, select, textarea, [role="button"], [role="link"], [role="checkbox"], [role="radio"], [role="switch"], [role="tab"]',
    );
    return Array.from(controls)
      .filter((el) => {
        const box = el.getBoundingClientRect();
        const visible =
          box.width > 0 && box.height > 0 && getComputedStyle(el).visibility !== 'hidden';
        const disabled = el.matches(':disabled') || el.getAttribute('aria-disabled') === 'true';
        // A control inside another reached control (a link wrapping a button) counts as reached.
        const inside = el.parentElement?.closest('[data-qb-focus-key]');
        return visible && !disabled && !el.dataset.qbFocusKey && !inside;
      })
      .map(
        (el) =>
          `${el.tagName.toLowerCase()}${el.getAttribute('role') ? `[role=${el.getAttribute('role')}]` : ''} ${el.getAttribute('data-testid') ?? ''} "${(el.textContent ?? '').trim().slice(0, 40)}"`,
      );
  });
  return { stops, unreached };
}
