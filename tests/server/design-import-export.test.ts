import { count } from 'drizzle-orm';
import * as fc from 'fast-check';

import { designVersions } from '@/db/server/schema';
import {
  DESIGN_CSV_COLUMNS,
  designToCsv,
  designToJson,
  importErrorSchema,
  parseDesignCsv,
  parseDesignJson,
  type ImportIssue,
} from '@/features/registry/csv';
import {
  designDataSchema,
  fatigueComponents,
  fatigueDetailKinds,
  ndtMethods,
  partKinds,
  type DesignData,
  type DesignPart,
  type FatigueDetail,
  type NdtPlan,
  type PinCheckData,
} from '@/features/loads/design-schema';
import {
  designImportCheckResponseSchema,
  designResponseSchema,
  rideListPageSchema,
  rideResponseSchema,
} from '@/features/registry/schema';
import { csvCell, readCsv } from '@/features/registry/design-file/csv-text';
import { demoRides } from '@/server/seed/demo';
import { demoDesigns, littleKiteDesign, tidebreakerDesign } from '@/server/seed/demo-design';

import { expectApiError, makeTestServer, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';

let server: TestServer;
let api: Clients;
let rideIds: Map<string, string>;
beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
  const rides = rideListPageSchema.parse((await api.admin.get('/api/rides')).body).rides;
  rideIds = new Map(rides.map((r) => [r.name, r.id]));
});
afterAll(() => server.close());

const versionCount = () => server.db.select({ n: count() }).from(designVersions).get()?.n;
const issuesOf = (result: ReturnType<typeof parseDesignCsv>): ImportIssue[] =>
  result.ok ? [] : result.issues;
const placed = (issues: ImportIssue[]) => issues.map((i) => [i.row, i.column]);

/** A CSV from a header and rows given as column → value maps, for hand-made test files. */
function csvOf(rows: Record<string, string>[], columns: readonly string[] = DESIGN_CSV_COLUMNS): string {
  return [columns.join(','), ...rows.map((r) => columns.map((c) => r[c] ?? '').join(','))].join('\n');
}

