/**
 * Recording a ride cycle with the phone, in the real app at phone size (390×844): the inspector starts an
 * inspection of Little Kite (a pendulum swing, ±75° in 6.5 s by design), goes offline, carries the phone in
 * the back row's centre seat and records while the page is fed `devicemotion` events of a known swing
 * (θ = A·sin(ωt + φ), A = 60°, T = 6.8 s, at about 60 readings a second, in the units and signs of the W3C
 * DeviceOrientation and Motion events: rotationRate in deg/s, accelerationIncludingGravity in m/s²). The
 * app cuts it to whole cycles, runs the load check offline with it, shows measured against computed rider
 * accelerations, and, back online, the server stores the record and its measured rider accelerations;
 * the supervisor's desk (1440×900) shows them side by side. Expected values: the rising zero crossings of
 * the fed rate (ωt + φ = 3π/2 + 2πk), and Gz = 1 + A²ω²·|p_y|/g at the bottom of the swing.
 */
import type { Page } from 'playwright-core';

import {
  apiToken,
  screenshot,
  serverAndBrowser,
  startPeriodicInspection,
} from '@/tests/support/browser/harness';

const app = serverAndBrowser();
const A = (60 * Math.PI) / 180;
const T = 6.8;
const PHASE = 4.4;
const DURATION_S = 16;

/** Feeds the page a swing for `seconds`, dispatching events from a timer as a phone's sensors would. */
async function feedSwing(page: Page, seat: [number, number], durationS = DURATION_S) {
  await page.evaluate(
    ({ A, T, PHASE, DURATION_S, seat }) =>
      new Promise<void>((resolve) => {
        const g = 9.80665;
        const w = (2 * Math.PI) / T;
        const [px, py] = seat;
        const start = performance.now();
        const timer = setInterval(() => {
          const t = (performance.now() - start) / 1000;
          if (t > DURATION_S) {
            clearInterval(timer);
            resolve();
            return;
          }
          const arg = w * t + PHASE;
          const q = A * Math.sin(arg);
          const qd = A * w * Math.cos(arg);
          const qdd = -A * w * w * Math.sin(arg);
          // In the seat: screen to the rider's right, top toward the head; the rider is drawn facing +x, so
          // the phone turns the other way round its z axis, and its x, y read chest-ward and spine-ward.
          window.dispatchEvent(
            new DeviceMotionEvent('devicemotion', {
              rotationRate: { alpha: (-qd * 180) / Math.PI, beta: 0.05, gamma: -0.05 },
              accelerationIncludingGravity: {
                x: -qdd * py - qd * qd * px + g * Math.sin(q),
                y: qdd * px - qd * qd * py + g * Math.cos(q),
                z: 0,
              },
              interval: 16,
            }),
          );
        }, 16);
      }),
    { A, T, PHASE, DURATION_S: durationS, seat },
  );
}

