/**
 * A session ended on the server (POST /api/auth/sign-out from another device ends every session of that
 * person) sends the app back to sign-in at its next check, while another person's session goes on.
 */
import { screenshot, serverAndBrowser, type SizeName } from '@/tests/support/browser/harness';

const app = serverAndBrowser();

async function signOutEverywhere(email: string) {
  const res = await fetch(`${app.baseUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password: 'pivotwatch-demo' }),
  });
  const { token } = (await res.json()) as { token: string };
  const out = await fetch(`${app.baseUrl}/api/auth/sign-out`, {
    method: 'POST',
    headers: { authorization: `Bearer ${token}` },
  });
  expect(out.status).toBe(204);
}

test.each([
  ['desktop', 'supervisor@pivotwatch.test', 'admin@pivotwatch.test', '/review', '/admin'],
  ['phone', 'operator@pivotwatch.test', 'operator2@pivotwatch.test', '/my-rides', '/my-rides'],
] as [SizeName, string, string, string, string][])(
  'at %s size: %s signed out elsewhere lands on sign-in; %s stays signed in',
  async (size, email, otherEmail, home, otherHome) => {
    const page = await app.signedIn(size, email);
    await page.waitForURL(`**${home}`);
    const other = await app.signedIn(size, otherEmail);
    await other.waitForURL(`**${otherHome}`);

    await signOutEverywhere(email);

    await page.reload();
    await page.waitForURL('**/sign-in**', { timeout: 30_000 });
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
    await screenshot(page, `${size}-session-ended`);

    await other.reload();
    await other.waitForURL(`**${otherHome}`);
    await other.waitForTimeout(1000);
    expect(new URL(other.url()).pathname).toBe(otherHome);
    await page.context().close();
    await other.context().close();
  },
);
