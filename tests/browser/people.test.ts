/**
 * People administration end to end against the real server, web export and loopback mailbox: an
 * administrator invites an inspector at desktop size; the invitation goes out by SMTP; the link from the
 * e-mail, opened on a phone, sets a password and signs the new inspector in; the administrator then sees
 * the account active, the used link no longer works, and the inspector changes her own password.
 */
import { apiGet, apiToken, screenshot, serverAndBrowser } from '@/tests/support/browser/harness';

const app = serverAndBrowser({ NODE_ENV: 'development' });

type Outbox = { messages: { id: string; to: string[]; subject: string }[] };

test('an invited inspector sets a password from the e-mailed link and is signed in', async () => {
  const email = 'wren.aldous@halvard.test';
  const admin = await app.signedIn('desktop', 'admin@pivotwatch.test');
  await admin.goto(`${app.baseUrl}/admin/people`);
  await admin.getByRole('heading', { name: 'People' }).first().waitFor({ timeout: 60_000 });
  await admin.getByText('tomas', { exact: false }).first().waitFor();
  await screenshot(admin, 'people-list-desktop');

  await admin.getByRole('button', { name: 'Add a person' }).click();
  await admin.getByLabel('Name', { exact: true }).fill('Wren Aldous');
  await admin.getByLabel('E-mail', { exact: true }).fill(email);
  await screenshot(admin, 'people-invite-desktop');
  await admin.getByRole('button', { name: 'Send invitation' }).click();
  await admin.getByText(`Invitation sent to ${email}`, { exact: false }).waitFor();
  await admin.getByRole('link', { name: 'Wren Aldous' }).waitFor();
  await screenshot(admin, 'people-invited-desktop');

  // ——— the e-mail, through SMTP into the loopback mailbox ———
  const token = await apiToken(app.baseUrl, 'admin@pivotwatch.test');
  let messageId: string | undefined;
  for (let i = 0; i < 60 && !messageId; i++) {
    const outbox = await apiGet<Outbox>(app.baseUrl, '/api/admin/outbox', token);
    messageId = outbox.messages.find((m) => m.to.includes(email) && /Pivotwatch account/.test(m.subject))?.id;
    if (!messageId) await new Promise((r) => setTimeout(r, 500));
  }
  expect(messageId).toBeDefined();
  const full = await apiGet<{ message: { text: string | null } }>(
    app.baseUrl,
    `/api/admin/outbox/${messageId}`,
    token,
  );
  const link = /https?:\/\/\S+\/set-password\?token=[\w-]+/.exec(full.message.text ?? '')?.[0];
  expect(link).toBeDefined();

  // ——— the new inspector, on a phone ———
  const phone = await app.openPage('phone');
  await phone.goto(link!);
  await phone.getByText('Welcome to Pivotwatch').waitFor({ timeout: 60_000 });
  await phone.getByText(email).waitFor();
  await screenshot(phone, 'set-password-phone');
  // Too short is refused in words next to the field, and nothing is sent.
  await phone.getByLabel('New password', { exact: true }).fill('too short');
  await phone.getByRole('button', { name: 'Set password and sign in' }).click();
  await phone.getByText('Use at least 12 characters').waitFor();
  await phone.getByLabel('New password', { exact: true }).fill('lantern wheel at dusk');
  await phone.getByLabel('New password again', { exact: true }).fill('lantern wheel at dusk');
  await phone.getByRole('button', { name: 'Set password and sign in' }).click();
  await phone.waitForURL('**/today', { timeout: 30_000 });
  await phone.getByRole('heading', { name: /Wren/ }).first().waitFor();
  await screenshot(phone, 'set-password-signed-in-phone');

  // Her own password, changed on the Account screen: the phone stays signed in.
  await phone.getByRole('link', { name: 'Account' }).click();
  await phone.getByLabel('Current password', { exact: true }).fill('lantern wheel at dusk');
  await phone.getByLabel('New password', { exact: true }).fill('harbour lights at dawn');
  await phone.getByLabel('New password again', { exact: true }).fill('harbour lights at dawn');
  await phone.getByRole('button', { name: 'Change password' }).click();
  await phone.getByText(/Password changed/).waitFor();
  await screenshot(phone, 'account-password-changed-phone');
  const changed = await fetch(`${app.baseUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password: 'harbour lights at dawn' }),
  });
  expect(changed.status).toBe(200);

  // The link works once: opened again it says so.
  const again = await app.openPage('phone');
  await again.goto(link!);
  await again.getByText('This link has been used').waitFor({ timeout: 60_000 });
  await screenshot(again, 'set-password-used-phone');

  // The administrator sees the account active, with its history.
  await admin.getByRole('link', { name: 'Wren Aldous' }).click();
  await admin.getByText('Changes to this account').waitFor();
  await admin.getByText(/chose a password from the invitation/).waitFor({ timeout: 30_000 });
  await screenshot(admin, 'person-desktop');

  // The password card beside who is signed in, on a wide screen.
  await admin.goto(`${app.baseUrl}/account`);
  await admin.getByRole('button', { name: 'Change password' }).waitFor({ timeout: 60_000 });
  await screenshot(admin, 'account-desktop');

  const adminPhone = await app.signedIn('phone', 'admin@pivotwatch.test');
  await adminPhone.goto(`${app.baseUrl}/admin/people`);
  await adminPhone.getByText('Wren Aldous').first().waitFor({ timeout: 60_000 });
  await screenshot(adminPhone, 'people-list-phone');
  await adminPhone.getByRole('button', { name: 'Open Wren Aldous' }).click();
  await adminPhone.getByText('Changes to this account').waitFor();
  await screenshot(adminPhone, 'person-phone');
  for (const page of [admin, phone, again, adminPhone]) await page.context().close();
});
