/** A limit on a value, and when a value counts as equal to it: shared by the load engine and the words. */

/**
 * Relative difference below which a value counts as equal to its limit: a value typed as "139.0" mm and a
 * limit of 139.0 mm may reach SI by different roundings (139 × 0.001 vs 0.139) and differ by one unit in
 * the last place, which is no measurement. lib/measured-format.ts shows "at the limit" by the same test.
 */
export const LIMIT_EQUAL_TOLERANCE = 1e-12;

export type Limit =
  /** value ≤ max (a force, a torque, a speed, a clearance). ratio = value / max. */
  | { kind: 'upper'; max: number }
  /**
   * value ≥ min. With a nominal (a pin's diameter when new) the ratio is the wear allowance used,
   * (nominal − value) / (nominal − min); without one it is min / value.
   */
  | { kind: 'lower'; min: number; nominal?: number }
  /**
   * min ≤ value ≤ max, e.g. rider Gz from −1.5 g to +6 g; either side may be left open. The ratio is
   * measured from a reference toward whichever side the value lies: (value − ref)/(max − ref) or
   * (ref − value)/(ref − min). The reference is 0 when the range contains 0 (rider limits do), else the
   * middle of the range; a one-sided range away from 0 has no room to be "near": within or over only.
   */
  | { kind: 'range'; min?: number; max?: number; reference?: number };
