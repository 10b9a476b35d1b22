import { eq } from 'drizzle-orm';

import { auditLog } from '@/db/server/schema';
import {
  assignmentListResponseSchema,
  inspectorListResponseSchema,
  rideListPageSchema,
  scheduleListResponseSchema,
  scheduleResponseSchema,
  type Schedule,
} from '@/features/registry/schema';
import { addDays } from '@/lib/dates';
import { dueStatusOf, nextDueOn } from '@/server/schedule-due';
import { demoSchedules } from '@/server/seed/demo-schedules';
import { auditRowOrder } from '@/server/registry/audit-query';

import { expectApiError, userIdOf, type TestServer } from './helpers';
import { demoClients, makePinnedServer, type Clients } from './registry-helpers';

const today = '2025-06-02';
const now = new Date(`${today}T09:30:00Z`);
let server: TestServer;
let api: Clients;
let rideIds: Map<string, string>;
beforeAll(async () => {
  server = await makePinnedServer(now);
  api = await demoClients(server.app);
  const rides = rideListPageSchema.parse((await api.admin.get('/api/rides')).body).rides;
  rideIds = new Map(rides.map((r) => [r.name, r.id]));
});
afterAll(() => server.close());

async function allSchedules(query = '') {
  const res = await api.supervisor.get(`/api/schedules?pageSize=200${query}`);
  expect(res.status).toBe(200);
  return scheduleListResponseSchema.parse(res.body);
}

describe('due dates (calendar arithmetic, checked by hand)', () => {
  test('next due = explicit date, else last done + interval; across month and year ends', () => {
    expect(nextDueOn({ dueOn: null, lastDoneOn: '2025-01-31', intervalDays: 30 })).toBe('2025-03-02');
    expect(nextDueOn({ dueOn: null, lastDoneOn: '2024-02-28', intervalDays: 1 })).toBe('2024-02-29');
    expect(nextDueOn({ dueOn: null, lastDoneOn: '2024-12-31', intervalDays: 365 })).toBe('2025-12-31');
    expect(nextDueOn({ dueOn: '2025-07-01', lastDoneOn: '2025-06-01', intervalDays: 1 })).toBe('2025-07-01');
    expect(nextDueOn({ dueOn: null, lastDoneOn: null, intervalDays: 30 })).toBeNull();
    expect(addDays('2025-03-30', -30)).toBe('2025-02-28');
  });

  test('status: overdue the day after, due within the type’s window, else upcoming', () => {
    expect(dueStatusOf('periodic', '2025-06-01', today)).toBe('overdue');
    expect(dueStatusOf('periodic', today, today)).toBe('due');
    expect(dueStatusOf('periodic', '2025-06-09', today)).toBe('due');
    expect(dueStatusOf('periodic', '2025-06-10', today)).toBe('upcoming');
    expect(dueStatusOf('daily_pre_opening', '2025-06-03', today)).toBe('upcoming');
    expect(dueStatusOf('annual', '2025-07-02', today)).toBe('due');
    expect(dueStatusOf('annual', null, today)).toBe('unscheduled');
  });
});

describe('the demo schedule', () => {
  test('has several inspections due, exactly one overdue, and some assigned to the demo inspector', async () => {
    const { schedules, total } = await allSchedules();
    expect(total).toBe(demoSchedules.length);
    const overdue = schedules.filter((s) => s.dueStatus === 'overdue');
    expect(overdue.map((s) => [s.rideName, s.inspectionType, s.daysUntilDue])).toEqual([
      ['Tidebreaker', 'follow_up', -3],
    ]);
    expect(schedules.filter((s) => s.dueStatus === 'due').length).toBeGreaterThanOrEqual(3);
    expect(schedules.filter((s) => s.assignedTo?.name === 'Tomas Reyne').length).toBeGreaterThanOrEqual(3);
  });

  test('every listed status agrees with the rule applied to the listed dates', async () => {
    const { schedules } = await allSchedules();
    for (const s of schedules) {
      expect(s.nextDueOn).toBe(nextDueOn(s));
      expect(s.dueStatus).toBe(dueStatusOf(s.inspectionType, s.nextDueOn, today));
    }
  });

  test('filter by due status in the database matches the computed statuses', async () => {
    const { schedules } = await allSchedules();
    const dueOrOverdue = await allSchedules('&dueStatus=due,overdue');
    expect(dueOrOverdue.schedules.map((s) => s.id).sort()).toEqual(
      schedules
        .filter((s) => s.dueStatus === 'due' || s.dueStatus === 'overdue')
        .map((s) => s.id)
        .sort(),
    );
    // Soonest first by default; undated last.
    const dates = schedules.map((s) => s.nextDueOn ?? '9999');
    expect(dates).toEqual([...dates].sort());
    const unscheduled = await allSchedules('&dueStatus=unscheduled');
    expect(unscheduled.schedules.map((s) => [s.rideName, s.inspectionType])).toEqual([
      ['Tidebreaker', 'setup_after_assembly'],
    ]);
  });

  test('filter by type, assignee (me, none, an id) and text', async () => {
    const annual = await allSchedules('&inspectionType=annual');
    expect(annual.schedules.every((s) => s.inspectionType === 'annual')).toBe(true);
    const inspectorId = userIdOf(server.db, 'inspector@pivotwatch.test');
    const assigned = await allSchedules(`&assignedTo=${inspectorId}`);
    const none = await allSchedules('&assignedTo=none');
    expect(assigned.total + none.total).toBe(demoSchedules.length);
    expect((await allSchedules('&assignedTo=me')).total).toBe(0);
    expect((await allSchedules('&q=whirligig')).schedules.map((s) => s.rideName)).toEqual([
      'Whirligig Chairs',
      'Whirligig Chairs',
    ]);
  });
});

