/**
 * The load calculator in Chromium with real motion. On the phone (390×844) a noisy swing record with a
 * dropped stretch is pasted for the arm: the result shows the warning about the gap under its mark and
 * words and, quieter, the smoothing the engine chose. Then the arm is let go as a free pin from
 * horizontal and the period shown is checked against the exact period of the compound pendulum. On the
 * desk (1440×900) the same record is picked as a .csv file and an emergency stop is added, so the cases
 * appear side by side. The bodies are the calculator's own example (round numbers, not a real ride).
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';

import { screenshot, serverAndBrowser } from '@/tests/support/browser/harness';

const app = serverAndBrowser();

/**
 * A swing of the arm as a logger would give it: 12 s at 100 Hz, ±30° about hanging (−90°) with a 6 s
 * period, 0.2° of seeded noise (mulberry32 + Box–Muller), and 0.5 s missing after 7 s.
 */
function noisySwingRecord(): string {
  let s = 21;
  const uniform = () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const noise = () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
  const lines = ['time_s,angle_deg'];
  for (let k = 0; k <= 1200; k++) {
    const t = k / 100;
    if (t > 7 && t < 7.5) continue;
    const angle = -90 + 30 * Math.sin((2 * Math.PI * t) / 6) + 0.2 * noise();
    lines.push(`${t.toFixed(2)},${angle.toFixed(3)}`);
  }
  return lines.join('\n');
}

/** Complete elliptic integral of the first kind by the arithmetic–geometric mean (Abramowitz & Stegun 17.6). */
function ellipticK(k: number): number {
  let a = 1;
  let b = Math.sqrt(1 - k * k);
  while (Math.abs(a - b) > 1e-15 * a) [a, b] = [(a + b) / 2, Math.sqrt(a * b)];
  return Math.PI / (2 * a);
}

async function openCalculator(size: 'phone' | 'desktop'): Promise<Page> {
  const page = await app.signedIn(size, 'inspector@pivotwatch.test');
  await page.waitForURL((url) => url.pathname !== '/sign-in');
  await page.goto(`${app.baseUrl}/loads`);
  await page.getByRole('radio', { name: 'Enter bodies' }).click();
  return page;
}

const jointKind = (page: Page, joint: string, kind: string) =>
  page
    .getByRole('radiogroup', { name: `${joint} motion` })
    .getByRole('radio', { name: kind })
    .click();

test('phone: a pasted noisy record shows its warnings and smoothing; a free arm its exact period', async () => {
  const page = await openCalculator('phone');
  await jointKind(page, 'Joint 1 · Arm', 'Measured');
  await page.getByLabel('Record: time (s), then the value').fill(noisySwingRecord());
  const summary = page.getByText(/^1152 samples over 12(\.0+)? s, about 100(\.0+)? Hz/);
  await summary.waitFor();
  await summary.scrollIntoViewIfNeeded();
  await screenshot(page, 'calculator-phone-measured-input');
  await jointKind(page, 'Joint 2 · Gondola', 'Held');
  await page.getByRole('button', { name: 'Run load check' }).click();

  const warnings = page.getByLabel('Warnings about this result');
  await warnings.waitFor({ timeout: 60_000 });
  await warnings.getByText('Check this').waitFor();
  await warnings.getByText(/gap/).first().waitFor();
  const notes = page.getByLabel('How this result was computed');
  await notes
    .getByText(/Pivot 1 · Arm: .*low-pass/)
    .first()
    .waitFor();
  await warnings.scrollIntoViewIfNeeded();
  await screenshot(page, 'calculator-phone-measured-warnings');

  // Let the arm go from horizontal, the gondola held to it: a compound pendulum.
  await jointKind(page, 'Joint 1 · Arm', 'Free swing');
  await page.getByLabel('Start angle').fill('0');
  await page.getByRole('button', { name: 'Run load check' }).click();
  const line = page.getByText(/^Pivot 1 · Arm swings freely: period /);
  await line.waitFor({ timeout: 60_000 });
  await line.scrollIntoViewIfNeeded();
  await screenshot(page, 'calculator-phone-free-swing');
  const shown = Number(/period ([\d.]+) s/.exec((await line.textContent()) ?? '')?.[1]);

  // The example chain held rigid: arm 4000 kg, CG 5 m out, 33 333 kg·m² about it; gondola 1500 kg, CG at
  // (10, −1.5) m, 1200 kg·m². Physical pendulum, exact: T = 4·√(I_O/(m·g·r))·K(sin(A/2)), A the swing of
  // the CG from hanging (any dynamics textbook).
  const m = 5500;
  const cg = [(4000 * 5 + 1500 * 10) / m, (1500 * -1.5) / m];
  const r = Math.hypot(cg[0], cg[1]);
  const I_O = 33333 + 4000 * 25 + 1200 + 1500 * (100 + 2.25);
  const A = Math.PI / 2 + Math.atan2(cg[1], cg[0]);
  const exact = 4 * Math.sqrt(I_O / (m * 9.80665 * r)) * ellipticK(Math.sin(A / 2));
  // Shown to four significant figures.
  expect(Math.abs(shown - exact) / exact).toBeLessThan(1e-3);
  await page.context().close();
});

