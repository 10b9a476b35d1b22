/**
 * A ride kept in the review queue by a returned inspection that was over a limit or failed items: its row
 * says why and opens that inspection (server side: tests/server/review-queue.test.ts).
 */
import { queueItemHref, queueItemLabel, queueItemWhat } from '@/features/review/queue-text';
import type { QueueItem } from '@/features/review/schema';

const rideRow = (patch: Partial<QueueItem>): QueueItem => ({
  key: 'r:ride-1',
  kind: 'ride',
  inspectionId: null,
  inspectionType: null,
  rideId: 'ride-1',
  rideName: 'Gull Wing',
  rideClass: 'pendulum_swing',
  rideStatus: 'in_service',
  siteId: null,
  siteName: null,
  operatorId: 'op-1',
  operatorName: 'Tamsworth Pier Leisure',
  inspectorId: null,
  inspectorName: null,
  urgency: 'overdue',
  at: '2026-03-01',
  analysisStatus: null,
  failedItems: 0,
  overdueSince: '2026-03-01',
  findingsPastDue: 0,
  ...patch,
});

describe('a ride flagged by a returned inspection', () => {
  test('says which inspection keeps the alarm and opens it', () => {
    const item = rideRow({
      inspectionId: 'insp-7',
      inspectionType: 'periodic',
      urgency: 'over',
      analysisStatus: 'over',
      overdueSince: null,
    });
    expect(queueItemWhat(item)).toBe('Periodic inspection returned over limit, not yet resolved');
    expect(queueItemLabel(item)).toBe(
      'Over limit: Gull Wing, Periodic inspection returned over limit, not yet resolved',
    );
    expect(queueItemHref(item)).toBe('/review/insp-7');
  });

  test('failed items, with an overdue inspection as well', () => {
    const item = rideRow({
      inspectionId: 'insp-8',
      inspectionType: 'daily_pre_opening',
      urgency: 'failed',
      failedItems: 2,
    });
    expect(queueItemWhat(item)).toBe(
      'Daily pre-opening inspection returned with failed items, not yet resolved · Inspection overdue since 1 Mar 2026',
    );
  });

  test('a ride in the queue for its dates alone opens the ride, as before', () => {
    const item = rideRow({});
    expect(queueItemWhat(item)).toBe('Inspection overdue since 1 Mar 2026');
    expect(queueItemHref(item)).toBe('/rides/ride-1');
  });
});