describe('round trip (pure)', () => {
  test.each(demoRides.map((r) => [r.name, r.serial] as const))(
    '%s: CSV and JSON give back the same data',
    (_n, serial) => {
      const data = demoDesigns[serial];
      const fromCsv = parseDesignCsv(designToCsv(data));
      expect(issuesOf(fromCsv)).toEqual([]);
      expect(fromCsv.ok && fromCsv.data).toEqual(data);
      const fromJson = parseDesignJson(designToJson(data));
      expect(fromJson.ok && fromJson.data).toEqual(data);
      // Exported again, the file itself is unchanged.
      expect(fromCsv.ok && designToCsv(fromCsv.data)).toBe(designToCsv(data));
    },
  );

  test('the header is the documented one, and every row has as many cells', () => {
    const lines = designToCsv(tidebreakerDesign).trimEnd().split('\r\n');
    expect(lines[0]).toBe(DESIGN_CSV_COLUMNS.join(','));
    expect(lines.slice(1).map((l) => l.split(',')[0])).toEqual([
      'source',
      'body',
      'body',
      'body',
      ...tidebreakerDesign.parts.map(() => 'part'),
      'pivot',
      'pivot',
      'pivot',
      // Each pivot's NDT plans, pivot by pivot in the order of its list.
      ...tidebreakerDesign.pivots.flatMap((p) => (p.ndt ?? []).map(() => 'ndt')),
      'seat',
      'seat',
      'motion',
      'motion',
      'motion',
      'rider',
      'rider',
      'fatigue',
      ...(tidebreakerDesign.fatigue?.details ?? []).map(() => 'fatigue_detail'),
    ]);
    expect(tidebreakerDesign.pivots.flatMap((p) => p.ndt ?? []).length).toBeGreaterThan(0);
    expect(tidebreakerDesign.fatigue?.details.length).toBeGreaterThan(0);
  });

  // Names with commas, quotes, line breaks and non-Latin text; numbers of any size, −0 included.
  const text = fc
    .string({
      unit: fc.constantFrom('a', 'Z', ' ', ',', '"', '\n', '\r\n', 'é', 'Ω', '–', '7', ';', "'"),
      maxLength: 30,
    })
    .map((s) => s.trim())
    .filter((s) => s.length > 0);
  const real = (min = -1e6, max = 1e6) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });
  const positive = fc.double({ min: 1e-9, max: 1e9, noNaN: true, noDefaultInfinity: true });
  const xy = fc.tuple(real(), real());

  function partArb(body: number): fc.Arbitrary<DesignPart> {
    const base = { body: fc.constant(body), name: text, massKg: positive };
    return fc.oneof(
      fc.record({ ...base, kind: fc.constant('rod' as const), fromM: xy, toM: xy }),
      fc.record({ ...base, kind: fc.constant('point' as const), atM: xy }),
      fc.record({
        ...base,
        kind: fc.constantFrom('disc' as const, 'ring' as const, 'sphere' as const),
        centreM: xy,
        radiusM: positive,
      }),
      fc.record({
        ...base,
        kind: fc.constant('plate' as const),
        centreM: xy,
        widthM: positive,
        heightM: positive,
      }),
      fc.record(
        {
          ...base,
          kind: fc.constant('counterweight' as const),
          centreM: xy,
          widthM: positive,
          heightM: positive,
        },
        { requiredKeys: ['body', 'name', 'massKg', 'kind', 'centreM'] },
      ),
      fc.record({ ...base, kind: fc.constant('custom' as const), cgM: xy, inertiaCgKgM2: real(0, 1e6) }),
    );
  }

  const factor = fc.double({ min: 1, max: 3, noNaN: true });
  const pinCheckArb: fc.Arbitrary<PinCheckData> = fc.record(
    {
      pinGrade: text.map((s) => s.slice(0, 40).trim() || 'S355'),
      pinFyPa: positive,
      pinFuPa: positive,
      plateGrade: text.map((s) => s.slice(0, 40).trim() || 'S355'),
      plateFyPa: positive,
      innerPlateM: positive,
      outerPlateM: positive,
      gapM: fc.double({ min: 0, max: 1, noNaN: true }),
      replaceable: fc.boolean(),
      gammaM0: factor,
      gammaM2: factor,
      gammaM6ser: factor,
      gammaF: factor,
    },
    {
      requiredKeys: [
        'pinGrade',
        'pinFyPa',
        'pinFuPa',
        'plateGrade',
        'plateFyPa',
        'innerPlateM',
        'outerPlateM',
        'gapM',
      ],
    },
  );
  const ndtArb: fc.Arbitrary<NdtPlan> = fc.record(
    { method: fc.constantFrom(...ndtMethods), intervalDays: fc.integer({ min: 1, max: 3660 }), note: text },
    { requiredKeys: ['method', 'intervalDays'] },
  );
  /** A fatigue detail: its stress from a factor or, for a force, from a section (with or without planes). */
  const detailArb = (n: number): fc.Arbitrary<FatigueDetail> =>
    fc
      .record(
        {
          joint: fc.integer({ min: 0, max: n - 1 }),
          name: text,
          kind: fc.constantFrom(...fatigueDetailKinds),
          member: fc.constantFrom('body' as const, 'parent' as const),
          component: fc.constantFrom(...fatigueComponents),
          stress: fc.oneof(
            fc.record({ stressPerKnMPa: positive }),
            fc.record(
              { sectionAreaMm2: positive, shearPlanes: fc.constantFrom(1 as const, 2 as const) },
              { requiredKeys: ['sectionAreaMm2'] },
            ),
          ),
          categoryMPa: fc.double({ min: 1, max: 200, noNaN: true }),
          shear: fc.boolean(),
          gammaFf: factor,
          gammaMf: factor,
          damageLimit: fc.double({ min: 0.01, max: 1, noNaN: true }),
        },
        {
          requiredKeys: ['joint', 'name', 'kind', 'member', 'component', 'stress', 'categoryMPa'],
        },
      )
      .map(({ stress, ...f }) =>
        f.component === 'torque' && !('stressPerKnMPa' in stress)
          ? { ...f, stressPerKnMPa: stress.sectionAreaMm2 }
          : { ...f, ...stress },
      );

  const designArb: fc.Arbitrary<DesignData> = fc.integer({ min: 1, max: 3 }).chain((n) => {
    const joints = Array.from({ length: n }, (_, i) => i);
    const optionalKeys = <T>(arb: fc.Arbitrary<T>) => fc.option(arb, { nil: undefined });
    return fc
      .record({
        source: fc.record({ document: text, revision: text.map((s) => s.slice(0, 40).trim() || 'A') }),
        gravityMS2: optionalKeys(real(0, 100)),
        nearMargin: optionalKeys(fc.double({ min: 0.01, max: 0.99, noNaN: true })),
        bodies: fc.tuple(
          ...joints.map((i) =>
            fc.record({ name: text, tipM: i < n - 1 ? xy : fc.option(xy, { nil: undefined }) }),
          ),
        ),
        parts: fc.tuple(...joints.map((i) => fc.array(partArb(i), { minLength: 1, maxLength: 3 }))),
        pivots: fc.tuple(
          ...joints.map((joint) =>
            fc
              .record({
                name: text,
                shear: fc.constantFrom('single' as const, 'double' as const),
                bearingLengthM: positive,
                nominalDiameterM: fc.double({ min: 0.01, max: 1, noNaN: true }),
                wear: fc.double({ min: 0.001, max: 0.5, noNaN: true }),
                maxClearanceM: positive,
                maxShearStressPa: optionalKeys(positive),
                maxBearingPressurePa: optionalKeys(positive),
                maxForceN: optionalKeys(positive),
                maxTorqueNm: optionalKeys(positive),
                pinCheck: optionalKeys(pinCheckArb),
                ndt: optionalKeys(fc.array(ndtArb, { minLength: 1, maxLength: 3 })),
              })
              .map(({ wear, ...p }) => ({ ...p, joint, minimumDiameterM: p.nominalDiameterM * (1 - wear) })),
          ),
        ),
        seats: fc.array(
          fc.record({
            body: fc.integer({ min: 0, max: n - 1 }),
            name: text,
            positionM: xy,
            spineAngleRad: real(-10, 10),
            facing: optionalKeys(fc.constantFrom('cw' as const, 'ccw' as const)),
          }),
          { maxLength: 3 },
        ),
        motion: fc.tuple(
          ...joints.map((joint) =>
            fc.oneof(
              fc.record({
                joint: fc.constant(joint),
                kind: fc.constant('constant' as const),
                rpm: real(-1000, 1000),
                maxRateRadS: optionalKeys(positive),
              }),
              fc.record({
                joint: fc.constant(joint),
                kind: fc.constant('swing' as const),
                amplitudeRad: fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }),
                periodS: positive,
                maxAmplitudeRad: optionalKeys(positive),
              }),
              fc.record({ joint: fc.constant(joint), kind: fc.constant('fixed' as const), angleRad: real() }),
            ),
          ),
        ),
        fatigue: optionalKeys(
          fc.record(
            {
              rideCycleS: fc.double({ min: 0.1, max: 86400, noNaN: true }),
              stopsPerRideCycle: fc.integer({ min: 0, max: 100 }),
              details: fc.array(detailArb(n), { maxLength: 3 }),
            },
            { requiredKeys: ['rideCycleS', 'details'] },
          ),
        ),
        rider: fc.record(
          {
            gx: fc.record({ min: optionalKeys(real(-10, -0.1)), max: optionalKeys(real(0.1, 10)) }),
            gz: fc.record({ min: optionalKeys(real(-10, -0.1)), max: optionalKeys(real(0.1, 10)) }),
          },
          { requiredKeys: [] },
        ),
      })
      .map((d) => {
        // Absent optional fields are left out, as the schema's output leaves them.
        const clean = JSON.parse(JSON.stringify({ ...d, parts: d.parts.flat() }));
        return designDataSchema.parse(clean);
      });
  });

  test('any valid design data survives CSV and JSON export → import unchanged (property)', () => {
    fc.assert(
      fc.property(designArb, (data) => {
        const fromCsv = parseDesignCsv(designToCsv(data));
        expect(issuesOf(fromCsv)).toEqual([]);
        expect(fromCsv.ok && fromCsv.data).toEqual(data);
        const fromJson = parseDesignJson(designToJson(data));
        expect(fromJson.ok && fromJson.data).toEqual(data);
      }),
      { numRuns: 150 },
    );
  });

  test('the generator reaches every part kind', () => {
    const kinds = new Set(fc.sample(designArb, 200).flatMap((d) => d.parts.map((p) => p.kind)));
    expect([...kinds].sort()).toEqual([...partKinds].sort());
  });

  test('the generator reaches pin checks, NDT plans and every form of fatigue detail', () => {
    const sample = fc.sample(designArb, 200);
    const details = sample.flatMap((d) => d.fatigue?.details ?? []);
    expect(sample.some((d) => d.pivots.some((p) => p.pinCheck))).toBe(true);
    expect(
      new Set(sample.flatMap((d) => d.pivots.flatMap((p) => p.ndt ?? []).map((n) => n.method))).size,
    ).toBe(ndtMethods.length);
    expect(details.some((f) => f.stressPerKnMPa !== undefined)).toBe(true);
    expect(details.some((f) => f.shearPlanes !== undefined)).toBe(true);
    expect(details.some((f) => f.component === 'torque')).toBe(true);
    expect(sample.some((d) => d.fatigue && d.fatigue.details.length === 0)).toBe(true);
  });
});

