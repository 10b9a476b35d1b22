/**
 * Charts read by pointing, in Chromium at 1440×900 and 390×844 (issue 17, item 6): on the calculator's
 * result for Skylark (demo data: a free-swinging pendulum ride, so its charts run against time) the
 * mouse over pivot 1's force chart shows a cursor and a read-out; held at the instant the pivot-loads
 * table gives for the peak, the read-out gives that peak (the drawn series is bounded but keeps every
 * exact peak, features/loads/engine). No two of the chart's labels overlap (their boxes, measured with
 * getBoundingClientRect). The pixel an instant sits at comes from two of the chart's own time ticks, a
 * straight line through them (the chart's x scale is linear).
 */
import type { Locator, Page } from 'playwright-core';

import { type SizeName, screenshot, serverAndBrowser } from '@/tests/support/browser/harness';

const app = serverAndBrowser();

async function skylarkForceChart(size: SizeName): Promise<{ page: Page; chart: Locator }> {
  const page = await app.signedIn(size, 'inspector@pivotwatch.test');
  await page.waitForURL((url) => url.pathname !== '/sign-in');
  await page.goto(`${app.baseUrl}/loads`);
  await page.getByRole('radio', { name: 'Skylark' }).click();
  await page.getByText(/^Pivot 1 · Main arm swings freely: period /).waitFor({ timeout: 60_000 });
  const chart = page.getByRole('img', { name: /^Force on pivot 1 over the cycle/ });
  await chart.scrollIntoViewIfNeeded();
  await chart.locator('path[d^="M"]').first().waitFor({ timeout: 30_000 });
  return { page, chart };
}

type Box = { text: string; left: number; right: number; top: number; bottom: number };

/** Every text the chart draws, with its box on the page. */
const labelBoxes = (chart: Locator): Promise<Box[]> =>
  chart.locator('svg text').evaluateAll((els) =>
    els.map((e) => {
      const r = e.getBoundingClientRect();
      return { text: e.textContent ?? '', left: r.left, right: r.right, top: r.top, bottom: r.bottom };
    }),
  );

const overlap = (a: Box, b: Box) =>
  a.left < b.right && b.left < a.right && a.top < b.bottom && b.top < a.bottom;

/** The number and unit in "1.234 kN" / "12.5 N" as newtons. */
function newtons(text: string): number {
  const m = /(-?[\d.,]+)\s*(k?N)/.exec(text);
  if (!m) throw new Error(`no force in “${text}”`);
  return Number(m[1].replace(/,/g, '')) * (m[2] === 'kN' ? 1000 : 1);
}

for (const size of ['desktop', 'phone'] as const) {
  test(`${size}: the read-out under the mouse gives the pivot's peak at its instant; no labels overlap`, async () => {
    const { page, chart } = await skylarkForceChart(size);

    const boxes = await labelBoxes(chart);
    expect(boxes.length).toBeGreaterThan(4);
    for (let i = 0; i < boxes.length; i++)
      for (let j = i + 1; j < boxes.length; j++) {
        if (overlap(boxes[i], boxes[j])) throw new Error(`“${boxes[i].text}” overlaps “${boxes[j].text}”`);
      }

    // The peak as the pivot-loads table states it (from the whole cycle, not the drawn one): a row on a
    // desk, a card of titled values on a phone.
    const table = page.getByLabel('Pivot loads');
    const row =
      size === 'desktop'
        ? await table.getByRole('row').nth(1).getByRole('cell').allTextContents()
        : (/PEAK FORCE(.+?)AT TIME(.+? s)/.exec((await table.textContent()) ?? '')?.slice(0, 3) ?? []);
    const peakText = row[1] ?? '';
    const peakAt = Number(/([\d.]+)\s*s/.exec(row[2] ?? '')?.[1]);
    expect(Number.isFinite(peakAt)).toBe(true);

    // The x ticks: the row of numbers under the plot (the plot's rectangle is the first one drawn).
    const plot = (await chart.locator('svg rect').first().boundingBox())!;
    const xTicks = boxes
      .filter((b) => b.top > plot.y + plot.height && /^-?[\d.]+$/.test(b.text))
      .map((b) => ({ value: Number(b.text), px: (b.left + b.right) / 2 }));
    expect(xTicks.length).toBeGreaterThanOrEqual(3);
    // Two inner ticks (an end label may be moved inwards to stay on the drawing).
    const [a, b] = [xTicks[1], xTicks[xTicks.length - 2]];
    const px = a.px + ((peakAt - a.value) / (b.value - a.value)) * (b.px - a.px);

    await page.mouse.move(px, plot.y + plot.height / 2);
    const readout = chart.getByTestId('chart-readout');
    await readout.waitFor();
    const text = (await readout.textContent()) ?? '';
    const at = Number(/Time ([\d.]+) s/.exec(text)?.[1]);
    // The nearest drawn instant: within a pixel's worth of time of the peak's.
    const secondsPerPx = (b.value - a.value) / (b.px - a.px);
    expect(Math.abs(at - peakAt)).toBeLessThanOrEqual(Math.abs(secondsPerPx) + 0.01);
    // The force there is the peak (both to about four figures; the curve is flat at its top).
    expect(Math.abs(newtons(text) - newtons(peakText)) / newtons(peakText)).toBeLessThan(0.005);
    // The same words for a screen reader, politely.
    const live = page.locator('[aria-live="polite"]', { hasText: /^Time [\d.]+ s: Force magnitude/ });
    await live.first().waitFor({ state: 'attached' });
    await screenshot(page, `chart-readout-${size}`);

    // Away from the chart the read-out goes; the keyboard brings it back one sample at a time.
    await page.mouse.move(2, 2);
    await readout.waitFor({ state: 'detached' });
    await chart.focus();
    await page.keyboard.press('Home');
    expect(await readout.textContent()).toMatch(/^Time 0 s/);
    await page.keyboard.press('ArrowRight');
    expect(await readout.textContent()).not.toMatch(/^Time 0 s/);
    await page.context().close();
  });
}
