/**
 * Reading a measured motion record from text. Outside references: the unit definitions of ISO 80000-3
 * (1° = π/180 rad; one revolution = 2π rad, so 1 rpm = 2π/60 rad/s); the comma-separated layout of
 * RFC 4180; the semicolon or tab with a decimal comma written by spreadsheets in decimal-comma locales
 * (common practice, not a standard).
 */
import { describeRecord, parseRecord } from '@/features/calculator/csv-record';

const ok = (r: ReturnType<typeof parseRecord>) => {
  if (!r.ok) throw new Error(JSON.stringify(r.problems));
  return r;
};

test('comma separated with a header: degrees become radians (ISO 80000-3: 1° = π/180 rad)', () => {
  const r = ok(parseRecord('time_s,angle_deg\n0,0\n0.1,90\n0.2,180\n0.3,-45\n0.4,360\n', 'angle_deg'));
  expect(r.headerLines).toBe(1);
  expect(r.quantity).toBe('angle');
  expect(r.timeS).toEqual([0, 0.1, 0.2, 0.3, 0.4]);
  expect(r.values[1]).toBeCloseTo(Math.PI / 2, 14);
  expect(r.values[2]).toBeCloseTo(Math.PI, 14);
  expect(r.values[3]).toBeCloseTo(-Math.PI / 4, 14);
  expect(r.values[4]).toBeCloseTo(2 * Math.PI, 14);
});

test('semicolons with decimal commas, CRLF line ends and two header lines (spreadsheet practice)', () => {
  const text = 'Logger 7 export\r\nt [s];rate [rpm]\r\n0,00;10,0\r\n0,02;10,5\r\n0,04;-3,25\r\n0,06;60\r\n';
  const r = ok(parseRecord(text, 'rate_rpm'));
  expect(r.headerLines).toBe(2);
  expect(r.quantity).toBe('rate');
  expect(r.timeS).toEqual([0, 0.02, 0.04, 0.06]);
  // 1 rpm = 2π/60 rad/s (ISO 80000-3: one revolution is 2π rad).
  expect(r.values[0]).toBeCloseTo((10 * 2 * Math.PI) / 60, 14);
  expect(r.values[2]).toBeCloseTo((-3.25 * 2 * Math.PI) / 60, 14);
  expect(r.values[3]).toBeCloseTo(2 * Math.PI, 14);
});

test('tab separated, comments and blank lines skipped, rates in °/s (π/180 rad/s each)', () => {
  const text = '# phone gyro, arm\n\ntime\trate\n0\t90\n0.01\t-180\n\n0.02\t45.5\n# end\n0.03\t1e2\n';
  const r = ok(parseRecord(text, 'rate_deg_s'));
  expect(r.timeS).toEqual([0, 0.01, 0.02, 0.03]);
  expect(r.values[0]).toBeCloseTo(Math.PI / 2, 14);
  expect(r.values[1]).toBeCloseTo(-Math.PI, 14);
  expect(r.values[2]).toBeCloseTo((45.5 * Math.PI) / 180, 14);
  expect(r.values[3]).toBeCloseTo((100 * Math.PI) / 180, 14);
});

test('space separated columns and quoted fields are read', () => {
  const r = ok(parseRecord('0 1\n0.5   2\n1.0 3\n1.5 4\n', 'rate_rpm'));
  expect(r.timeS).toEqual([0, 0.5, 1, 1.5]);
  const q = ok(parseRecord('"t","w"\n"0","1"\n"1","2"\n"2","3"\n"3","4"\n', 'rate_rpm'));
  expect(q.timeS).toEqual([0, 1, 2, 3]);
  expect(q.headerLines).toBe(1);
});

test('a bad row after the numbers start is refused with its line number, not skipped', () => {
  const r = parseRecord('t,a\n0,1\n0.1,2\n0.2,oops\n0.3,4\n0.4,5\n', 'angle_deg');
  expect(r.ok).toBe(false);
  if (!r.ok) {
    expect(r.problems).toHaveLength(1);
    expect(r.problems[0].line).toBe(4);
    expect(r.problems[0].message).toMatch(/^Line 4 is not two numbers/);
  }
});

test('times that do not increase, missing or extra columns and infinities name their lines', () => {
  const r = parseRecord('0,1\n0.1,2\n0.1,3\n0.2\n0.3,1,2\n0.4,inf\n', 'angle_deg');
  expect(r.ok).toBe(false);
  if (!r.ok) {
    expect(r.problems.map((p) => p.line)).toEqual([3, 4, 5, 6]);
    expect(r.problems[0].message).toMatch(/time 0.1 s does not come after 0.1 s/);
    expect(r.problems[1].message).toMatch(/one value/);
    expect(r.problems[2].message).toMatch(/3 values/);
    expect(r.problems[3].message).toMatch(/not finite/);
  }
});

test('a file of anything but numbers, or too few samples, is refused as a whole', () => {
  const none = parseRecord('hello\nworld\n', 'rate_rpm');
  expect(none.ok).toBe(false);
  if (!none.ok) expect(none.problems[0]).toEqual({ line: null, message: expect.stringMatching(/No rows/) });
  // A cubic fit to angles needs five samples, a quadratic fit to rates four (the engine's minimum).
  const short = parseRecord('0,1\n1,2\n2,3\n3,4\n', 'angle_deg');
  expect(short.ok).toBe(false);
  expect(parseRecord('0,1\n1,2\n2,3\n3,4\n', 'rate_rpm').ok).toBe(true);
});

test('a long wrong file lists only its first five bad lines', () => {
  const text = ['0,0', ...Array.from({ length: 50 }, (_, i) => `${i + 1},x`)].join('\n');
  const r = parseRecord(text, 'rate_rpm');
  expect(r.ok).toBe(false);
  if (!r.ok) expect(r.problems.map((p) => p.line)).toEqual([2, 3, 4, 5, 6]);
});

test('the account of a record: samples, span and the sample rate of its usual interval', () => {
  const text = Array.from({ length: 101 }, (_, i) => `${i / 50},${i}`).join('\n');
  const r = ok(parseRecord(text, 'angle_deg'));
  const d = describeRecord(r);
  expect(d.samples).toBe(101);
  expect(d.spanS).toBeCloseTo(2, 12);
  expect(d.rateHz).toBeCloseTo(50, 9);
});

test('a gap in a record does not change the sample rate it is said to have', () => {
  const rows = Array.from({ length: 201 }, (_, i) => i / 100).filter((t) => t < 1 || t >= 1.5);
  const r = ok(parseRecord(rows.map((t) => `${t},1`).join('\n'), 'rate_rpm'));
  expect(describeRecord(r).rateHz).toBeCloseTo(100, 6);
  expect(describeRecord(r).spanS).toBeCloseTo(2, 12);
});
