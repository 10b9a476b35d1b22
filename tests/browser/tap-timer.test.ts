/**
 * The tap timer in Chromium at phone size, against the real server and web export: short touches (held
 * 0–20 ms, sent through the DevTools protocol as a touchscreen would), short mouse clicks, touchscreen
 * taps and key presses are each counted once, at the moment they go down, and the period shown is the
 * spacing of the taps. Then the timed period, far from the ride's design swing, is held back until the
 * inspector keeps it (the plausibility rule) — screenshots of that at 390×844 and 1440×900.
 */
import type { CDPSession, Page } from 'playwright-core';

import { tapStats } from '@/features/tap-timer/stats';

import {
  screenshot,
  signIn,
  sizes,
  serverAndBrowser,
  startPeriodicInspection,
} from '@/tests/support/browser/harness';

const app = serverAndBrowser();

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Taps one second apart: wide enough that a loaded machine's scheduling jitter stays far below it. */
const SPACING_MS = 1000;

async function openTimer(page: Page) {
  await signIn(page, app.baseUrl, 'inspector@pivotwatch.test');
  await page.waitForURL('**/today');
  await page.getByText('Everything is sent').waitFor({ timeout: 30000 });
  // Little Kite: a one-body pendulum with a design swing of 6.5 s (demo data).
  await startPeriodicInspection(page, 'Little Kite');
  await page.getByRole('radio', { name: 'Readings' }).click();
  await page.getByRole('button', { name: 'Time it with taps' }).first().click();
}

test('every short touch, click and key press is counted, and the period matches the tap spacing', async () => {
  const context = await app.browser.newContext({
    viewport: sizes.phone,
    deviceScaleFactor: 1,
    hasTouch: true,
  });
  const page = await context.newPage();
  page.on('pageerror', (err) => console.error(`[page error] ${err.message}`));
  await openTimer(page);

  // Swing mode says what one tap marks.
  const pad = page.getByRole('button', { name: 'Tap once per full swing' });
  await pad.waitFor();
  await page.getByText('One swing = there and back').first().waitFor();
  await pad.scrollIntoViewIfNeeded();
  const box = (await pad.boundingBox())!;
  const x = box.x + box.width / 2;
  const y = box.y + box.height / 2;
  const cdp: CDPSession = await context.newCDPSession(page);

  // Each tap goes down at its own slot of the schedule; `times` keeps when it was sent (this clock).
  const times: number[] = [];
  const start = Date.now() + 200;
  const atSlot = async () => {
    await sleep(Math.max(0, start + times.length * SPACING_MS - Date.now()));
    times.push(Date.now());
  };
  const counted = (n: number) => page.getByText(`${n} taps`).waitFor({ timeout: 5000 });

  // Touches held 0 to 20 ms: start and end with only the hold between them.
  for (const hold of [0, 5, 10, 15, 20]) {
    await atSlot();
    await cdp.send('Input.dispatchTouchEvent', { type: 'touchStart', touchPoints: [{ x, y }] });
    if (hold) await sleep(hold);
    await cdp.send('Input.dispatchTouchEvent', { type: 'touchEnd', touchPoints: [] });
  }
  await counted(5);
  // Mouse clicks held 0 to 20 ms.
  await page.mouse.move(x, y);
  for (const hold of [0, 10, 20]) {
    await atSlot();
    await page.mouse.down();
    if (hold) await sleep(hold);
    await page.mouse.up();
  }
  await counted(8);
  // Playwright's own touchscreen tap (start and end at once).
  for (let i = 0; i < 2; i++) {
    await atSlot();
    await page.touchscreen.tap(x, y);
  }
  await counted(10);
  // Keyboard: Space and Enter on the focused pad (a held key repeats, but only the first press counts).
  await pad.focus();
  await atSlot();
  await page.keyboard.press('Space');
  await atSlot();
  await page.keyboard.press('Enter');
  await counted(12);
  await sleep(300);
  expect(await page.getByText('13 taps').count()).toBe(0);

  // The period shown is the mean interval of the taps as they were sent (same rules as the timer).
  const sent = tapStats(times)!;
  expect(sent.discarded).toBe(0);
  const shown = Number(
    (await page.getByLabel(/^Period s: /).getAttribute('aria-label'))!.replace('Period s: ', ''),
  );
  expect(Math.abs(shown - sent.periodS!)).toBeLessThanOrEqual(0.02);
  expect(Math.abs(shown - SPACING_MS / 1000)).toBeLessThanOrEqual(0.03);
  await screenshot(page, 'phone-tap-timer-swing');

  // One full swing per second is far from the 6.5 s design swing: the value waits for an answer.
  await page.getByRole('button', { name: 'Use this value' }).click();
  const prompt = page.getByText('Far from the design motion: check before it counts');
  await prompt.waitFor();
  await page.getByText(/× the design rate \(design period 6\.50 s\)/).waitFor();
  await prompt.scrollIntoViewIfNeeded();
  await screenshot(page, 'phone-readings-plausibility-prompt');

  await page.getByRole('textbox', { name: 'Why this value is right (optional)' }).fill('Test programme');
  await page.getByRole('button', { name: 'Keep this value' }).click();
  await page.getByText(/confirmed by you/).waitFor();
  await page
    .getByText(/1 readings?/)
    .first()
    .waitFor();
  await context.close();
});

test('at desktop size the timer takes mouse clicks and the prompt reads the same', async () => {
  const context = await app.browser.newContext({ viewport: sizes.desktop, deviceScaleFactor: 1 });
  const page = await context.newPage();
  await openTimer(page);
  const pad = page.getByRole('button', { name: 'Tap once per full swing' });
  await pad.click({ delay: 5 });
  for (let i = 0; i < 4; i++) {
    await sleep(SPACING_MS);
    await pad.click({ delay: 5 });
  }
  await page.getByText('5 taps').waitFor();
  await page.getByRole('button', { name: 'Use this value' }).click();
  const prompt = page.getByText('Far from the design motion: check before it counts');
  await prompt.waitFor();
  await prompt.scrollIntoViewIfNeeded();
  await screenshot(page, 'desktop-readings-plausibility-prompt');
  await page.getByRole('button', { name: 'Measure again' }).click();
  // Measuring again drops the value and opens the timer for a new try.
  await page
    .getByText('Tap each time the arm passes your mark going the same way', { exact: false })
    .waitFor();
  expect(await page.getByText(/confirmed by you/).count()).toBe(0);
  await context.close();
});
