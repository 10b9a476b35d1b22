/**
 * The operator loop end to end with the demo scenario, against the real server, web export and loopback
 * mailbox: a supervisor approves Tidebreaker's over-limit inspection with a finding; the notice goes out
 * by SMTP with its PDF; an administrator sees it in the outbox; the operator opens the e-mailed link on a
 * phone, signs in, acknowledges, reports the corrective action with a photo; the supervisor verifies and
 * closes the finding, and the ride's status follows.
 */
import {
  DEMO_PASSWORD,
  apiGet,
  apiToken,
  jpegPhoto,
  screenshot,
  serverAndBrowser,
} from '@/tests/support/browser/harness';

const app = serverAndBrowser({ NODE_ENV: 'development' });

async function api<T>(path: string, email: string): Promise<T> {
  return apiGet<T>(app.baseUrl, path, await apiToken(app.baseUrl, email));
}

type Outbox = {
  messages: {
    id: string;
    to: string[];
    subject: string;
    attachments: { index: number; filename: string }[];
  }[];
};

test('approve → notice e-mailed with PDF → operator acknowledges and reports → supervisor closes; the ride follows', async () => {
  // ——— supervisor: a finding on Tidebreaker's over-limit inspection, then approval ———
  const desk = await app.signedIn('desktop', 'supervisor@pivotwatch.test');
  await desk.waitForURL('**/review');
  await desk.getByRole('button', { name: /^1 Over limit/ }).click();
  await desk
    .getByRole('link', { name: /Tidebreaker/ })
    .first()
    .click();
  await desk.waitForURL(/\/review\/[^/?]+$/);
  await desk.getByRole('button', { name: 'Add finding' }).click();
  const form = desk.getByLabel('New finding');
  await form.getByRole('radio', { name: 'Fix before operation' }).click();
  await form.getByLabel('What was found').fill('Main arm runs at 6.7 rpm against a design 6.0 rpm.');
  await form.getByLabel('Required action').fill('Reset the drive controller to the design programme.');
  await form.getByLabel('Due date').fill('2027-01-10');
  await form.getByRole('button', { name: 'Add finding' }).click();
  await form.waitFor({ state: 'detached' });
  await desk.getByText('Saving…').waitFor({ state: 'detached' });
  // The finding forbids operation: the approval stops the ride in the same decision.
  await desk.getByRole('radio', { name: 'Set out of service', exact: true }).click();
  await desk.getByLabel('Reason for the status').fill('Drive runs over its design speed.');
  await desk.getByRole('button', { name: 'Approve inspection' }).click();
  await desk
    .getByText(/Approved by Mira Delacourt/)
    .first()
    .waitFor({ timeout: 15000 });
  const noticeLink = desk.getByRole('link', { name: /^Notice PW-/ }).first();
  await noticeLink.waitFor({ timeout: 15000 });
  const noticeHref = (await noticeLink.getAttribute('href')) as string;
  const noticeId = noticeHref.split('/').pop() as string;
  await screenshot(desk, 'notice-issued-desktop');

  // ——— the e-mail: through SMTP into the loopback mailbox, with the PDF ———
  let message: Outbox['messages'][number] | undefined;
  for (let i = 0; i < 60 && !message; i++) {
    const outbox = await api<Outbox>('/api/admin/outbox', 'admin@pivotwatch.test');
    message = outbox.messages.find(
      (m) => m.to.includes('ops@corvane-shows.test') && /inspection notice/.test(m.subject),
    );
    if (!message) await new Promise((r) => setTimeout(r, 500));
  }
  expect(message).toBeDefined();
  const pdfName = message!.attachments.find((a) => a.filename.endsWith('.pdf'))?.filename;
  expect(pdfName).toMatch(/^PW-\d{4}-\d{4}\.pdf$/);
  const full = await api<{ message: { text: string | null } }>(
    `/api/admin/outbox/${message!.id}`,
    'admin@pivotwatch.test',
  );
  const link = /https?:\/\/\S+\/notices\/[\w-]+/.exec(full.message.text ?? '')?.[0];
  expect(link).toBeDefined();
  expect(link!.endsWith(`/notices/${noticeId}`)).toBe(true);

  // The administrator sees it in the outbox, with the PDF attached.
  const admin = await app.signedIn('desktop', 'admin@pivotwatch.test');
  await admin.goto(`${app.baseUrl}/admin/outbox`);
  // The list has loaded once the subtitle counts the e-mails; a list read before this message was
  // filed is brought up to date with the screen's own Refresh, as an administrator would.
  await admin.getByText(/received by the built-in mailbox, newest first/).waitFor({ timeout: 60_000 });
  const messageButton = admin.getByRole('button', { name: `Message: ${message!.subject}` });
  if (!(await messageButton.isVisible())) await admin.getByRole('button', { name: 'Refresh' }).click();
  try {
    await messageButton.click();
  } catch (err) {
    // This step has failed now and then in whole-suite runs only; keep what the admin saw for the next look.
    await screenshot(admin, 'notice-outbox-missing-desktop');
    console.log('Outbox as shown when the message was not found:\n', await admin.locator('body').innerText());
    throw err;
  }
  await admin.getByLabel(`Attachment: ${pdfName}`).waitFor();
  await screenshot(admin, 'notice-outbox-desktop');

  // ——— the operator opens the e-mailed link on a phone, signs in, and lands on the notice ———
  const phone = await app.openPage('phone');
  await phone.goto(`${app.baseUrl}/notices/${noticeId}`);
  await phone.waitForURL(/\/sign-in/);
  await phone.getByLabel('E-mail').fill('operator2@pivotwatch.test');
  await phone.getByLabel('Password').fill(DEMO_PASSWORD);
  await phone.getByRole('button', { name: 'Sign in' }).click();
  await phone.waitForURL(`**/notices/${noticeId}`);
  await phone.getByText('Main arm runs at 6.7 rpm against a design 6.0 rpm.').first().waitFor();
  await phone.getByRole('button', { name: 'Acknowledge receipt' }).click();
  await phone
    .getByText(/Acknowledged by Owen Falgrave/)
    .first()
    .waitFor();

  // Corrective action with a photo of the repair.
  await phone
    .getByRole('button', { name: /^Report corrective action on finding \d+$/ })
    .first()
    .click();
  await phone
    .getByLabel('What was done')
    .fill('Drive controller reset to the design programme; timed 6.0 rpm.');
  // The operator's "photo of the repair".
  const photo = await jpegPhoto(app.browser, 'Controller display after reset', {
    background: '#55606a',
    fontPx: 40,
    name: 'repair.jpg',
  });
  const chooser = phone.waitForEvent('filechooser');
  await phone.getByRole('button', { name: 'Choose from library' }).click();
  await (await chooser).setFiles(photo);
  await phone.getByText('✓ Uploaded').waitFor({ timeout: 15000 });
  await phone.getByRole('button', { name: 'Send corrective action' }).click();
  await phone.getByLabel('State: Action reported').first().waitFor({ timeout: 15000 });
  await screenshot(phone, 'notice-operator-phone');

  // ——— the supervisor verifies and closes (note required; the operator's report is the evidence) ———
  await desk.goto(`${app.baseUrl}/notices/${noticeId}`);
  await desk
    .getByRole('button', { name: /^Verify and close finding \d+$/ })
    .first()
    .click();
  await desk.getByLabel('Verification note').fill('Checked the controller on site: 6.0 rpm.');
  await desk.getByRole('button', { name: 'Close finding', exact: true }).click();
  // Closing does not return the ride to service: its follow-up inspection does (tests/browser/verdict-loop).
  await desk.getByText('RIDE STATUS NOW').waitFor({ timeout: 15000 });
  await screenshot(desk, 'notice-closed-desktop');

  // Through the API: acknowledged, closed with the operator's evidence, the ride still stopped.
  const notice = await api<{
    notice: {
      acknowledgedAt: string | null;
      rideId?: string;
      findings: { state: string; correctiveActions: { photoShas: string[] }[] }[];
    };
  }>(`/api/notices/${noticeId}`, 'supervisor@pivotwatch.test');
  expect(notice.notice.acknowledgedAt).not.toBeNull();
  expect(notice.notice.findings[0].state).toBe('closed');
  expect(notice.notice.findings[0].correctiveActions[0].photoShas).toHaveLength(1);
  const rides = await api<{ rides: { name: string; status: string }[] }>(
    '/api/rides?q=Tidebreaker',
    'supervisor@pivotwatch.test',
  );
  expect(rides.rides[0].status).toBe('out_of_service');
});
