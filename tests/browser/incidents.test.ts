/**
 * Incident reports in the browser against the real server and demo data: the operator of Tamsworth Pier
 * Leisure, on a phone (390×844), reports from their home an incident on Twin Comet with a photo and stops
 * the ride with it (an empty send first shows each missing answer and sends nothing); the supervisor, at a
 * desk (1440×900), finds it at the top of the review queue, opens it with its photo and the caution, and
 * marks it reviewed. What the server stored is read back over the API. Screens at both sizes.
 */
import type { RideIncidentsResponse } from '@/features/incidents/schema';
import type { QueueResponse } from '@/features/review/schema';
import { apiGet, apiToken, jpegPhoto, screenshot, serverAndBrowser } from '@/tests/support/browser/harness';

const app = serverAndBrowser();
let rideId = '';

beforeAll(async () => {
  const token = await apiToken(app.baseUrl, 'operator@pivotwatch.test');
  const { rides } = await apiGet<{ rides: { id: string; name: string; status: string }[] }>(
    app.baseUrl,
    '/api/rides',
    token,
  );
  const ride = rides.find((r) => r.name === 'Twin Comet');
  expect(ride?.status).toBe('in_service');
  rideId = ride?.id ?? '';
});

test('an operator reports an incident that stops the ride; the supervisor reviews it from the queue', async () => {
  const phone = await app.signedIn('phone', 'operator@pivotwatch.test');
  await phone.getByRole('link', { name: 'Report an incident on Twin Comet' }).click();
  await phone.getByRole('radiogroup', { name: 'What happened?' }).waitFor({ timeout: 60_000 });

  // Sending with nothing answered names each missing answer and sends nothing.
  await phone.getByRole('button', { name: 'Send report', exact: true }).click();
  await phone.getByText('Some answers need attention; nothing was sent.').waitFor();
  await phone.getByText(/Choose what happened/).waitFor();
  await phone.getByText('Say whether anyone was hurt').waitFor();
  await screenshot(phone, 'incident-form-errors-phone');
  const operatorToken = await apiToken(app.baseUrl, 'operator@pivotwatch.test');
  const incidentsUrl = `/api/rides/${rideId}/incidents`;
  expect((await apiGet<RideIncidentsResponse>(app.baseUrl, incidentsUrl, operatorToken)).incidents).toEqual(
    [],
  );

  await phone.getByRole('radio', { name: 'Injury or damage' }).click();
  await phone
    .getByLabel('What happened', { exact: true })
    .fill('Gondola B footrest cracked at the hinge\nFound when riders stepped off; nobody fell.');
  await phone.getByLabel('Riders affected').fill('4');
  await phone.getByRole('radio', { name: 'No one was hurt' }).click();
  const photo = await jpegPhoto(app.browser, 'Cracked footrest, gondola B', {
    background: '#6a5a4a',
    fontPx: 40,
    name: 'footrest.jpg',
  });
  const chooser = phone.waitForEvent('filechooser');
  await phone.getByRole('button', { name: 'Choose from library' }).click();
  await (await chooser).setFiles(photo);
  await phone.getByText('✓ Uploaded').waitFor({ timeout: 15_000 });
  await phone.getByRole('checkbox', { name: 'Stop the ride and ask for an inspection' }).click();
  const send = phone.getByRole('button', { name: 'Send report and stop the ride' });
  await send.scrollIntoViewIfNeeded();
  await screenshot(phone, 'incident-form-filled-phone');
  const box = await send.boundingBox();
  expect(box && box.height).toBeGreaterThanOrEqual(44);
  await send.click();

  await phone.getByText('This report took the ride out of service').waitFor({ timeout: 15_000 });
  await phone.getByText('Awaiting review').first().waitFor();
  await screenshot(phone, 'incident-sent-phone');

  const stored = await apiGet<RideIncidentsResponse>(app.baseUrl, incidentsUrl, operatorToken);
  expect(stored.rideStatus).toBe('out_of_service');
  expect(stored.incidents).toHaveLength(1);
  const [incident] = stored.incidents;
  expect(incident).toMatchObject({ kind: 'harm', ridersAffected: 4, anyoneHurt: false, stoppedRide: true });
  expect(incident.photoShas).toHaveLength(1);

  // ——— the supervisor at a desk ———
  const desk = await app.signedIn('desktop', 'supervisor@pivotwatch.test');
  await desk.goto(`${app.baseUrl}/review`);
  const row = desk.getByRole('link', {
    name: /^Incident: stop or injury: Twin Comet, Injury or damage reported/,
  });
  await row.waitFor({ timeout: 60_000 });
  await screenshot(desk, 'incident-queue-desktop');
  const supervisorToken = await apiToken(app.baseUrl, 'supervisor@pivotwatch.test');
  const queue = await apiGet<QueueResponse>(app.baseUrl, '/api/review/queue', supervisorToken);
  expect(queue.items[0]).toMatchObject({
    kind: 'incident',
    incidentId: incident.id,
    urgency: 'incident_serious',
  });

  await row.click();
  await desk.getByText('Gondola B footrest cracked at the hinge', { exact: false }).first().waitFor();
  await desk.getByRole('button', { name: /^Open photo: Photo 1/ }).waitFor();
  await desk.getByText('SAFETY CAUTION').waitFor();
  await desk.getByRole('button', { name: 'Mark reviewed' }).click();
  await desk.getByText('Say what was checked or decided').waitFor();
  await desk
    .getByLabel('Review note')
    .fill('Footrest replaced by the maker; follow-up inspection booked for today.');
  await desk.getByRole('button', { name: 'Mark reviewed' }).click();
  await desk
    .getByLabel('Review', { exact: true })
    .getByText('Reviewed', { exact: true })
    .waitFor({ timeout: 15_000 });
  await screenshot(desk, 'incident-reviewed-desktop');

  const after = await apiGet<QueueResponse>(app.baseUrl, '/api/review/queue', supervisorToken);
  expect(after.items.some((i) => i.incidentId === incident.id)).toBe(false);
  const reviewed = await apiGet<RideIncidentsResponse>(app.baseUrl, incidentsUrl, supervisorToken);
  expect(reviewed.incidents[0].reviewNote).toMatch(/^Footrest replaced/);
  // Reviewing a report is not a return to service.
  expect(reviewed.rideStatus).toBe('out_of_service');

  // The ride's page lists its latest reports; the form at a desk is one readable column.
  await phone.goto(`${app.baseUrl}/rides/${rideId}`);
  const card = phone.getByLabel('Incident reports', { exact: true });
  await card
    .getByRole('link', { name: /^Injury or damage, .*: Gondola B footrest cracked at the hinge$/ })
    .waitFor();
  await card.getByText('Reviewed').waitFor();
  await card.scrollIntoViewIfNeeded();
  await screenshot(phone, 'incident-ride-page-phone');
  const operatorDesk = await app.signedIn('desktop', 'operator@pivotwatch.test');
  await operatorDesk.goto(`${app.baseUrl}/rides/${rideId}/incidents/new`);
  await operatorDesk.getByRole('radiogroup', { name: 'What happened?' }).waitFor({ timeout: 60_000 });
  // Already out of service: the form offers no stop, and says why.
  await operatorDesk.getByText(/The ride is out of service already/).waitFor();
  expect(await operatorDesk.getByRole('checkbox', { name: /Stop the ride/ }).count()).toBe(0);
  await screenshot(operatorDesk, 'incident-form-desktop');
});
