/**
 * The inspection at phone size (390×844) against the real server and web export: the steps stay on one
 * row, the action bar stays at the bottom of the screen however far the page scrolls, a photo on an item
 * shows as its thumbnail, a blocker tapped on the Submit step scrolls to its item and focuses it, a removed
 * photo and a removed reading come back with Undo, every control the inspector touches is at least 44 px
 * high (WCAG 2.2 SC 2.5.5 Target Size (Enhanced): 44 by 44 CSS px; from memory), and the inspection is
 * submitted from the bar. Demo data is invented (the seeded park's Little Kite swing).
 */
import type { Page } from 'playwright-core';

import {
  addReading,
  jpegPhoto,
  screenshot,
  serverAndBrowser,
  sizes,
  startPeriodicInspection,
  swingAmplitude,
  swingPeriod,
} from '@/tests/support/browser/harness';

const app = serverAndBrowser();
const PHONE = sizes.phone;

/** The progress line's counts ("3/9 answered · 0 failed · 2 readings · 1 photos"). */
async function progress(page: Page) {
  const text =
    (await page
      .getByText(/ answered · .* photos$/)
      .first()
      .textContent()) ?? '';
  const m = /(\d+)\/(\d+) answered · (\d+) failed · (\d+) readings · (\d+) photos/.exec(text);
  if (!m) throw new Error(`No progress line: ${text}`);
  return { answered: +m[1], total: +m[2], readings: +m[4], photos: +m[5] };
}

/**
 * Waits until the progress line's `key` reads `value` (up to 5 s), then answers it: the line follows the
 * draft, which an undo-able removal updates in the render after its notice appears.
 */
async function progressReads(page: Page, key: 'readings' | 'photos', value: number): Promise<number> {
  const deadline = Date.now() + 5000;
  let now = (await progress(page))[key];
  while (now !== value && Date.now() < deadline) {
    await page.waitForTimeout(50);
    now = (await progress(page))[key];
  }
  return now;
}

/** Heights of the visible controls that are smaller than `min` px, with their names. */
async function smallTargets(page: Page, min: number) {
  return page.evaluate((floor) => {
    const out: string[] = [];
    const els = document.querySelectorAll('[role=button],[role=radio],[role=link],[role=checkbox],button,a');
    els.forEach((el) => {
      const r = (el as HTMLElement).getBoundingClientRect();
      if (r.width === 0 || r.height === 0) return;
      if (r.height < floor - 0.5) out.push(`${el.getAttribute('aria-label') ?? el.textContent}: ${r.height}`);
    });
    return out;
  }, min);
}