test('a swing recorded with the phone is trimmed, analysed offline, sent, and shown on the desk', async () => {
  const page = await app.signedIn('phone', 'inspector@pivotwatch.test');
  await page.waitForURL('**/today');
  await page.getByText('Everything is sent').waitFor({ timeout: 30000 });
  await startPeriodicInspection(page, 'Little Kite');
  await page.getByRole('radio', { name: 'Readings' }).click();
  await page.getByText('Ride cycle from the phone’s motion sensors').waitFor();
  await page.context().setOffline(true);

  await page.getByRole('radio', { name: 'Carried in a seat' }).click();
  await page.getByRole('radio', { name: 'Back row, centre seat' }).click();
  await page.getByText('How to hold the phone in the seat').scrollIntoViewIfNeeded();
  await screenshot(page, 'motion-recording-setup-phone');
  await page.getByRole('button', { name: 'Start recording' }).click();
  await page.getByRole('button', { name: 'Stop recording' }).waitFor();
  // Back row, centre seat of the demo design: 0.2 m forward, 6.2 m below the pivot.
  await feedSwing(page, [0.2, -6.2]);
  await page.getByRole('button', { name: 'Stop recording' }).scrollIntoViewIfNeeded();
  await screenshot(page, 'motion-recording-live-phone');
  await page.getByRole('button', { name: 'Stop recording' }).click();

  // Rising crossings of the fed rate in 16 s: ωt + φ = 3π/2 + 2πk.
  const w = (2 * Math.PI) / T;
  const rising = [0, 1, 2, 3]
    .map((k) => (1.5 * Math.PI + 2 * Math.PI * k - PHASE) / w)
    .filter((t) => t >= 0 && t < DURATION_S);
  const cycles = rising.length - 1;
  const summary = page.getByLabel('Recorded cycle summary');
  await summary.waitFor();
  await summary.getByText(`${cycles} of ${cycles}`).waitFor();
  // The cut falls on the samples next to the crossings, so the kept duration is cycles·T to within a
  // sample spacing at each end. The browser's 16 ms timer stretches on a loaded machine, so the spacing
  // allowed is the one the summary reports (its sample rate), not the nominal one.
  const stats = await summary.innerText();
  const duration = Number(/Duration\s+([\d.]+)/.exec(stats)?.[1]);
  const rateHz = Number(/Sample rate\s+([\d.]+)/.exec(stats)?.[1]);
  expect(rateHz).toBeGreaterThan(5);
  expect(Math.abs(duration - cycles * T)).toBeLessThanOrEqual(2 / rateHz + 0.01);
  await summary.scrollIntoViewIfNeeded();
  await screenshot(page, 'motion-recording-review-phone');
  await page.getByRole('button', { name: 'Keep this record' }).click();
  await page.getByLabel('Motion record of pivot 1').waitFor();

  // The load check runs on the phone, offline, with the record.
  await page.getByRole('radio', { name: 'Loads' }).click();
  await page
    .getByText(/Runs the motion recorded with the phone/)
    .first()
    .waitFor()
    .catch(async (err) => {
      await page.screenshot({ path: 'artifacts/screenshots/debug-motion-loads.png', fullPage: true });
      throw err;
    });
  const measured = page.getByText('Back row, centre seat: rider accelerations');
  await measured.waitFor();
  await measured.scrollIntoViewIfNeeded();
  await screenshot(page, 'motion-recording-loads-offline-phone');

  // Finish the checklist without photos (photo items not applicable today) and submit, still offline.
  await page.getByRole('radio', { name: 'Checklist' }).click();
  const photoButtons = page.getByRole('button', { name: /^Photo for / });
  await photoButtons.first().waitFor();
  const photoItems = await photoButtons.evaluateAll((els) =>
    els.map((e) => (e.getAttribute('aria-label') ?? '').replace('Photo for ', '')),
  );
  const passes = page.getByRole('radio', { name: /^Pass: / });
  const n = await passes.count();
  for (let i = 0; i < n; i++) await passes.nth(i).click();
  for (const item of photoItems) await page.getByRole('radio', { name: `Not applicable: ${item}` }).click();
  const values = page.locator('input[aria-label]:not([aria-label="Note"]):not([aria-label="What is wrong"])');
  const v = await values.count();
  for (let i = 0; i < v; i++) await values.nth(i).fill('1.5');
  const reasons = page.getByRole('textbox', { name: 'Reason for passing a value over its limit' });
  for (let i = 0; i < (await reasons.count()); i++) await reasons.nth(i).fill('Test value');
  for (const method of ['Micrometer', 'Dial indicator']) {
    const chips = page.getByRole('radio', { name: method, exact: true });
    for (let i = 0; i < (await chips.count()); i++) await chips.nth(i).click();
  }
  const none = page.getByRole('radio', { name: 'None from the register' });
  for (let guard = 0; guard < 10 && (await none.count()) > 0; guard++) await none.first().click();
  await page.getByRole('radio', { name: 'Submit' }).click();
  await page.getByText('Ready to submit').waitFor();
  await page.getByRole('checkbox', { name: /make this declaration/ }).click();
  await page.getByRole('button', { name: 'Submit inspection' }).click();
  await page.waitForURL('**/today');
  await page.context().setOffline(false);
  await page.getByRole('button', { name: /Sync now/ }).click();
  await page.getByText('Everything is sent').waitFor({ timeout: 60000 });

  // The server keeps the record and its measured rider accelerations.
  const token = await apiToken(app.baseUrl, 'inspector@pivotwatch.test');
  const list = (await (
    await fetch(`${app.baseUrl}/api/inspections?mine=1`, { headers: { Authorization: `Bearer ${token}` } })
  ).json()) as { inspections: { id: string }[] };
  expect(list.inspections).toHaveLength(1);
  const id = list.inspections[0].id;
  type Detail = {
    record: { motionRecords?: { cycles: number; seat: number | null }[] };
    analysis: { measuredRider?: { gzMax: number; name: string }[]; differences: string[] } | null;
  };
  let detail: Detail | null = null;
  for (let i = 0; i < 50 && !detail?.analysis; i++) {
    const res = await fetch(`${app.baseUrl}/api/inspections/${id}`, {
      headers: { Authorization: `Bearer ${token}` },
    });
    detail = ((await res.json()) as { inspection: Detail }).inspection;
    if (!detail.analysis) await new Promise((r) => setTimeout(r, 200));
  }
  expect(detail?.record.motionRecords?.[0]).toMatchObject({ cycles, seat: 1 });
  const rider = detail?.analysis?.measuredRider?.[0];
  expect(rider?.name).toBe('Back row, centre seat');
  // Gz at the bottom: 1 + A²ω²·6.2/g (within 2 %: browser timers jitter the sampling).
  const gz = 1 + (A * w) ** 2 * (6.2 / 9.80665);
  expect(Math.abs((rider?.gzMax ?? 0) / gz - 1)).toBeLessThan(0.02);
  expect(detail?.analysis?.differences).toEqual([]);
  await page.context().close();

  const desk = await app.signedIn('desktop', 'supervisor@pivotwatch.test');
  await desk.waitForURL('**/review');
  await desk.goto(`${app.baseUrl}/review/${id}`);
  const side = desk.getByText('Back row, centre seat: rider accelerations');
  await side.waitFor({ timeout: 30000 });
  await side.scrollIntoViewIfNeeded();
  await screenshot(desk, 'motion-recording-review-desk');
  await desk.getByLabel('Recorded rate of pivot 1').waitFor();
  await desk.context().close();
});

