/**
 * A ride cycle recorded with the phone, pushed with its inspection: the server analyses the recorded joint
 * with the record's rate (the same code as the phone, so the phone's preview agrees) and stores the
 * measured rider accelerations beside the computed ones; a bad record is refused naming its field and
 * nothing is stored. Physics reference: a rider at p = (p_x, p_y) on a body swinging harmonically,
 * θ = A·sin ωt, feels along the spine at the bottom of the swing (θ = 0, θ̈ = 0) f_y = g − θ̇²·p_y with
 * θ̇ = A·ω (rigid-body kinematics; any dynamics textbook, from memory), i.e. Gz = 1 + A²ω²·|p_y|/g.
 */
import { randomUUID } from 'node:crypto';

import { analyseRecord, previewOf } from '@/features/records/analysis';
import type { MotionRecord } from '@/features/records/motion-record-schema';
import { attributeJoint, defaultSign, trimToCycles } from '@/features/motion-recording';
import { analysePending } from '@/server/sync/analysis';

import { makeTestServer, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';
import { demoRide, makeRecord } from './sync-fixtures';
import { seatSwingTrace } from '@/tests/support/motion-fixtures';

let server: TestServer;
let api: Clients;
let kite: ReturnType<typeof demoRide>;
beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
  kite = demoRide(server.db, 'Little Kite');
});
afterAll(() => server.close());

const push = (records: unknown[]) => api.inspector.push(records);
const g = 9.80665;
// A swing a little smaller and slower than the design's (75°, 6.5 s), recorded at 60 Hz in the back row.
const A = (60 * Math.PI) / 180;
const T = 6.8;

function recordFor(seatIndex: number): MotionRecord {
  const seat = kite.design.seats[seatIndex];
  const trace = seatSwingTrace({
    amplitudeRad: A,
    periodS: T,
    seatM: seat.positionM as [number, number],
    rateHz: 60,
    durationS: 16,
    phaseRad: 4.4,
    biasRadS: 0.01,
    noiseRadS: 0.004,
  });
  const { joint, parentRateRadS } = attributeJoint(kite.design, seat.body);
  const out = trimToCycles(
    trace,
    { joint, seat: seatIndex, axis: 'z', sign: defaultSign(kite.design, seatIndex), parentRateRadS },
    '2026-05-04T08:20:00.000Z',
    randomUUID(),
  );
  if (!out.ok) throw new Error(out.message);
  return out.record;
}

test('the server runs the recorded joint on the record and keeps the measured rider accelerations', async () => {
  const motion = recordFor(1);
  expect(motion.cycles).toBe(2);
  const base = makeRecord(kite, { readings: [] });
  const phone = analyseRecord(kite.design, { ...base, motionRecords: [motion] }, null);
  const record = { ...base, motionRecords: [motion], preview: previewOf(phone) };
  expect((await push([record])).body.results[0]).toMatchObject({ status: 'accepted' });
  await analysePending(server.db);

  const got = (await api.supervisor.get(`/api/inspections/${record.id}`)).body.inspection;
  const a = got.analysis;
  // The same code on the same record: the phone's preview and the server agree.
  expect(a.differences).toEqual([]);
  expect(a.joints[0].peakForceN).toBe(phone.joints[0].peakForce.value);
  // …and the record, not the design's 75° swing, is what ran: the design-only analysis differs.
  const designOnly = analyseRecord(kite.design, base, null);
  expect(Math.abs(a.joints[0].peakForceN / designOnly.joints[0].peakForce.value - 1)).toBeGreaterThan(0.02);

  const [rider] = a.measuredRider;
  expect(rider).toMatchObject({ recordId: motion.id, seat: 1, name: kite.design.seats[1].name, cutoffHz: 5 });
  const py = Math.abs(kite.design.seats[1].positionM[1]);
  const w = (2 * Math.PI) / T;
  // Within 1 %: the 5 Hz low-pass leaves a 0.15 Hz swing alone; the seat's small x offset adds θ̈·p_x = 0 at θ = 0.
  expect(rider.gzMax).toBeCloseTo(1 + (A * w) ** 2 * (py / g), 1);
  expect(Math.abs(rider.gzMax / (1 + ((A * w) ** 2 * py) / g) - 1)).toBeLessThan(0.01);
  expect(rider.limits).toEqual(kite.design.rider);
  // The computed seat values are kept beside them, for the review desk to show side by side.
  expect(a.seats[1].gzMax).toBeGreaterThan(1);
});

test('a bad motion record is refused naming its field, and nothing is stored', async () => {
  const motion = recordFor(0);
  const cases: [string, (m: MotionRecord) => unknown, RegExp][] = [
    [
      'times that do not increase',
      (m) => ({ ...m, timeS: m.timeS.map((t, k) => (k === 30 ? m.timeS[29] : t)) }),
      /^motionRecords\.0\.timeS\.30$/,
    ],
    // JSON has no NaN: a phone that produced one sends null, which is not a finite number.
    [
      'a sample that is not a number',
      (m) => ({ ...m, rateRadS: m.rateRadS.map((w, k) => (k === 12 ? null : w)) }),
      /^motionRecords\.0\.rateRadS\.12$/,
    ],
    [
      'less than one cycle',
      (m) => {
        const n = Math.floor(m.timeS.length / 5);
        return {
          ...m,
          timeS: m.timeS.slice(0, n),
          rateRadS: m.rateRadS.slice(0, n),
          gxG: m.gxG?.slice(0, n),
          gzG: m.gzG?.slice(0, n),
        };
      },
      /^motionRecords\.0\.rateRadS$/,
    ],
    [
      'sampled too slowly',
      (m) => {
        const every = (v?: number[]) => v?.filter((_, k) => k % 4 === 0);
        return {
          ...m,
          timeS: every(m.timeS),
          rateRadS: every(m.rateRadS),
          gxG: every(m.gxG),
          gzG: every(m.gzG),
        };
      },
      /^motionRecords\.0\.sampleRateHz$/,
    ],
  ];
  for (const [, spoil, path] of cases) {
    const record = { ...makeRecord(kite, { readings: [] }), motionRecords: [spoil(motion)] };
    const res = await push([record]);
    expect(res.status).toBe(200);
    const result = res.body.results[0];
    expect(result.status).toBe('rejected');
    expect(result.issues.some((i: { path: string }) => path.test(i.path))).toBe(true);
    expect((await api.supervisor.get(`/api/inspections/${record.id}`)).status).toBe(404);
  }
});