describe('CSV errors: every problem with its row and column, no data', () => {
  const good = () =>
    designToCsv(littleKiteDesign)
      .trimEnd()
      .split('\r\n')
      .map((line) => line.split(','));
  const col = (name: string) => DESIGN_CSV_COLUMNS.indexOf(name as (typeof DESIGN_CSV_COLUMNS)[number]);
  const join = (rows: string[][]) => rows.map((r) => r.join(',')).join('\n');

  test('bad numbers, a decimal comma, a cell in the wrong column, an unknown kind — all reported at once', () => {
    const rows = good();
    // Rows are 1-based in the file: rows[0] is row 1 (the header), rows[3] is row 4 (the first part).
    rows[3][col('mass_kg')] = 'heavy';
    rows[4][col('width_m')] = '"3,2"';
    rows[5][col('rpm')] = '12';
    rows[6][col('kind')] = 'blob';
    const result = parseDesignCsv(join(rows));
    expect(result.ok).toBe(false);
    expect(placed(issuesOf(result))).toEqual([
      [4, 'mass_kg'],
      [5, 'width_m'],
      [6, 'rpm'],
      [7, 'kind'],
    ]);
    const messages = issuesOf(result).map((i) => i.message);
    expect(messages[1]).toBe('"3,2" uses a decimal comma: write 3.2');
    expect(messages[2]).toBe('Leave empty in point part rows');
    expect(issuesOf(result)[0].path).toBe('row 4, mass_kg');
  });

  test('schema problems land on their cells: minimum ≥ nominal, a seat on a missing body, a missing motion field', () => {
    const rows = good();
    const pivot = rows.findIndex((r) => r[0] === 'pivot');
    const seat = rows.findIndex((r) => r[0] === 'seat');
    const motion = rows.findIndex((r) => r[0] === 'motion');
    rows[pivot][col('minimum_diameter_m')] = '0.2';
    rows[seat][col('body')] = '3';
    rows[motion][col('period_s')] = '';
    const issues = issuesOf(parseDesignCsv(join(rows)));
    expect(placed(issues)).toEqual([
      [pivot + 1, 'minimum_diameter_m'],
      [seat + 1, 'body'],
      [motion + 1, 'period_s'],
    ]);
    expect(issues[0].message).toBe('Must be below the nominal diameter');
    expect(issues[2].message).toBe('Required for swing motion');
  });

  test('row numbers follow the file’s lines, also after a quoted name spanning two lines and a blank line', () => {
    const rows = good();
    rows[2][col('name')] = '"Arm and\ngondola"';
    rows[3][col('mass_kg')] = '-1';
    const text = join(rows.slice(0, 3)) + '\n\n' + join(rows.slice(3));
    // header 1, source 2, body 3–4, blank 5, first part 6.
    expect(placed(issuesOf(parseDesignCsv(text)))).toEqual([[6, 'mass_kg']]);
  });

  test('header problems: unknown and repeated columns, no record column, semicolons, an empty file', () => {
    expect(placed(issuesOf(parseDesignCsv(csvOf([], ['record', 'mass', 'name', 'name']))))).toEqual([
      [1, 'mass'],
      [1, 'name'],
    ]);
    expect(placed(issuesOf(parseDesignCsv('name,kind\nx,rod')))).toEqual([[1, 'record']]);
    expect(issuesOf(parseDesignCsv('record;body;name\nbody;0;Arm'))[0].message).toMatch(/semicolons/);
    expect(issuesOf(parseDesignCsv(''))[0]).toMatchObject({ row: null, path: '(file)' });
    expect(issuesOf(parseDesignCsv('record,name\n"never closed'))[0]).toMatchObject({ row: 2 });
  });

  test('structure problems: no source, two sources, bodies out of order, an unknown record', () => {
    const issues = issuesOf(
      parseDesignCsv(
        csvOf([
          { record: 'body', body: '1', name: 'Arm' },
          { record: 'source', document: 'D', revision: 'A' },
          { record: 'source', document: 'E', revision: 'B' },
          { record: 'gondola', name: 'x' },
        ]),
      ),
    );
    expect(issues.slice(0, 3).map((i) => [i.row, i.column, i.message])).toEqual([
      [2, 'body', 'Bodies are numbered in order from 0: expected 0 here'],
      [4, 'record', 'Only one source row is allowed (the first is on row 3)'],
      [
        5,
        'record',
        'Unknown record "gondola"; use one of source, analysis, body, part, pivot, seat, motion, rider, ndt, fatigue, fatigue_detail',
      ],
    ]);
    // And what the schema can still see: no parts, no pivot, no motion for joint 0.
    expect(issues.slice(3).map((i) => i.path)).toEqual(['parts', 'parts', 'pivots', 'motion']);
    const noSource = issuesOf(parseDesignCsv(csvOf([{ record: 'body', body: '0', name: 'Arm' }])));
    expect(noSource[0].message).toMatch(/No source row/);
  });
});

