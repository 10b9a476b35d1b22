/**
 * The generated unit factors (lib/unit-factors.generated.ts) against a fresh run of their generator and
 * against the exact definitions behind the units:
 * - international yard and pound agreement of 1959 (US National Bureau of Standards, Federal Register
 *   notice of 1 July 1959): 1 ft = 0.3048 m and 1 lb = 0.453 592 37 kg, exact; 1 in = 25.4 mm follows;
 * - 3rd General Conference on Weights and Measures (CGPM), 1901: standard acceleration of gravity
 *   g_n = 9.806 65 m/s², exact; so 1 lbf = 0.453 592 37 × 9.806 65 N = 4.448 221 615 260 5 N exactly;
 * - NIST Special Publication 811 (2008), Appendix B, for the derived factors it lists (psi → Pa 6.894 757 E+03,
 *   lbf·ft → N·m 1.355 818 E+00).
 */
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';

import { OUTPUT, UNIT_NAMES, render } from '@/scripts/gen-unit-factors';
import { UNIT_FACTORS } from '@/lib/unit-factors.generated';
import { type QuantityKind, conversionFactor, displayUnits, fromSI, isKnownUnit, toSI } from '@/lib/units';

const ROOT = join(__dirname, '..', '..');
/** Relative agreement to a few units in the last place of a double. */
const near = (actual: number, expected: number, rel = 4e-16) =>
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(rel * Math.abs(expected));

describe('the committed unit factors', () => {
  test('are what the generator writes from mathjs today (the file is not stale)', () => {
    expect(readFileSync(OUTPUT, 'utf8')).toBe(render());
  });

  test('cover every unit name the generator lists, and no more', () => {
    expect(Object.keys(UNIT_FACTORS).sort()).toEqual([...UNIT_NAMES].sort());
  });

  test('cover every display unit of every kind in both systems, to and from SI', () => {
    const kinds: QuantityKind[] = [
      'force',
      'moment',
      'length',
      'lengthSmall',
      'mass',
      'angle',
      'rate',
      'angularAccel',
      'accel',
      'stress',
      'pressure',
      'time',
      'frequency',
    ];
    for (const kind of kinds)
      for (const system of ['si', 'us'] as const)
        for (const unit of displayUnits(kind, system)) {
          expect(isKnownUnit(unit.mathjs)).toBe(true);
          // 1 SI unit there and back is 1 (to rounding of two multiplications).
          near(toSI(fromSI(1, kind, unit.mathjs), kind, unit.mathjs), 1, 1e-15);
        }
  });

  test('are reciprocal within rounding for every pair', () => {
    for (const [from, row] of Object.entries(UNIT_FACTORS))
      for (const [to, f] of Object.entries(row)) near(f * conversionFactor(to, from), 1, 1e-15);
  });
});

describe('factors against their exact definitions', () => {
  test('1959 agreement: the international foot, inch and pound', () => {
    near(conversionFactor('ft', 'm'), 0.3048);
    near(conversionFactor('in', 'mm'), 25.4);
    near(conversionFactor('in', 'm'), 0.0254);
    near(conversionFactor('lb', 'kg'), 0.45359237);
    near(conversionFactor('mm^2', 'in^2'), 1 / (25.4 * 25.4));
  });

  test('CGPM 1901: standard gravity, and the pound-force built on it', () => {
    near(conversionFactor('gee', 'm/s^2'), 9.80665);
    near(conversionFactor('lbf', 'N'), 0.45359237 * 9.80665);
    near(conversionFactor('lbf', 'N'), 4.4482216152605);
    near(conversionFactor('kgf', 'N'), 9.80665);
    // 1 psi = 1 lbf / (0.0254 m)² = 6894.757 293 168… Pa exactly; mathjs defines the psi as
    // 6894.75729276459 Pa (6e-11 low, far below any reading) and the table keeps mathjs's value.
    // NIST SP 811 lists 6.894 757 E+03 Pa.
    near(conversionFactor('psi', 'Pa'), 6894.75729276459);
    near(conversionFactor('psi', 'Pa'), (0.45359237 * 9.80665) / 0.0254 ** 2, 1e-10);
    near(conversionFactor('ksi', 'MPa'), (0.45359237 * 9.80665) / 0.0254 ** 2 / 1000, 1e-10);
    // 1 lbf·ft = 4.448 221 615 260 5 N × 0.3048 m; NIST SP 811: 1.355 818 E+00 N·m.
    near(conversionFactor('lbf ft', 'N m'), 0.45359237 * 9.80665 * 0.3048, 1e-15);
  });

  test('mathjs defines the kip as 4448.2216 N, i.e. 1000 lbf to 8 significant figures', () => {
    // NIST SP 811 lists 1 kip = 4.448 222 E+03 N; mathjs rounds the definition, so the kip is not exactly
    // 1000 lbf (3.4e-9 low, far below any reading) — the table keeps mathjs's value.
    near(conversionFactor('kip', 'N'), 4448.2216, 1e-15);
    near(conversionFactor('kip', 'lbf') / 1000, 1, 4e-9);
  });

  test('angles and rates: π/180 per degree, one revolution (2π rad) per minute for rpm', () => {
    near(conversionFactor('deg', 'rad'), Math.PI / 180);
    near(conversionFactor('rpm', 'rad/s'), (2 * Math.PI) / 60);
    near(conversionFactor('deg/s', 'rad/s'), Math.PI / 180);
    near(conversionFactor('cycle', 'rad'), 2 * Math.PI);
  });

  test('SI prefixes and time', () => {
    near(conversionFactor('kN m', 'N m'), 1000);
    near(conversionFactor('MPa', 'Pa'), 1e6);
    near(conversionFactor('bar', 'kPa'), 100);
    near(conversionFactor('h', 's'), 3600);
    near(conversionFactor('um', 'mm'), 0.001);
  });

  test('a unit the table lacks, or two quantities, is refused as mathjs refused it', () => {
    expect(() => conversionFactor('N', 'm')).toThrow('No conversion from "N" to "m"');
    expect(() => conversionFactor('furlong', 'm')).toThrow(/No conversion/);
    expect(() => conversionFactor('toString', 'm')).toThrow(/No conversion/);
  });
});

describe('mathjs stays out of what runs', () => {
  test('no app, component, lib, feature or server file imports it', () => {
    const offenders: string[] = [];
    const walk = (dir: string) => {
      for (const name of readdirSync(dir)) {
        const path = join(dir, name);
        if (statSync(path).isDirectory()) walk(path);
        else if (
          /\.(ts|tsx|js|jsx)$/.test(name) &&
          /from 'mathjs|require\('mathjs/.test(readFileSync(path, 'utf8'))
        )
          offenders.push(relative(ROOT, path));
      }
    };
    for (const dir of ['app', 'components', 'lib', 'features', 'server', 'db']) walk(join(ROOT, dir));
    expect(offenders).toEqual([]);
  });
});
