/**
 * The operator's daily check on the phone (features/daily-checks/device.ts), on the real device schema and
 * migrations in memory and the real push against the fake server (which checks each signature as the
 * server does, with the key the phone registered): started from the class's daily checklist (never its
 * general one), kept as a draft, refused until complete, queued signed, sent once the connection returns.
 */
import { randomUUID } from 'node:crypto';

import {
  dailyCheckFailed,
  dailyCheckProblems,
  readDailyRides,
  sentDailyChecks,
  setTestRun,
  startDailyCheck,
  submitDailyCheck,
} from '@/features/daily-checks/device';
import { loadDraft } from '@/features/device-db';
import { answerItem, type Draft } from '@/features/records';
import type { ChecklistTemplate } from '@/features/registry/schema';
import { writeRides, writeTemplates } from '@/features/sync/cache';
import { pushOutbox } from '@/features/sync/push';
import { makeRideSummary } from '@/tests/support/inspection-fixtures';
import { type MemoryDeviceDb, signedInDeviceDb } from '@/tests/support/memory-device-db';

import { FakeSyncServer } from './fake-sync-server';

jest.mock('@/features/session/token-store', () => ({ tokenStore: { get: async () => null } }));

const OPERATOR = 'operator-on-test-phone';
const wheel = makeRideSummary({ id: 'r-wheel', name: 'Lantern Wheel', rideClass: 'wheel' });
const kite = makeRideSummary({ id: 'r-kite', name: 'Little Kite', rideClass: 'pendulum_swing' });
const T0 = new Date('2026-06-15T06:45:00.000Z');

function template(
  id: string,
  rideClass: ChecklistTemplate['rideClass'],
  inspectionType: ChecklistTemplate['inspectionType'],
  texts: string[],
): ChecklistTemplate {
  return {
    id,
    name: id,
    rideClass,
    inspectionType,
    createdAt: '2026-01-01T00:00:00.000Z',
    archivedAt: null,
    currentVersion: 1,
    updatedAt: '2026-01-01T00:00:00.000Z',
    updatedByName: 'Rowan Ashby',
    areaCount: 1,
    itemCount: texts.length,
    version: {
      version: 1,
      createdAt: '2026-01-01T00:00:00.000Z',
      createdByName: 'Rowan Ashby',
      reason: 'New template',
      content: {
        areas: [
          {
            id: `${id}-area`,
            title: 'Before opening',
            items: texts.map((text, i) => ({
              id: `${id}-${i}`,
              text,
              guidance: null,
              photoRequired: false,
              measurementRequired: false,
              measurementKind: null,
              measurementLabel: null,
            })),
          },
        ],
      },
    },
  };
}

const declaration = {
  text: 'I made these checks before opening and recorded what I found.',
  declaredAt: T0.toISOString(),
  declaredBy: OPERATOR,
  declaredByName: 'Test Operator',
};

let dev: MemoryDeviceDb;
beforeEach(async () => {
  dev = await signedInDeviceDb(OPERATOR);
  await writeRides(dev, [wheel, kite]);
  await writeTemplates(dev, [
    template('wheel-general', 'wheel', null, ['Spokes and rim', 'Drive', 'Gondola hangers']),
    template('wheel-daily', 'wheel', 'daily_pre_opening', ['Every gondola door latches', 'Gates closed']),
    template('kite-general', 'pendulum_swing', null, ['Arm', 'Pivot']),
  ]);
});
afterEach(async () => {
  await dev.close();
});

test('a ride with a daily checklist starts from it, never from the general one; without one it says so', async () => {
  const rides = await readDailyRides(dev);
  expect(rides.map((r) => [r.ride.name, r.hasTemplate, r.draftId])).toEqual([
    ['Lantern Wheel', true, null],
    ['Little Kite', false, null],
  ]);
  const draft = await startDailyCheck(dev, wheel.id, randomUUID(), T0);
  expect(draft).toMatchObject({
    type: 'daily_pre_opening',
    templateId: 'wheel-daily',
    designVersionId: null,
  });
  expect(draft.checklist.map((a) => a.text)).toEqual(['Every gondola door latches', 'Gates closed']);
  // Kept on the phone, and found again from the ride list.
  expect((await loadDraft<Draft>(dev, draft.id))?.data.checklist).toHaveLength(2);
  expect((await readDailyRides(dev))[0].draftId).toBe(draft.id);
  await expect(startDailyCheck(dev, kite.id, randomUUID(), T0)).rejects.toThrow(/no daily checklist/);
});

test('refused until complete; a failure says the ride must not open; queued signed; sent when back online', async () => {
  const tpl = template('wheel-daily', 'wheel', 'daily_pre_opening', [
    'Every gondola door latches',
    'Gates closed',
  ]);
  let d = await startDailyCheck(dev, wheel.id, randomUUID(), T0);
  expect(dailyCheckProblems(d, tpl)).toEqual([
    'Not answered: Every gondola door latches',
    'Not answered: Gates closed',
    'Record the test run: the empty cycles run and how the ride behaved',
  ]);
  await expect(submitDailyCheck(dev, d, tpl, declaration, T0)).rejects.toThrow(/Not answered/);
  expect(await sentDailyChecks(dev)).toEqual([]);

  d = answerItem(d, 'wheel-daily-0', { result: 'fail', note: 'Gondola 7 door does not latch' }, T0);
  d = answerItem(d, 'wheel-daily-1', { result: 'pass' }, T0);
  d = setTestRun(d, { cycles: 2, result: 'pass' }, T0);
  expect(dailyCheckProblems(d, tpl)).toEqual([]);
  expect(dailyCheckFailed(d)).toBe(true);

  const record = await submitDailyCheck(dev, d, tpl, declaration, new Date(T0.getTime() + 60_000));
  expect(record).toMatchObject({ type: 'daily_pre_opening', authorId: OPERATOR, preview: null });
  expect(record.testRuns).toEqual([{ cycles: 2, result: 'pass' }]);
  const queued = await sentDailyChecks(dev);
  expect(queued.map((i) => i.state)).toEqual(['queued']);
  expect(queued[0].deviceKeyId).toEqual(expect.any(String));

  // Offline, nothing leaves and nothing is lost.
  const server = new FakeSyncServer();
  server.pushFaults = ['cut-before'];
  const offline = await pushOutbox(server, dev, { newId: randomUUID, now: () => T0, force: true });
  expect(offline.failure?.kind).toBe('network');
  expect((await sentDailyChecks(dev)).map((i) => i.state)).toEqual(['queued']);

  // Back online: the fake server checks the signature with the key the phone registered, as the server does.
  const online = await pushOutbox(server, dev, { newId: randomUUID, now: () => T0, force: true });
  expect(online).toMatchObject({ accepted: 1, rejected: 0, failure: null });
  expect(server.records.get(record.id)).toEqual(record);
  expect((await sentDailyChecks(dev)).map((i) => i.state)).toEqual(['accepted']);
});