describe('pin checks, NDT plans and fatigue data in the CSV', () => {
  const rowsOf = (d: DesignData) => readCsv(designToCsv(d)).records.map((r) => r.cells);
  const col = (name: string) => DESIGN_CSV_COLUMNS.indexOf(name as (typeof DESIGN_CSV_COLUMNS)[number]);
  const join = (rows: string[][]) => rows.map((r) => r.map(csvCell).join(',')).join('\n');
  const rowsOfKind = (rows: string[][], record: string) =>
    rows.flatMap((r, i) => (r[0] === record ? [i] : []));

  test('bad pin-check, NDT and fatigue cells are each reported on their row and column, all at once', () => {
    const rows = rowsOf(littleKiteDesign);
    const [pivot] = rowsOfKind(rows, 'pivot');
    const [ndt1, ndt2] = rowsOfKind(rows, 'ndt');
    const [fatigue] = rowsOfKind(rows, 'fatigue');
    const [d1, d2, d3] = rowsOfKind(rows, 'fatigue_detail');
    rows[pivot][col('pin_fy_pa')] = 'strong';
    rows[pivot][col('pin_fu_pa')] = '';
    rows[ndt1][col('method')] = 'xr';
    rows[ndt2][col('interval_days')] = '0';
    rows[fatigue][col('ride_cycle_s')] = '-5';
    rows[d1][col('stress_per_kn_mpa')] = '0.5';
    rows[d2][col('member')] = 'arm';
    rows[d3][col('in_shear')] = 'maybe';
    rows[d3][col('category_mpa')] = '250';
    const result = parseDesignCsv(join(rows));
    const issues = issuesOf(result);
    // Rows in the file are 1-based: rows[k] is row k + 1.
    expect(issues.map((i) => [i.row, i.column, i.message])).toEqual([
      [pivot + 1, 'pin_fy_pa', '"strong" is not a number (SI units, point as the decimal mark)'],
      [pivot + 1, 'pin_fu_pa', 'Required'],
      [ndt1 + 1, 'method', 'One of VT, MT, PT, UT, ET'],
      [ndt2 + 1, 'interval_days', 'At least 1 day'],
      [fatigue + 1, 'ride_cycle_s', 'Ride cycle time must be greater than 0'],
      [d1 + 1, 'stress_per_kn_mpa', 'Give either the stress per kN or the section area, not both'],
      [d2 + 1, 'member', 'body or parent'],
      [d3 + 1, 'in_shear', '"maybe" is not yes or no'],
      [d3 + 1, 'category_mpa', 'At most 200 MPa'],
    ]);
    expect(issues[0].path).toBe(`row ${pivot + 1}, pin_fy_pa`);
    // A method is read whatever its case, as the trade writes it.
    rows[ndt1][col('method')] = ' ut ';
    const ndtOnly = issuesOf(parseDesignCsv(join(rows))).filter((i) => i.row === ndt1 + 1);
    expect(ndtOnly).toEqual([]);
  });

  test('structure: an NDT plan without its pivot, details without a fatigue row, two fatigue rows, a detail on a missing joint', () => {
    const rows = rowsOf(littleKiteDesign);
    const [ndt1] = rowsOfKind(rows, 'ndt');
    const [fatigue] = rowsOfKind(rows, 'fatigue');
    const [d1] = rowsOfKind(rows, 'fatigue_detail');
    const [seat] = rowsOfKind(rows, 'seat');
    rows[ndt1][col('joint')] = '3';
    rows[d1][col('joint')] = '5';
    rows[seat][col('gap_m')] = '0.004';
    const twice = [...rows, rows[fatigue]];
    expect(issuesOf(parseDesignCsv(join(twice))).map((i) => [i.row, i.column, i.message])).toEqual([
      [ndt1 + 1, 'joint', 'No pivot row for joint 3: an NDT plan belongs to a pivot'],
      [seat + 1, 'gap_m', 'Leave empty in seat rows'],
      [d1 + 1, 'joint', 'No joint 5 in the chain'],
      [twice.length, 'record', `Only one fatigue row is allowed (the first is on row ${fatigue + 1})`],
    ]);
    const noFatigue = rows.filter((_r, i) => i !== fatigue);
    expect(issuesOf(parseDesignCsv(join(noFatigue))).filter((i) => i.row === null)).toEqual([
      {
        row: null,
        column: 'record',
        path: 'record',
        message:
          'Fatigue detail rows need a fatigue row: add one with record "fatigue" and the ride cycle time (ride_cycle_s)',
      },
    ]);
  });

  test('a detail with neither its stress per kN nor its section: said on the stress cell; planes need a section', () => {
    const rows = rowsOf(littleKiteDesign);
    const [d1] = rowsOfKind(rows, 'fatigue_detail');
    expect(rows[d1][col('shear_planes')]).toBe('2');
    rows[d1][col('section_area_mm2')] = '';
    expect(issuesOf(parseDesignCsv(join(rows))).map((i) => [i.row, i.column, i.message])).toEqual([
      [d1 + 1, 'stress_per_kn_mpa', 'Give the stress per kN or the section area it comes from'],
      [d1 + 1, 'shear_planes', 'Only with a section area'],
    ]);
  });

  test('a file written before pin checks, NDT plans and fatigue existed still imports, as it always did', () => {
    // The header export wrote before these columns were added (features/registry/README.md, earlier revision).
    const oldHeader =
      'record,body,joint,name,kind,mass_kg,x_m,y_m,to_x_m,to_y_m,radius_m,width_m,height_m,inertia_kg_m2,tip_x_m,tip_y_m,shear,bearing_length_m,nominal_diameter_m,minimum_diameter_m,max_clearance_m,max_shear_stress_pa,max_bearing_pressure_pa,max_force_n,max_torque_nm,spine_angle_rad,facing,rpm,amplitude_rad,period_s,angle_rad,max_rate_rad_s,max_amplitude_rad,free_swing,service_decel_rad_s2,emergency_decel_rad_s2,axis,min_g,max_g,document,revision,gravity_m_s2,near_margin'.split(
        ',',
      );
    const { fatigue: _f, ...rest } = littleKiteDesign;
    const old: DesignData = {
      ...rest,
      pivots: littleKiteDesign.pivots.map(({ pinCheck: _p, ndt: _n, ...p }) => p),
    };
    const rows = rowsOf(old).slice(1);
    const oldFile = join([oldHeader, ...rows.map((r) => oldHeader.map((c) => r[col(c)]))]);
    const result = parseDesignCsv(oldFile);
    expect(issuesOf(result)).toEqual([]);
    expect(result.ok && result.data).toEqual(old);
    expect(result.ok && result.data.fatigue).toBeUndefined();
  });
});

