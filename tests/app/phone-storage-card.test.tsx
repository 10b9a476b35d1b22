/**
 * The phone storage card (Account) and the low-space banner over the real device database (SQLite in
 * memory with the real migrations). The platform's storage figures are stood in for: the Storage API
 * wrapper has its own tests (tests/device/storage-space.test.ts). Sizes read with SI prefixes
 * (1 MB = 10^6 B, as lib/bytes.ts promises).
 */
import { screen, fireEvent, waitFor } from 'expo-router/testing-library';

import { putPhotoBlob } from '@/features/device-db/photos';
import { saveDraft, submitDraft } from '@/features/device-db/drafts';
import { DeviceDbProvider } from '@/features/device-db/provider';
import { LowStorageBanner, PhoneStorageCard } from '@/features/device-db/ui';
import type { StorageSpace } from '@/features/device-db/storage-space-types';
import type { SessionUser } from '@/features/session/schema';

import { fakeJpeg, makeRecord, photoRef } from '@/tests/support/inspection-fixtures';
import { type MemoryDeviceDb, memoryDeviceDb } from '@/tests/support/memory-device-db';
import { renderScreens, sessionClient } from '@/tests/support/app-screens';

jest.setTimeout(30_000);

jest.mock('@/features/session/token-store', () => ({
  tokenStore: { get: async () => null, set: async () => {}, clear: async () => {} },
}));

let mockSpace: StorageSpace | null = null;
jest.mock('@/features/device-db/storage-space', () => ({
  readStorageSpace: async () => mockSpace,
  requestPersistentStorage: async () => 'persisted',
}));

const inspector: SessionUser = {
  id: 'u-ins',
  email: 'tobin.reyes@halvard.example',
  name: 'Tobin Reyes',
  role: 'inspector',
  companyId: null,
  companyName: null,
};

const MB = 1_000_000;
let dev: MemoryDeviceDb;
let clients: ReturnType<typeof sessionClient>[] = [];

beforeEach(async () => {
  dev = await memoryDeviceDb();
});
afterEach(async () => {
  jest.useRealTimers();
  // No cache timer (the banner looks again every few minutes) may outlive its test.
  for (const c of clients) c.clear();
  clients = [];
  await dev.close();
});

/** One record the server accepted 40 days ago and approved, with a photo; one waiting to be sent. */
async function seed() {
  const old = new Date(Date.now() - 40 * 86_400_000);
  const photo = await putPhotoBlob(dev, { bytes: fakeJpeg(1, 5000), mime: 'image/jpeg' }, old);
  const sent = makeRecord({ photos: [photoRef(photo.sha256, 'image/jpeg', 5000)] });
  await saveDraft(dev, { id: sent.id, rideId: sent.rideId, data: {} }, old);
  await submitDraft(dev, sent, old);
  dev.sqlite
    .prepare("UPDATE outbox SET state = 'accepted', updated_at = ? WHERE id = ?")
    .run(old.toISOString(), sent.id);
  dev.sqlite.prepare("UPDATE photo_blobs SET upload_state = 'uploaded'").run();
  dev.sqlite
    .prepare('INSERT INTO decisions (inspection_id, json, updated_at) VALUES (?, ?, ?)')
    .run(sent.id, JSON.stringify({ inspectionId: sent.id, state: 'approved' }), old.toISOString());
  const waiting = makeRecord();
  await saveDraft(dev, { id: waiting.id, rideId: waiting.rideId, data: {} });
  await submitDraft(dev, waiting);
  return { sent, waiting };
}

function renderWith(node: () => React.ReactElement, withDevice = true) {
  const client = sessionClient(inspector);
  clients.push(client);
  const view = renderScreens(
    client,
    { index: node },
    '/',
    withDevice ? (slot) => <DeviceDbProvider open={async () => dev}>{slot}</DeviceDbProvider> : undefined,
  );
  // renderRouter turns on fake timers; the in-memory database waits on real ones between statements.
  jest.useRealTimers();
  return view;
}

test('shows the space left, what the phone keeps, and frees what the policy lets go', async () => {
  mockSpace = {
    usedBytes: 12 * MB,
    availableBytes: 1988 * MB,
    totalBytes: 2000 * MB,
    persistence: 'persisted',
  };
  const { sent, waiting } = await seed();
  renderWith(() => <PhoneStorageCard />);
  expect(await screen.findByText('1.99 GB free of 2.00 GB')).toBeTruthy();
  expect(screen.getByText('Pivotwatch uses 12.0 MB in this browser.')).toBeTruthy();
  expect(await screen.findByText(/^1 inspection, 0 photos · /)).toBeTruthy();
  expect(screen.getByText(/^1 inspection, 1 photo · /)).toBeTruthy();
  expect(screen.queryByText(/Low space/)).toBeNull();

  fireEvent.press(screen.getByRole('button', { name: /Free space now/ }));
  expect(
    await screen.findByText(
      'Removed 1 sent inspection and 1 photo (5.00 kB of photos). Nothing waiting to send was touched.',
    ),
  ).toBeTruthy();
  const ids = dev.sqlite.prepare('SELECT id FROM outbox').all() as { id: string }[];
  expect(ids.map((r) => r.id)).toEqual([waiting.id]);
  expect(ids.map((r) => r.id)).not.toContain(sent.id);
  expect(dev.sqlite.prepare('SELECT count(*) AS n FROM photo_blobs').get()).toEqual({ n: 0 });
  await waitFor(() => expect(screen.getByText(/^0 inspections, 0 photos · /)).toBeTruthy());
});

test('low space: the card and the banner say so in words (colour is not the only signal), with a way to Account', async () => {
  mockSpace = {
    usedBytes: 300 * MB,
    availableBytes: 150 * MB,
    totalBytes: 450 * MB,
    persistence: 'best_effort',
  };
  renderWith(() => (
    <>
      <LowStorageBanner />
      <PhoneStorageCard />
    </>
  ));
  expect(
    await screen.findByText(/Low space: 150 MB left on this phone for Pivotwatch\. Send what is waiting/),
  ).toBeTruthy();
  expect(
    screen.getByText('Low space. Send what is waiting while you have signal, then free space here.'),
  ).toBeTruthy();
  expect(screen.getByText(/The browser may clear this data when the phone runs short of space/)).toBeTruthy();
  expect(screen.getByRole('link', { name: 'Account' })).toBeTruthy();
});

test('no banner with room to spare, and neither part without a device database (desk roles)', async () => {
  mockSpace = {
    usedBytes: 1 * MB,
    availableBytes: 5000 * MB,
    totalBytes: 5001 * MB,
    persistence: 'persisted',
  };
  renderWith(() => (
    <>
      <LowStorageBanner />
      <PhoneStorageCard />
    </>
  ));
  // Both read the same figures: once the card shows them, the banner has decided too.
  expect(await screen.findByText('5.00 GB free of 5.00 GB')).toBeTruthy();
  expect(screen.queryByText(/Low space/)).toBeNull();

  mockSpace = {
    usedBytes: 300 * MB,
    availableBytes: 10 * MB,
    totalBytes: 310 * MB,
    persistence: 'persisted',
  };
  renderWith(
    () => (
      <>
        <LowStorageBanner />
        <PhoneStorageCard />
      </>
    ),
    false,
  );
  await waitFor(() => expect(screen.queryByText(/Low space/)).toBeNull());
  expect(screen.queryByText('Storage on this phone')).toBeNull();
});