test('on a wide screen: too short a recording is refused in plain words, a longer one is kept', async () => {
  const page = await app.signedIn('desktop', 'inspector@pivotwatch.test');
  await page.waitForURL('**/today');
  await startPeriodicInspection(page, 'Little Kite');
  await page.getByRole('radio', { name: 'Readings' }).click();
  await page.getByText('Ride cycle from the phone’s motion sensors').waitFor();
  await page.getByRole('radio', { name: 'Fixed to an arm or gondola' }).click();
  await page.getByRole('button', { name: 'Start recording' }).click();
  await page.getByRole('button', { name: 'Stop recording' }).waitFor();
  await feedSwing(page, [0, -6], 2);
  await page.getByRole('button', { name: 'Stop recording' }).click();
  const refusal = page.getByText(/Less than one whole cycle was recorded/);
  await refusal.waitFor();
  await refusal.scrollIntoViewIfNeeded();
  await screenshot(page, 'motion-recording-too-short-desktop');
  expect(await page.getByRole('button', { name: 'Keep this record' }).count()).toBe(0);

  await page.getByRole('button', { name: 'Discard and record again' }).click();
  await page.getByRole('button', { name: 'Start recording' }).click();
  await page.getByRole('button', { name: 'Stop recording' }).waitFor();
  // On an arm the screen faces the drawing's viewer, so the fed rate (made for a seat) reads reversed: its
  // rising crossings fall where ωt + φ = π/2 + 2πk, at 3.7 s and 10.5 s — one whole cycle in 12 s.
  await feedSwing(page, [0, -6], 12);
  await page.getByRole('button', { name: 'Stop recording' }).click();
  const summary = page.getByLabel('Recorded cycle summary');
  await summary.getByText('1 of 1').waitFor();
  await summary.scrollIntoViewIfNeeded();
  await screenshot(page, 'motion-recording-review-desktop');
  await page.getByRole('button', { name: 'Keep this record' }).click();
  await page.getByLabel('Motion record of pivot 1').waitFor();
  await page.context().close();
});
