/**
 * The inspector's checklist includes the makers' bulletins still open on the ride, offline: the real
 * server's pull answer goes through the phone's own pull into the real device database (in memory), the
 * draft is built from the cached ride and template as the phone's "Start inspection" builds it
 * (features/inspections/field-api.ts: readRide, readTemplates, newDraft), and the record it makes is
 * signed and accepted by the server, which then records the passed bulletin done. The next pull leaves
 * it out of the ride, so the next inspection no longer asks.
 */
import { randomUUID } from 'node:crypto';

import type { Bulletin } from '@/features/bulletins/schema';
import { answerItem, newDraft, toRecord } from '@/features/records/draft';
import { pull } from '@/features/sync/pull';
import { readCurrentDesign, readRide, readTemplates } from '@/features/sync/cache';

import { FakeSyncServer } from './fake-sync-server';
import { makeTestServer, type TestServer } from '@/tests/server/helpers';
import { demoClients, type Clients } from '@/tests/server/registry-helpers';
import { demoRide, testDeclaration } from '@/tests/server/sync-fixtures';
import { type MemoryDeviceDb, signedInDeviceDb } from '@/tests/support/memory-device-db';

// The API client reads the session from expo-secure-store, which has no native side under node.
jest.mock('@/features/session/token-store', () => ({ tokenStore: { get: async () => null } }));

let server: TestServer;
let api: Clients;
let dev: MemoryDeviceDb;
let phone: FakeSyncServer;

beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
});
afterAll(() => server.close());
beforeEach(async () => {
  dev = await signedInDeviceDb();
  phone = new FakeSyncServer();
});
afterEach(async () => {
  await dev.close();
});

/** Hands the server's own pull answer (as the inspector) to the phone's pull. */
async function syncFromServer(cursor: string | null = null): Promise<string> {
  const res = await api.inspector.get(
    `/api/sync/pull${cursor ? `?cursor=${encodeURIComponent(cursor)}` : ''}`,
  );
  expect(res.status).toBe(200);
  phone.pullPages = [res.body];
  await pull(phone, dev);
  return res.body.cursor;
}

async function startInspection(rideId: string, now: Date) {
  const ride = await readRide(dev, rideId);
  if (!ride) throw new Error('ride not on the phone');
  const design = await readCurrentDesign(dev, rideId);
  const [template] = await readTemplates(dev, ride.rideClass);
  return {
    template,
    draft: newDraft({
      id: randomUUID(),
      ride,
      designVersionId: design?.id ?? null,
      template: template ?? null,
      type: 'daily_pre_opening',
      now,
      bulletins: ride.openBulletins,
    }),
  };
}

test('each open bulletin adds an item after the template’s; passing it records the bulletin done', async () => {
  const skylark = demoRide(server.db, 'Skylark');
  const made = await api.supervisor.post('/api/bulletins', {
    maker: 'Orrin Ride Works',
    models: ['PX-15'],
    reference: 'ORW-SB-26-11',
    title: 'Restraint latch inspection',
    issuedOn: '2026-04-01',
    severity: 'stop_ride',
    requiredAction: 'Check every lap-bar latch pawl for wear against gauge G-4',
    beforeNextOperation: true,
  });
  expect(made.status).toBe(201);
  const bulletin: Bulletin = made.body.bulletin;

  const cursor = await syncFromServer();
  const now = new Date('2026-05-04T08:00:00.000Z');
  const { template, draft } = await startInspection(skylark.id, now);
  expect(template).toBeDefined();
  const templateItems = template.version.content.areas.flatMap((a) => a.items.map((i) => i.id));
  // The template's items first, in order, then one item per open bulletin (the demo's ORW-SB-26-04 too).
  expect(draft.checklist.slice(0, templateItems.length).map((a) => a.itemId)).toEqual(templateItems);
  const added = draft.checklist.slice(templateItems.length);
  expect(added.map((a) => a.area)).toEqual(added.map(() => 'Maker bulletins'));
  expect(added.find((a) => a.itemId === `bulletin:${bulletin.id}`)).toEqual({
    itemId: `bulletin:${bulletin.id}`,
    area: 'Maker bulletins',
    text: 'Bulletin ORW-SB-26-11: Check every lap-bar latch pawl for wear against gauge G-4',
    result: null,
  });
  expect(added.map((a) => a.text)).toContainEqual(expect.stringMatching(/^Bulletin ORW-SB-26-04: /));

  // Every item passed but the demo bulletin, left not applicable (it stays open).
  let answered = draft;
  for (const a of draft.checklist)
    answered = answerItem(
      answered,
      a.itemId,
      { result: a.text.includes('ORW-SB-26-04') ? 'na' : 'pass' },
      now,
    );
  const record = toRecord(answered, null, new Date('2026-05-04T08:40:00.000Z'), testDeclaration);
  const push = await api.inspector.push([record]);
  expect(push.body.results[0]).toMatchObject({ id: record.id, status: 'accepted' });

  const onRide = await api.supervisor.get(`/api/rides/${skylark.id}/bulletins`);
  const states = new Map(
    onRide.body.bulletins.map((r: { bulletin: Bulletin; state: string }) => [r.bulletin.reference, r.state]),
  );
  expect(states.get('ORW-SB-26-11')).toBe('done');
  expect(states.get('ORW-SB-26-04')).toBe('open');

  // The next sync takes it off the phone's copy of the ride: the next inspection does not ask again.
  await syncFromServer(cursor);
  const next = await startInspection(skylark.id, now);
  const items = next.draft.checklist.map((a) => a.itemId);
  expect(items).not.toContain(`bulletin:${bulletin.id}`);
  expect(next.draft.checklist.some((a) => a.text.startsWith('Bulletin ORW-SB-26-04: '))).toBe(true);
});

test('a ride cached before bulletins (no openBulletins) starts with the template’s items alone', async () => {
  await syncFromServer();
  const tidebreaker = demoRide(server.db, 'Tidebreaker');
  const ride = await readRide(dev, tidebreaker.id);
  const { openBulletins, ...older } = ride!;
  expect(openBulletins?.length).toBeGreaterThan(0); // the demo's overdue ORW-SB-26-07
  const [template] = await readTemplates(dev, older.rideClass);
  const draft = newDraft({
    id: randomUUID(),
    ride: older,
    designVersionId: null,
    template,
    type: 'daily_pre_opening',
    now: new Date(),
  });
  expect(draft.checklist.every((a) => !a.itemId.startsWith('bulletin:'))).toBe(true);
});
