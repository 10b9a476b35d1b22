import {
  conversionFactor,
  convert,
  formatQuantity,
  formatSignificant,
  fromSI,
  pickDisplayUnit,
  toSI,
} from '@/lib/units';

/**
 * Factors from NIST Special Publication 811 (2008), "Guide for the Use of the International System of
 * Units", Appendix B (factors to 7 significant figures, exact ones marked exact), and the definitions
 * behind them: the international pound = 0.453 592 37 kg and foot = 0.3048 m (exact, 1959 agreement);
 * standard gravity 9.806 65 m/s² (exact, 3rd CGPM 1901), so 1 lbf = 4.448 221 615 260 5 N exactly.
 */
describe('conversion factors against NIST SP 811', () => {
  it.each([
    ['lbf', 'N', 4.4482216152605, 13], // exact from the definitions
    ['kip', 'N', 4448.222, 3], // NIST: 4.448 222 E+03
    ['ft', 'm', 0.3048, 15], // exact
    ['in', 'mm', 25.4, 13], // exact
    ['lb', 'kg', 0.45359237, 15], // exact
    ['lbf ft', 'N m', 1.355818, 6], // NIST: 1.355 818 E+00
    ['psi', 'kPa', 6.894757, 6], // NIST: 6.894 757 E+00
    ['ksi', 'MPa', 6.894757, 6],
    ['gee', 'm/s^2', 9.80665, 13], // standard acceleration of gravity, exact
    ['deg', 'rad', Math.PI / 180, 15], // exact
    ['rpm', 'rad/s', (2 * Math.PI) / 60, 15], // one revolution = 2π rad, per minute
    ['kN m', 'N m', 1000, 12],
  ] as const)('1 %s = %d %s', (from, to, factor, digits) => {
    expect(conversionFactor(from, to)).toBeCloseTo(factor, digits);
  });

  it('round-trips SI values through every display unit', () => {
    const cases = [
      [1226.25, 'force', 'lbf'],
      [3.5e5, 'moment', 'kip ft'],
      [0.0499, 'lengthSmall', 'in'],
      [3.13, 'rate', 'rpm'],
      [5.09e7, 'stress', 'ksi'],
    ] as const;
    for (const [v, kind, unit] of cases) expect(toSI(fromSI(v, kind, unit), kind, unit)).toBeCloseTo(v, 9);
    expect(convert(2, 'kN', 'N')).toBe(2000);
  });
});

describe('formatting with 3–4 significant figures', () => {
  it.each([
    [1.2264, '1.226'],
    [122.625, '122.6'],
    [0.12264, '0.1226'],
    [12345.6, '12346'], // integer digits are never rounded away
    [9.99961, '10.00'], // rounding up adds a digit before the point, not after
    [-0.5, '-0.5000'],
    [1e-25, '0'], // below what any reading resolves
    [0, '0'],
  ] as const)('%d → %s', (v, text) => expect(formatSignificant(v)).toBe(text));

  it('shows forces in N below 1 kN and in kN above, lbf and kip in US units', () => {
    expect(formatQuantity(122.625, 'force', 'si').text).toBe('122.6 N');
    expect(formatQuantity(1226.25, 'force', 'si')).toEqual({ value: '1.226', unit: 'kN', text: '1.226 kN' });
    // 1226.25 N / 4.4482216152605 = 275.67 lbf; 300 kN = 67.44 kip.
    expect(formatQuantity(1226.25, 'force', 'us').text).toBe('275.7 lbf');
    expect(formatQuantity(300_000, 'force', 'us').text).toBe('67.44 kip');
  });

  it('uses the trade’s units for each kind', () => {
    expect(formatQuantity(981, 'moment', 'si').text).toBe('981.0 N·m');
    expect(formatQuantity(450_000, 'moment', 'si').text).toBe('450.0 kN·m');
    expect(formatQuantity(0.05, 'lengthSmall', 'si').text).toBe('50.00 mm');
    expect(formatQuantity(0.05, 'lengthSmall', 'us').text).toBe('1.969 in');
    expect(formatQuantity(15, 'length', 'us').text).toBe('49.21 ft');
    expect(formatQuantity(Math.PI / 2, 'angle', 'si').text).toBe('90.00°');
    expect(formatQuantity(3, 'rate', 'si').text).toBe('28.65 rpm');
    expect(formatQuantity(3.9 * 9.80665, 'accel', 'us').text).toBe('3.900 g');
    expect(formatQuantity(5.093e7, 'stress', 'si').text).toBe('50.93 MPa');
    expect(formatQuantity(5.093e7, 'stress', 'us').text).toBe('7.387 ksi');
    expect(formatQuantity(16_000, 'mass', 'si').text).toBe('16.00 t');
    expect(formatQuantity(500, 'mass', 'si').text).toBe('500.0 kg');
  });

  it('can pin a unit and a precision', () => {
    expect(formatQuantity(1226.25, 'force', 'si', { unit: 'N', sig: 3 }).text).toBe('1226 N');
    expect(formatQuantity(1226.25, 'force', 'si', { unit: 'kN', sig: 3 }).text).toBe('1.23 kN');
    expect(pickDisplayUnit(999, 'force', 'si').label).toBe('N');
  });
});
