/**
 * The review queue is asked on every read whether a new day has begun at any site. The zones' days are
 * worked out again only in a new quarter hour of UTC or after a write: every zone's midnight falls on a
 * quarter hour (offsets are whole quarter hours in the IANA tz database, common practice), so nothing is
 * missed. Pacific/Auckland keeps NZDT (UTC+13) in December, so its day begins at 11:00 UTC (IANA tz
 * database; the demo has a site there).
 */
import * as scheduleDue from '@/server/schedule-due';
import { ensureQueueFresh, queueDay, refreshQueue } from '@/server/queue/queue-refresh';

import { makeTestServer, type TestServer } from './helpers';

let server: TestServer;
beforeAll(async () => {
  server = await makeTestServer();
});
afterAll(() => server.close());
afterEach(() => jest.restoreAllMocks());

test('the zones’ days are asked again only in a new quarter hour or after a write', () => {
  ensureQueueFresh(server.db, '2026-12-04T10:01:00.000Z');
  const asked = jest.spyOn(scheduleDue, 'zoneDays');
  ensureQueueFresh(server.db, '2026-12-04T10:05:00.000Z');
  ensureQueueFresh(server.db, '2026-12-04T10:14:59.999Z');
  expect(asked).toHaveBeenCalledTimes(0);
  ensureQueueFresh(server.db, '2026-12-04T10:15:00.000Z');
  expect(asked).toHaveBeenCalledTimes(1);
  ensureQueueFresh(server.db, '2026-12-04T10:20:00.000Z');
  expect(asked).toHaveBeenCalledTimes(1);
  server.db.transaction((tx) => refreshQueue(tx, queueDay(server.db)));
  ensureQueueFresh(server.db, '2026-12-04T10:21:00.000Z');
  expect(asked).toHaveBeenCalledTimes(3);
  // Same days all along: the queue was never rebuilt for a later clock.
  expect(queueDay(server.db)).toBe('2026-12-04T10:01:00.000Z');
});

test('a new day at one site rebuilds the queue at the first read of its quarter hour', () => {
  ensureQueueFresh(server.db, '2026-12-04T10:59:59.999Z');
  const before = JSON.parse(scheduleDue.zoneDays(server.db, '2026-12-04T10:59:59.999Z'));
  expect(before['Pacific/Auckland']).toBe('2026-12-04');
  ensureQueueFresh(server.db, '2026-12-04T11:00:00.000Z');
  expect(queueDay(server.db)).toBe('2026-12-04T11:00:00.000Z');
  const after = JSON.parse(scheduleDue.zoneDays(server.db, '2026-12-04T11:00:00.000Z'));
  expect(after['Pacific/Auckland']).toBe('2026-12-05');
  expect(after['Europe/London']).toBe('2026-12-04');
});