test('desk: the record picked as a .csv file, with an emergency stop, shows the cases side by side', async () => {
  const file = join(mkdtempSync(join(tmpdir(), 'pivotwatch-record-')), 'arm-swing.csv');
  writeFileSync(file, noisySwingRecord());
  const page = await openCalculator('desktop');
  await jointKind(page, 'Joint 1 · Arm', 'Measured');
  const chooser = page.waitForEvent('filechooser');
  await page.getByRole('button', { name: 'Pick a .csv or .txt file' }).click();
  await (await chooser).setFiles(file);
  await page.getByText('From arm-swing.csv').waitFor();
  await page.getByText(/^1152 samples over 12(\.0+)? s/).waitFor();
  await jointKind(page, 'Joint 2 · Gondola', 'Held');
  await page.getByLabel('Emergency stop').first().fill('0.6');
  await page.getByRole('button', { name: 'Run load check' }).click();

  await page.getByLabel('Warnings about this result').waitFor({ timeout: 60_000 });
  const cases = page.getByLabel('Load cases');
  await cases.waitFor();
  await cases.getByText('Emergency stop').first().waitFor();
  await cases.getByText('Operating cycle').first().waitFor();
  await screenshot(page, 'calculator-desktop-measured-stop');
  await page.getByLabel('Warnings about this result').scrollIntoViewIfNeeded();
  await screenshot(page, 'calculator-desktop-measured-warnings');
  await page.context().close();
});

test('a registered ride: its free swing and stops come from its design data, the result names the governing case', async () => {
  for (const size of ['desktop', 'phone'] as const) {
    const page = await app.signedIn(size, 'inspector@pivotwatch.test');
    await page.waitForURL((url) => url.pathname !== '/sign-in');
    await page.goto(`${app.baseUrl}/loads`);
    // Skylark (demo data): a pendulum ride whose design marks the arm as a free swing of 110° with a
    // service stop of 0.5 rad/s² and an emergency stop of 0.65 rad/s².
    await page.getByRole('radio', { name: 'Skylark' }).click();
    const arm = page.getByRole('radiogroup', { name: 'Joint 1 · Main arm motion' });
    await arm.waitFor();
    expect(await arm.getByRole('radio', { name: 'Free swing' }).getAttribute('aria-checked')).toBe('true');
    expect(await page.getByLabel('Start angle').inputValue()).toBe('110');
    expect(await page.getByLabel('Service stop').first().inputValue()).toBe('0.5');
    expect(await page.getByLabel('Emergency stop').first().inputValue()).toBe('0.65');
    const period = page.getByText(/^Pivot 1 · Main arm swings freely: period /);
    await period.waitFor({ timeout: 60_000 });
    const cases = page.getByLabel('Load cases');
    await cases.getByText('Emergency stop').first().waitFor();
    await page.getByText(/^Governing case: /).waitFor();
    await period.scrollIntoViewIfNeeded();
    await screenshot(page, `calculator-${size}-ride-free-stops`);
    await cases.scrollIntoViewIfNeeded();
    await screenshot(page, `calculator-${size}-ride-cases`);
    await page.context().close();
  }
});