describe('JSON errors', () => {
  test('not JSON, or JSON that is not valid design data', () => {
    const broken = parseDesignJson('{"source": ');
    expect(broken.ok || broken.issues[0]).toMatchObject({ path: '(file)', row: null });
    const wrong = parseDesignJson(JSON.stringify({ ...littleKiteDesign, bodies: [] }));
    expect(wrong.ok || wrong.issues.map((i) => i.path)).toContain('bodies');
  });

  test('pin-check, NDT and fatigue problems are named by their path in the data', () => {
    const [pivot] = littleKiteDesign.pivots;
    const fatigue = littleKiteDesign.fatigue;
    if (!pivot.pinCheck || !pivot.ndt || !fatigue) throw new Error('Little Kite needs its life data');
    const bad = {
      ...littleKiteDesign,
      pivots: [
        {
          ...pivot,
          pinCheck: { ...pivot.pinCheck, gapM: -0.001 },
          ndt: [pivot.ndt[0], { method: 'RT', intervalDays: 365 }],
        },
      ],
      fatigue: { ...fatigue, details: [{ ...fatigue.details[0], component: 'torque' }] },
    };
    const result = parseDesignJson(JSON.stringify(bad));
    expect(result.ok || result.issues.map((i) => [i.path, i.message])).toEqual([
      ['pivots.0.pinCheck.gapM', 'Cannot be negative'],
      ['pivots.0.ndt.1.method', 'One of VT, MT, PT, UT, ET'],
      ['fatigue.details.0.sectionAreaMm2', 'A torque needs the stress per kN·m, not an area'],
    ]);
  });
});

