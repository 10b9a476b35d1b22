/**
 * Fatigue results in words. The numbers are this project's own display rules (four significant figures,
 * a power of ten for small damages); the limits named are EN 1993-1-9's (D = 1, categories Δσ_C / Δτ_C).
 */
import { categoryText, cyclesToLimitText, formatDamage } from '@/features/fatigue/damage-format';

test('a damage in four significant figures, with a power of ten when small', () => {
  expect(formatDamage(0)).toBe('0');
  expect(formatDamage(3.6259189e-7)).toBe('3.626 × 10⁻⁷');
  expect(formatDamage(9.99996e-7)).toBe('1.000 × 10⁻⁶');
  expect(formatDamage(0.5)).toBe('0.5');
  expect(formatDamage(0.012345)).toBe('0.01235');
  expect(formatDamage(12346)).toBe('1.235 × 10⁴');
  expect(formatDamage(Infinity)).toBe('not finite');
});

test('ride cycles to the limit: limit ÷ damage per ride cycle', () => {
  // D = 1 at 4.045×10⁻⁷ per ride cycle: 1 / 4.045×10⁻⁷ = 2.472×10⁶.
  expect(cyclesToLimitText(4.045e-7, 1)).toBe('2.472 million');
  // 1 / 1.861×10⁻⁶ = 537,345 → four figures.
  expect(cyclesToLimitText(1.861e-6, 1)).toBe('537,300');
  expect(cyclesToLimitText(1e-10, 0.5)).toBe('5 billion');
  expect(cyclesToLimitText(0, 1)).toBe('Never: no damage');
});

test('the EN 1993-1-9 category names direct stress Δσ_C and shear Δτ_C', () => {
  expect(categoryText({ categoryMPa: 71, shear: false })).toBe('Δσ_C 71 MPa');
  expect(categoryText({ categoryMPa: 100, shear: true })).toBe('Δτ_C 100 MPa');
});