describe('GET /api/assignments/mine', () => {
  test('the inspector gets their own assignments, soonest first, with what a card needs', async () => {
    const res = await api.inspector.get('/api/assignments/mine');
    expect(res.status).toBe(200);
    const { assignments } = assignmentListResponseSchema.parse(res.body);
    expect(assignments.map((a) => [a.rideName, a.inspectionType])).toEqual([
      ['Tidebreaker', 'follow_up'],
      ['Whirligig Chairs', 'setup_after_assembly'],
      ['Skylark', 'periodic'],
      ['Twin Comet', 'annual'],
    ]);
    expect(assignments[0]).toMatchObject({
      dueStatus: 'overdue',
      rideStatus: 'restricted',
      siteName: 'Lowfield Common fairground',
      operatorName: 'Corvane Travelling Shows',
    });
  });

  test('a supervisor with none gets an empty list; operators are refused', async () => {
    expect((await api.supervisor.get('/api/assignments/mine')).body).toEqual({ assignments: [] });
    expectApiError(await api.operator.get('/api/assignments/mine'), 403, 'forbidden');
  });
});

describe('planning', () => {
  let created: Schedule;

  test('create, assign and record a done inspection; the explicit date is then cleared', async () => {
    const res = await api.supervisor.post('/api/schedules', {
      rideId: rideIds.get('Little Kite'),
      inspectionType: 'follow_up',
      dueOn: '2025-06-10',
      notes: 'Recheck the gondola floor after repair.',
    });
    expect(res.status).toBe(201);
    created = scheduleResponseSchema.parse(res.body).schedule;
    expect(created).toMatchObject({
      nextDueOn: '2025-06-10',
      dueStatus: 'upcoming',
      daysUntilDue: 8,
      assignedTo: null,
    });

    const { inspectors } = inspectorListResponseSchema.parse(
      (await api.supervisor.get('/api/inspectors')).body,
    );
    // The demo's two inspectors, by name.
    expect(inspectors.map((i) => i.name)).toEqual(['Lena Marwick', 'Tomas Reyne']);
    const tomas = inspectors.find((i) => i.name === 'Tomas Reyne')!;
    const assigned = scheduleResponseSchema.parse(
      (await api.supervisor.patch(`/api/schedules/${created.id}`, { assignedTo: tomas.id })).body,
    ).schedule;
    expect(assigned.assignedTo?.name).toBe('Tomas Reyne');
    expect(assigned.assignedAt).toBe(now.toISOString());
    const mine = assignmentListResponseSchema.parse((await api.inspector.get('/api/assignments/mine')).body);
    expect(mine.assignments.map((a) => a.id)).toContain(created.id);

    const done = scheduleResponseSchema.parse(
      (await api.supervisor.patch(`/api/schedules/${created.id}`, { lastDoneOn: '2025-06-11' })).body,
    ).schedule;
    expect(done).toMatchObject({ dueOn: null, nextDueOn: null, dueStatus: 'unscheduled' });
  });

  test('a second schedule of the same type → 409; a non-inspector assignee → 400; bad dates → 400', async () => {
    expectApiError(
      await api.admin.post('/api/schedules', {
        rideId: rideIds.get('Little Kite'),
        inspectionType: 'periodic',
      }),
      409,
      'schedule_exists',
    );
    const wrong = expectApiError(
      await api.admin.patch(`/api/schedules/${created.id}`, {
        assignedTo: userIdOf(server.db, 'operator@pivotwatch.test'),
      }),
      400,
      'validation_failed',
    );
    expect(wrong.issues).toEqual([{ path: 'assignedTo', message: 'Choose an active inspector' }]);
    const dates = expectApiError(
      await api.admin.post('/api/schedules', {
        rideId: rideIds.get('Little Kite'),
        inspectionType: 'annual',
        dueOn: '2025-02-30',
        intervalDays: 0,
      }),
      400,
      'validation_failed',
    );
    expect(dates.issues?.map((i) => i.path).sort()).toEqual(['dueOn', 'intervalDays']);
  });

  test('delete; each change is in the audit log; a ride with schedules cannot be deleted', async () => {
    expect((await api.supervisor.delete(`/api/schedules/${created.id}`)).status).toBe(204);
    expectApiError(await api.supervisor.get(`/api/schedules/${created.id}`), 404, 'not_found');
    const actions = server.db
      .select({ action: auditLog.action })
      .from(auditLog)
      .where(eq(auditLog.entityId, created.id))
      .orderBy(auditRowOrder)
      .all()
      .map((e) => e.action);
    expect(actions).toEqual(['create', 'update', 'update', 'delete']);

    const kite = rideIds.get('Little Kite');
    const perRide = (await api.supervisor.get(`/api/rides/${kite}/schedules`)).body.schedules;
    expect(perRide.map((s: Schedule) => s.inspectionType).sort()).toEqual(['annual', 'periodic']);

    const ride = await api.admin.post('/api/rides', {
      name: 'Spare Kite',
      rideClass: 'pendulum_swing',
      operatorCompanyId: (await api.admin.get('/api/companies?q=Corvane')).body.companies[0].id,
    });
    await api.admin.post('/api/schedules', { rideId: ride.body.ride.id, inspectionType: 'annual' });
    const blocked = expectApiError(await api.admin.delete(`/api/rides/${ride.body.ride.id}`), 409, 'in_use');
    expect(blocked.message).toMatch(/1 inspection schedule/);
  });
});