describe('POST /api/rides/:id/design/import and GET …/export', () => {
  test('export CSV → import into another ride → identical design data; the file is named after the ride', async () => {
    const exported = await api.inspector.get(
      `/api/rides/${rideIds.get('Tidebreaker')}/design/export?format=csv`,
    );
    expect(exported.status).toBe(200);
    expect(exported.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(exported.headers['content-disposition']).toBe('attachment; filename=tidebreaker-design-v1.csv');

    const target = rideResponseSchema.parse(
      (
        await api.admin.post('/api/rides', {
          name: 'Tidebreaker II',
          rideClass: 'rotating_arm',
          operatorCompanyId: (await api.admin.get('/api/companies?q=Corvane')).body.companies[0].id,
        })
      ).body,
    ).ride;
    const imported = await api.supervisor
      .post(`/api/rides/${target.id}/design/import?reason=${encodeURIComponent('Copied from Tidebreaker')}`)
      .set('Content-Type', 'text/csv')
      .send(exported.text);
    expect(imported.status).toBe(201);
    const design = designResponseSchema.parse(imported.body).design;
    expect(design).toMatchObject({ version: 1, origin: 'import_csv', reason: 'Copied from Tidebreaker' });
    expect(design.data).toEqual(tidebreakerDesign);

    const again = await api.inspector.get(`/api/rides/${target.id}/design/export?format=csv`);
    expect(again.text).toBe(exported.text);
  });

  test('JSON in a JSON body, as text or as the object; dry run saves nothing', async () => {
    const kite = rideIds.get('Little Kite');
    const exported = await api.admin.get(`/api/rides/${kite}/design/export?format=json`);
    expect(exported.headers['content-type']).toBe('application/json; charset=utf-8');
    expect(JSON.parse(exported.text)).toEqual(littleKiteDesign);
    const before = versionCount();
    const check = await api.admin.post(`/api/rides/${kite}/design/import?dryRun=true`, {
      format: 'json',
      content: exported.text,
    });
    expect(designImportCheckResponseSchema.parse(check.body).data).toEqual(littleKiteDesign);
    expect(versionCount()).toBe(before);

    const changed = { ...littleKiteDesign, nearMargin: 0.85 };
    const saved = await api.admin.post(`/api/rides/${kite}/design/import`, {
      format: 'json',
      content: changed,
      reason: 'Near-limit margin from the maker’s letter',
      basedOnVersion: 1,
    });
    expect(saved.status).toBe(201);
    expect(designResponseSchema.parse(saved.body).design).toMatchObject({
      version: 2,
      origin: 'import_json',
      data: changed,
    });
    const old = await api.admin.get(`/api/rides/${kite}/design/export?format=json&version=1`);
    expect(JSON.parse(old.text)).toEqual(littleKiteDesign);
  });

  test('a file with errors → 400 import_invalid with row and column for each, nothing saved', async () => {
    const before = versionCount();
    const rows = designToCsv(littleKiteDesign).split('\r\n');
    rows[3] = rows[3].replace(',900,', ',-900,');
    const res = await api.supervisor
      .post(`/api/rides/${rideIds.get('Little Kite')}/design/import?reason=Broken`)
      .set('Content-Type', 'text/csv')
      .send(rows.join('\r\n'));
    const error = expectApiError(res, 400, 'import_invalid');
    expect(importErrorSchema.parse(res.body).error.issues).toEqual([
      { row: 4, column: 'mass_kg', path: 'row 4, mass_kg', message: 'Mass must be greater than 0' },
    ]);
    expect(error.message).toBe('The file has 1 problem; nothing was saved.');
    expect(versionCount()).toBe(before);
  });

  test('the request itself: no reason, an unknown format, no body', async () => {
    const kite = rideIds.get('Little Kite');
    const noReason = expectApiError(
      await api.admin
        .post(`/api/rides/${kite}/design/import`)
        .set('Content-Type', 'text/csv')
        .send('record\n'),
      400,
      'validation_failed',
    );
    expect(noReason.issues?.[0].path).toBe('query.reason');
    const badFormat = expectApiError(
      await api.admin.post(`/api/rides/${kite}/design/import`, { format: 'xlsx', content: 'x', reason: 'r' }),
      400,
      'validation_failed',
    );
    expect(badFormat.issues?.[0].path).toBe('format');
    expectApiError(
      await api.admin
        .post(`/api/rides/${kite}/design/import?reason=x`)
        .set('Content-Type', 'image/png')
        .send('x'),
      415,
      'unsupported_media_type',
    );
  });

  test('export: unknown version → 404, bad format → 400; operators and inspectors cannot import', async () => {
    const kite = rideIds.get('Little Kite');
    expectApiError(await api.admin.get(`/api/rides/${kite}/design/export?version=99`), 404, 'not_found');
    expectApiError(
      await api.admin.get(`/api/rides/${kite}/design/export?format=xml`),
      400,
      'validation_failed',
    );
    expectApiError(await api.operator.get(`/api/rides/${kite}/design/export`), 403, 'forbidden');
    expectApiError(
      await api.inspector.post(`/api/rides/${kite}/design/import`, {
        format: 'json',
        content: {},
        reason: 'x',
      }),
      403,
      'forbidden',
    );
  });
});
