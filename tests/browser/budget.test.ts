/**
 * The web app's size budget: bytes transferred (compressed, as the server sends them: CDP's
 * encodedDataLength) by a fresh phone-size profile, against the goals in issue #16's "Goals" table
 * (GOALS in scripts/web-transfer.ts). Sizes are deterministic for a build, so they are asserted here;
 * times are not, so the offline reload is only printed by `npm run bench:web`.
 */
import { GOALS, measureFirstScreen, measureSignIn, type Transfer } from '@/scripts/web-transfer';
import { serverAndBrowser } from '@/tests/support/browser/harness';

const app = serverAndBrowser();
// A first visit waits for the service worker's precache too; on a busy machine that takes a while.
jest.setTimeout(240_000);

const describeBytes = (t: Transfer) =>
  `JS ${t.js} B, fonts ${t.fonts} B, other ${t.other} B, total ${t.total} B in ${t.requests} requests`;

test('before the sign-in form: JavaScript ≤ 400 KB and everything ≤ 550 KB (issue #16, Goals table)', async () => {
  const signIn = await measureSignIn(app.browser, app.baseUrl);
  // Printed so a failure (or a pass by a thin margin) shows where the bytes went.
  console.log(`sign-in page, until quiet: ${describeBytes(signIn.settled)}`);
  console.log(
    signIn.log
      .largest()
      .map((f) => `${f.bytes} ${f.url}`)
      .join('\n'),
  );
  // Until the page is quiet, not merely until the form shows: a font or script arriving just after the
  // form appears still travels before the person signs in.
  expect(signIn.settled.js).toBeLessThanOrEqual(GOALS.jsBeforeSignIn);
  expect(signIn.settled.total).toBeLessThanOrEqual(GOALS.allBeforeSignIn);
  // The measurement saw the app at all (an empty log would pass the budget).
  expect(signIn.settled.js).toBeGreaterThan(50_000);
});

test("the inspector's Today on a first visit: everything ≤ 1 MB (issue #16, Goals table)", async () => {
  const today = await measureFirstScreen(app.browser, app.baseUrl, 'inspector');
  try {
    console.log(`inspector Today, first visit: ${describeBytes(today.first)}`);
    console.log(
      today.log
        .largest()
        .map((f) => `${f.bytes} ${f.byWorker ? '(sw) ' : ''}${f.url}`)
        .join('\n'),
    );
    expect(today.path).toBe('/today');
    expect(today.first.total).toBeLessThanOrEqual(GOALS.inspectorTodayFirstVisit);
    expect(today.first.js).toBeGreaterThan(50_000);
  } finally {
    await today.context.close();
  }
});

// CI once measured 4 more requests (the inspector's other areas, 55 KB) than a quick machine: its first
// sync outlasted the 5 s after which those areas were loaded ahead. They now wait for Today's content
// (components/first-screen.ts), so a slow first sync must not change what Today's first visit costs.
test("a slow first sync (each pull held 6 s): Today's first visit loads the same code", async () => {
  const quick = await measureFirstScreen(app.browser, app.baseUrl, 'inspector');
  const slow = await measureFirstScreen(app.browser, app.baseUrl, 'inspector', { slowPullMs: 6000 });
  try {
    console.log(`inspector Today, slow first sync: ${describeBytes(slow.first)}`);
    expect(slow.path).toBe('/today');
    expect(slow.first.js).toBe(quick.first.js);
    expect(slow.first.total).toBeLessThanOrEqual(GOALS.inspectorTodayFirstVisit);
  } finally {
    await Promise.all([quick.context.close(), slow.context.close()]);
  }
});
