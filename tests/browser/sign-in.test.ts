/**
 * Each demo role signs in through the real UI at phone and desktop size and lands on its own home.
 * Source of truth for the accounts: the README's demo table (seeded by server/seed/demo.ts).
 */
import { type SizeName, screenshot, signIn, serverAndBrowser } from '@/tests/support/browser/harness';

const app = serverAndBrowser();

const cases = [
  {
    email: 'inspector@pivotwatch.test',
    path: '/today',
    heading: /^Good (morning|afternoon|evening), Tomas$/,
    loaded: /Tamsworth Pier/,
  },
  // The demo's Tidebreaker has an overdue inspection, so it is in the supervisor's queue.
  { email: 'supervisor@pivotwatch.test', path: '/review', heading: /^Review$/, loaded: /Tidebreaker/ },
  { email: 'operator@pivotwatch.test', path: '/my-rides', heading: /^My rides$/, loaded: /Tamsworth Pier/ },
  { email: 'admin@pivotwatch.test', path: '/admin', heading: /^Administration$/, loaded: /Tamsworth Pier/ },
];

describe.each(['phone', 'desktop'] as SizeName[])('at %s size', (size) => {
  test.each(cases)('$email lands on $path', async ({ email, path, heading, loaded }) => {
    const page = await app.openPage(size);
    await page.goto(`${app.baseUrl}/`);
    await page.waitForURL('**/sign-in');
    await signIn(page, app.baseUrl, email);
    await page.waitForURL(`**${path}`);
    await page.getByRole('heading', { name: heading }).first().waitFor();
    // The role's data loaded: at least one ride card or table row is on screen.
    await page.getByText(loaded).first().waitFor();
    await screenshot(page, `${size}-${path.slice(1)}`);
    await page.context().close();
  });

  test('a wrong password is refused with a message and no navigation', async () => {
    const page = await app.signedIn(size, 'inspector@pivotwatch.test', 'not-the-password');
    await page
      .getByRole('alert')
      .filter({ hasText: /e-mail or password/i })
      .waitFor();
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await screenshot(page, `${size}-sign-in-refused`);
    await page.context().close();
  });
});

test('signing out returns to sign-in and guards the app routes', async () => {
  const page = await app.signedIn('phone', 'operator@pivotwatch.test');
  await page.waitForURL('**/my-rides');
  await page.getByRole('link', { name: 'Account' }).click();
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.waitForURL('**/sign-in');
  await page.goto(`${app.baseUrl}/admin`);
  // The sign-in page may carry the page asked for (?next=/admin), to come back to it after signing in.
  await page.waitForURL((url) => url.pathname === '/sign-in');
  expect(new URL(page.url()).pathname).toBe('/sign-in');
  await page.context().close();
});