test('an inspection walked at phone size: steps, bar, thumbnail, blocker jump, undo, submit', async () => {
  const page = await app.signedIn('phone', 'inspector@pivotwatch.test');
  await page.waitForURL('**/today');
  await page.getByText('Everything is sent').waitFor({ timeout: 30000 });
  await startPeriodicInspection(page, 'Little Kite');

  // The five steps on one row, inside the screen's width or scrolling sideways, never on two lines.
  const steps = page.getByRole('radiogroup', { name: 'Part of the inspection' }).getByRole('radio');
  await steps.first().waitFor({ timeout: 30000 });
  expect(await steps.count()).toBe(5);
  const boxes = await Promise.all((await steps.all()).map((s) => s.boundingBox()));
  const tops = boxes.map((b) => Math.round(b?.y ?? -1));
  expect(new Set(tops).size).toBe(1);
  await screenshot(page, 'phone-inspection-steps');

  // The bar sits at the bottom of the screen, and stays there when the page scrolls.
  const bar = page.getByRole('toolbar', { name: 'Inspection actions' });
  const before = await bar.boundingBox();
  expect(before).not.toBeNull();
  expect(before!.y + before!.height).toBeLessThanOrEqual(PHONE.height);
  expect(before!.y).toBeGreaterThan(PHONE.height / 2);
  await page.mouse.move(PHONE.width / 2, PHONE.height / 3);
  await page.mouse.wheel(0, 4000);
  await page.waitForTimeout(300);
  expect((await bar.boundingBox())?.y).toBeCloseTo(before!.y, 0);

  // Answer every item Pass, with values, reasons and methods where the template asks.
  const photoButtons = page.getByRole('button', { name: /^Photo for / });
  const labels = await photoButtons.evaluateAll((els) => els.map((e) => e.getAttribute('aria-label') ?? ''));
  expect(labels.length).toBeGreaterThanOrEqual(2);
  const [first, second] = labels.map((l) => l.replace('Photo for ', ''));
  const passes = page.getByRole('radio', { name: /^Pass: / });
  const n = await passes.count();
  for (let i = 0; i < n; i++) await passes.nth(i).click();
  const values = page.locator('input[aria-label]:not([aria-label="Note"]):not([aria-label="What is wrong"])');
  const v = await values.count();
  for (let i = 0; i < v; i++) await values.nth(i).fill('1.5');
  const reasons = page.getByRole('textbox', { name: 'Reason for passing a value over its limit' });
  for (let i = 0; i < (await reasons.count()); i++) await reasons.nth(i).fill('Test value for the walk');
  for (const method of ['Micrometer', 'Dial indicator']) {
    const chips = page.getByRole('radio', { name: method, exact: true });
    const c = await chips.count();
    for (let i = 0; i < c; i++) await chips.nth(i).click();
  }
  const none = page.getByRole('radio', { name: 'None from the register' });
  for (let guard = 0; guard < 10 && (await none.count()) > 0; guard++) await none.first().click();

  // A photo on the first photo item shows on its card as a thumbnail.
  const file = await jpegPhoto(app.browser, 'Arm root weld', { background: '#6b7b86', fontPx: 48 });
  const chooser = page.waitForEvent('filechooser');
  await page.getByRole('button', { name: `Photo for ${first}` }).click();
  await (await chooser).setFiles(file);
  const thumb = page.getByRole('img', { name: `Photo 1 for ${first}` });
  await thumb.waitFor();
  await page.waitForFunction((name) => {
    const el = document.querySelector(`[aria-label="${name}"]`);
    const img = el?.querySelector('img') ?? (el instanceof HTMLImageElement ? el : null);
    return !!img && img.complete && img.naturalWidth > 0;
  }, `Photo 1 for ${first}`);
  await thumb.scrollIntoViewIfNeeded();
  await screenshot(page, 'phone-inspection-item-thumbnail');

  // Every control on the checklist is a full touch target.
  expect(await smallTargets(page, 44)).toEqual([]);

  // Readings: the swing's amplitude and period.
  await bar.getByRole('button', { name: 'Next: Readings' }).click();
  await addReading(page, swingAmplitude('70'));
  await addReading(page, swingPeriod('6.4'));
  await page.getByRole('button', { name: /^Remove .*period/ }).waitFor();
  const withReadings = await progress(page);

  // A reading removed by mistake comes back with Undo.
  await page.getByRole('button', { name: /^Remove .*period/ }).click();
  await page.getByText(/^Reading removed: /).waitFor();
  expect(await progressReads(page, 'readings', withReadings.readings - 1)).toBe(withReadings.readings - 1);
  await screenshot(page, 'phone-inspection-undo-reading');
  await page.getByRole('button', { name: /^Undo: Reading removed/ }).click();
  await page.getByRole('button', { name: /^Remove .*period/ }).waitFor();
  expect(await progressReads(page, 'readings', withReadings.readings)).toBe(withReadings.readings);

  // So does a photo.
  await bar.getByRole('button', { name: 'Next: Photos' }).click();
  await page.getByRole('button', { name: 'Remove photo 1' }).click();
  await page.getByText('Photo removed').waitFor();
  expect(await progressReads(page, 'photos', 0)).toBe(0);
  await page.getByRole('button', { name: /^Undo: Photo removed/ }).click();
  await page.getByRole('button', { name: 'Remove photo 1' }).waitFor();
  expect(await progressReads(page, 'photos', 1)).toBe(1);
  expect(await page.getByRole('button', { name: /^Undo/ }).count()).toBe(0);

  // To Submit through the bar: the second photo item still wants its photo.
  await bar.getByRole('button', { name: 'Next: Loads' }).click();
  await bar.getByRole('button', { name: 'Next: Submit' }).click();
  await page.getByText('Before you submit').waitFor();
  await expectDisabled(bar.getByRole('button', { name: 'Submit inspection' }));
  await screenshot(page, 'phone-inspection-blockers');
  await page.getByRole('link', { name: `Go to: Needs a photo: ${second}` }).click();

  // The checklist opens at that item: in view, focused, saying what is left.
  const card = page.getByRole('group', { name: second, exact: true });
  await card.getByText(`To do: Needs a photo: ${second}`).waitFor();
  await page.waitForFunction((name) => document.activeElement?.getAttribute('aria-label') === name, second);
  await page.waitForTimeout(600); // the smooth scroll
  const box = await card.boundingBox();
  expect(box).not.toBeNull();
  expect(box!.y).toBeGreaterThanOrEqual(0);
  expect(box!.y).toBeLessThan(PHONE.height - 100);
  await screenshot(page, 'phone-inspection-jumped-to-item');

  // Not applicable today: every photo item but the first.
  for (const label of labels.slice(1)) {
    const item = label.replace('Photo for ', '');
    await page.getByRole('radio', { name: `Not applicable: ${item}` }).click();
  }

  // Submit from the bar.
  await page.getByRole('radio', { name: 'Submit' }).click();
  await page.getByText('Ready to submit').waitFor();
  await page.getByRole('checkbox', { name: /make this declaration/ }).click();
  await bar.getByRole('button', { name: 'Submit inspection' }).click();
  await page.waitForURL('**/today');
  await page.getByText(/1 inspection waiting to send|Everything is sent/).waitFor({ timeout: 30000 });
});

async function expectDisabled(locator: ReturnType<Page['getByRole']>) {
  expect(await locator.getAttribute('aria-disabled')).toBe('true');
}
