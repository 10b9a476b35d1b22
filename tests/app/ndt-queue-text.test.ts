/**
 * The review queue's words for a ride's pivot-life flags (server side: tests/server/ndt-api.test.ts and
 * tests/server/ndt-queue-wear.test.ts): an NDT past due, and wear projected to its limit before the next
 * inspection with the earlier date suggested. Dates read as the app formats them (lib/dates.ts).
 */
import { queueItemLabel, queueItemLifeFacts, queueItemWhat } from '@/features/review/queue-text';
import type { QueueItem } from '@/features/review/schema';
import { formatDate } from '@/lib/dates';

const item = (patch: Partial<QueueItem>): QueueItem => ({
  key: 'r:ride-1',
  kind: 'ride',
  inspectionId: null,
  inspectionType: null,
  rideId: 'ride-1',
  rideName: 'Lantern Wheel',
  rideClass: 'wheel',
  rideStatus: 'in_service',
  siteId: null,
  siteName: null,
  operatorId: 'op-1',
  operatorName: 'Tamsworth Pier Leisure',
  inspectorId: null,
  inspectorName: null,
  urgency: 'overdue',
  at: '2026-11-01',
  analysisStatus: null,
  failedItems: 0,
  overdueSince: null,
  findingsPastDue: 0,
  ...patch,
});

test('a ride overdue for NDT alone says so, and is labelled overdue', () => {
  const row = item({ ndtDueOn: '2026-11-01' });
  expect(queueItemWhat(row)).toBe(`NDT overdue since ${formatDate('2026-11-01')}`);
  expect(queueItemLabel(row)).toBe(`Overdue: Lantern Wheel, NDT overdue since ${formatDate('2026-11-01')}`);
});

test('a wear flag names the cautious limit date and the suggested inspection, after the other reasons', () => {
  const row = item({
    urgency: 'near',
    overdueSince: '2026-10-01',
    wearLimitOn: '2026-07-31',
    wearSuggestedOn: '2026-07-17',
  });
  expect(queueItemLifeFacts(row)).toEqual([
    `Wear may reach its limit by ${formatDate('2026-07-31')}, before the next inspection: inspect by ${formatDate('2026-07-17')}`,
  ]);
  expect(queueItemWhat(row).split(' · ')).toEqual([
    `Inspection overdue since ${formatDate('2026-10-01')}`,
    queueItemLifeFacts(row)[0],
  ]);
});

test('an inspection row carries the ride’s flags after the inspection', () => {
  const row = item({
    kind: 'inspection',
    inspectionId: 'insp-1',
    inspectionType: 'periodic',
    inspectorName: 'Tomas Reyne',
    urgency: 'overdue',
    ndtDueOn: '2026-11-01',
  });
  expect(queueItemWhat(row)).toMatch(/^Periodic inspection by Tomas Reyne · NDT overdue since /);
});

test('rows from before the flags existed read as before', () => {
  expect(queueItemLifeFacts(item({ overdueSince: '2026-03-01' }))).toEqual([]);
  expect(queueItemWhat(item({ overdueSince: '2026-03-01' }))).toBe(
    `Inspection overdue since ${formatDate('2026-03-01')}`,
  );
});
