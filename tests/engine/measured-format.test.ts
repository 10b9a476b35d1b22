import * as fc from 'fast-check';

import { type Limit, evaluateLimit } from '@/features/loads/engine';
import { formatEnvelopeItem, measuredSources } from '@/features/loads/format';
import { formatMeasurement, formatReading, formatSpread } from '@/features/review/review-format';
import { type QuantityKind, type UnitSystem, displayUnits, toSI } from '@/lib/units';
import {
  carriedDecimals,
  compareSI,
  formatAgainstLimit,
  formatLimitOnly,
  formatMeasured,
  formatShareOfLimit,
  normaliseEntered,
} from '@/lib/measured-format';

const mm = (x: number) => toSI(x, 'lengthSmall', 'mm');
const pinLimit: Limit = { kind: 'lower', min: mm(139.0), nominal: mm(140.0) };

/**
 * The worked cases of the issue ("Rounding hides an over-limit value"): a 139.05 mm pin against a
 * 139.0 mm minimum, typed values coming back as "0.40000" and "405.00".
 */
describe('worked cases', () => {
  test('139.05 mm against a 139.0 mm minimum is never shown as 139.1 or 139.0', () => {
    const typed = formatAgainstLimit(mm(139.05), pinLimit, 'lengthSmall', 'si', {
      entered: '139.05',
      unit: 'mm',
    });
    expect(typed.value).toBe('139.05 mm');
    // The design value is shown as stated, not padded: 139 mm (the design data holds a number, not its text).
    expect(typed.limit).toBe('≥ 139 mm');
    expect(formatLimitOnly({ kind: 'upper', max: mm(0.5) }, 'lengthSmall', 'si')).toBe('≤ 0.5 mm');
    // The same value from an older record (no typed text) or as a bare measured envelope item.
    expect(formatAgainstLimit(mm(139.05), pinLimit, 'lengthSmall', 'si', { unit: 'mm' }).value).toBe(
      '139.05 mm',
    );
    const item = {
      id: 'joints.0.pin.diameter',
      quantity: 'lengthSmall' as const,
      ...evaluateLimit(mm(139.05), pinLimit),
    };
    expect(formatEnvelopeItem(item, 'si').value).toBe('139.05 mm');
    // And as a computed value: four significant figures would say 139.1, doubling the margin.
    expect(formatAgainstLimit(mm(139.05), pinLimit, 'lengthSmall', 'si').value).toBe('139.05 mm');
  });

  test('138.95 mm against 139.0 mm is shown below it, even as a computed value', () => {
    const shown = formatAgainstLimit(mm(138.95), pinLimit, 'lengthSmall', 'si');
    expect(shown.value).toBe('138.95 mm');
    expect(shown.relations).toEqual([{ side: 'min', relation: 'below' }]);
    expect(evaluateLimit(mm(138.95), pinLimit).status).toBe('over');
  });

  test('a value equal to its limit says so, and the engine counts it as at (not over) the limit', () => {
    const shown = formatAgainstLimit(mm(139.0), pinLimit, 'lengthSmall', 'si', {
      entered: '139.0',
      unit: 'mm',
    });
    expect(shown.value).toBe('139.0 mm (at the limit)');
    expect(shown.atLimit).toBe(true);
    // 139 × 0.001 and 0.139 are different doubles; one unit in the last place is not a measurement.
    expect(evaluateLimit(0.139 * (1 + 2e-16), { kind: 'lower', min: 0.139, nominal: 0.14 }).status).toBe(
      'near',
    );
  });

  test('typed values are echoed as typed: "0.40" stays 0.40, "405" is not 405.00', () => {
    expect(formatMeasured(mm(0.4), 'lengthSmall', 'si', { entered: '0.40', unit: 'mm' }).text).toBe(
      '0.40 mm',
    );
    expect(formatMeasured((405 * 2 * Math.PI) / 60, 'rate', 'si', { entered: '405', unit: 'rpm' }).text).toBe(
      '405 rpm',
    );
    expect(formatReading({ kind: 'clearance', valueSI: mm(0.4), unit: 'mm', entered: '0.40' }, 'si')).toBe(
      '0.40 mm',
    );
    expect(formatMeasurement({ valueSI: mm(0.4), unit: 'mm', entered: '0.40' })).toBe('0.40 mm');
    // Older records without the typed text: the shortest exact form, never padded with zeros.
    expect(formatReading({ kind: 'clearance', valueSI: mm(0.4), unit: 'mm' }, 'si')).toBe('0.4 mm');
    expect(formatMeasurement({ valueSI: mm(0.4), unit: 'mm' })).toBe('0.4 mm');
  });

  test('a typed text that does not say the stored value is not shown', () => {
    expect(formatMeasured(mm(0.5), 'lengthSmall', 'si', { entered: '0.40', unit: 'mm' }).text).toBe('0.5 mm');
  });

  test('the entry text is stored normalised: decimal comma, leading point, plus sign', () => {
    expect(normaliseEntered(' 0,40 ')).toBe('0.40');
    expect(normaliseEntered('.5')).toBe('0.5');
    expect(normaliseEntered('+139.05')).toBe('139.05');
    expect(normaliseEntered('1e3')).toBeNull();
    expect(normaliseEntered('12 mm')).toBeNull();
  });

  test('a tapped period is shown to the decimal of its spread (two significant figures)', () => {
    // JCGM 100:2008 §7.2.6: an uncertainty to at most two significant figures, the value to match
    // (from memory).
    const r = { kind: 'period' as const, valueSI: 9.48327, unit: 's', spreadSI: 0.0234 };
    expect(formatReading(r, 'si')).toBe('9.483 s');
    expect(formatSpread(r, 'si')).toBe('± 0.023 s');
  });
});

describe('precision through unit conversion', () => {
  // 1 in = 25.4 mm exactly (NIST SP 811, Appendix B).
  test('a resolution of 0.01 mm becomes 0.0001 in: never coarser, at most one digit finer', () => {
    expect(carriedDecimals(2, 'mm', 'in')).toBe(4); // 0.01 mm = 0.000394 in
    expect(carriedDecimals(3, 'in', 'mm')).toBe(2); // 0.001 in = 0.0254 mm
    expect(carriedDecimals(2, 'mm', 'mm')).toBe(2);
    expect(formatMeasured(mm(0.4), 'lengthSmall', 'us', { entered: '0.40', unit: 'mm' }).text).toBe(
      '0.0157 in',
    );
    expect(
      formatMeasured(toSI(5.472, 'lengthSmall', 'in'), 'lengthSmall', 'si', { entered: '5.472', unit: 'in' })
        .text,
    ).toBe('138.99 mm');
  });

  test('139.05 mm shown in inches against its 139.0 mm minimum stays above it', () => {
    const shown = formatAgainstLimit(mm(139.05), pinLimit, 'lengthSmall', 'us', {
      entered: '139.05',
      unit: 'mm',
    });
    expect(shown.value).toBe('5.4744 in');
    expect(shown.limit).toBe('≥ 5.472 in');
  });

  test('a value typed in inches just under the minimum: the limit takes digits, the typed text stays', () => {
    const shown = formatAgainstLimit(toSI(5.472, 'lengthSmall', 'in'), pinLimit, 'lengthSmall', 'us', {
      entered: '5.472',
      unit: 'in',
    });
    expect(shown.value).toBe('5.472 in');
    expect(shown.limit).toBe('≥ 5.4724 in');
  });
});

describe('share of the limit', () => {
  test('never rounded to or across 100 %', () => {
    expect(formatShareOfLimit(0.99996)).toBe('99.996 %');
    expect(formatShareOfLimit(1.00004)).toBe('100.004 %');
    expect(formatShareOfLimit(0.9996)).toBe('99.96 %');
    expect(formatShareOfLimit(1)).toBe('100 %');
    expect(formatShareOfLimit(0.875)).toBe('87.5 %');
    expect(formatShareOfLimit(null)).toBe('—');
  });
});

describe('measured sources of envelope items', () => {
  test('the latest reading per pivot and kind, as the analysis takes it; checklist values by item', () => {
    const sources = measuredSources({
      readings: [
        { id: 'a', kind: 'pin_diameter', joint: 0, unit: 'mm', entered: '139.2' },
        { id: 'b', kind: 'pin_diameter', joint: 0, unit: 'mm', entered: '139.05' },
        { id: 'c', kind: 'clearance', joint: 1, unit: 'mm', entered: '0.40' },
      ],
      checklist: [
        { itemId: 'pin', measurement: { unit: 'mm', readingId: 'c' } },
        { itemId: 'gap', measurement: { unit: 'mm', entered: '2.0' } },
      ],
    });
    expect(sources.get('joints.0.pin.diameter')?.entered).toBe('139.05');
    expect(sources.get('joints.1.pin.clearance')?.entered).toBe('0.40');
    expect(sources.get('checklist:pin')?.entered).toBe('0.40');
    expect(sources.get('checklist:gap')?.entered).toBe('2.0');
  });
});

// ——— properties ———

/** A decimal text as an inspector types it: 1–4 integer digits and 0–4 decimals. */
const typedText = fc
  .tuple(fc.integer({ min: 0, max: 9999 }), fc.integer({ min: 0, max: 4 }), fc.integer({ min: 0, max: 9999 }))
  .map(([int, decimals, frac]) =>
    decimals === 0 ? String(int) : `${int}.${String(frac % 10 ** decimals).padStart(decimals, '0')}`,
  );

const kinds: QuantityKind[] = ['lengthSmall', 'force', 'rate', 'time', 'angle', 'accel', 'moment', 'mass'];
const systems: UnitSystem[] = ['si', 'us'];

/** The shown comparison, read back from the strings only as a reader would. */
function shownRelation(value: string, limit: string, side: 'min' | 'max', isRange: boolean) {
  const num = (s: string) => Number(s.match(/^-?[\d.]+/)?.[0]);
  const said = value.match(/\(just (below|above) the (minimum|maximum)\)$/);
  if (said && (said[2] === 'minimum') === (side === 'min')) return said[1];
  const parts = isRange ? limit.split(' to ') : [limit.replace(/^[≤≥] /, '')];
  const bound = num(isRange ? parts[side === 'min' ? 0 : 1] : parts[0]);
  const v = num(value);
  return v === bound ? 'equal' : v < bound ? 'below' : 'above';
}

function checkVisible(
  valueSI: number,
  limit: Limit,
  kind: QuantityKind,
  system: UnitSystem,
  source?: object,
) {
  const shown = formatAgainstLimit(valueSI, limit, kind, system, source);
  for (const r of shown.relations) {
    expect(shownRelation(shown.value, shown.limit, r.side, limit.kind === 'range')).toBe(r.relation);
    // The truth is decided in SI before any rounding.
    const bound = r.side === 'min' ? (limit as { min: number }).min : (limit as { max: number }).max;
    expect(r.relation).toBe(compareSI(valueSI, bound));
  }
  // At the limit is said in words, and only then.
  if (!shown.value.includes('(just'))
    expect(shown.value.endsWith('(at the limit)')).toBe(shown.relations.some((r) => r.relation === 'equal'));
  return shown;
}

describe('a value is never shown on the other side of its limit (fast-check)', () => {
  test('computed values against upper and lower limits, any unit system', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-3, max: 1e7, noNaN: true }),
        fc.double({ min: -0.02, max: 0.02, noNaN: true }),
        fc.constantFrom(...kinds),
        fc.constantFrom(...systems),
        fc.boolean(),
        (limitSI, offset, kind, system, upper) => {
          // Values cluster around the limit, where rounding could carry them across it.
          const valueSI = limitSI * (1 + offset * offset * offset * 1e3);
          const limit: Limit = upper ? { kind: 'upper', max: limitSI } : { kind: 'lower', min: limitSI };
          checkVisible(valueSI, limit, kind, system);
          checkVisible(limitSI, limit, kind, system);
        },
      ),
      { numRuns: 3000 },
    );
  });

  test('typed values, in their own unit or converted to the other system, against limits typed the same way', () => {
    fc.assert(
      fc.property(
        typedText,
        typedText,
        fc.constantFrom<QuantityKind>('lengthSmall', 'rate', 'time', 'force', 'mass'),
        fc.constantFrom(...systems),
        fc.constantFrom(...systems),
        fc.boolean(),
        (valueText, limitText, kind, typedIn, shownIn, upper) => {
          const unit = displayUnits(kind, typedIn)[0];
          const valueSI = toSI(Number(valueText), kind, unit.mathjs);
          const limitSI = toSI(Number(limitText), kind, unit.mathjs);
          fc.pre(limitSI > 0);
          const limit: Limit = upper ? { kind: 'upper', max: limitSI } : { kind: 'lower', min: limitSI };
          const shown = checkVisible(valueSI, limit, kind, shownIn, { entered: valueText, unit: unit.label });
          // Shown in the unit it was typed in, the typed text comes back unchanged.
          if (shownIn === typedIn) expect(shown.value.split(' ')[0]).toBe(valueText);
          // Equal typed texts are equal values, whatever the unit system shown.
          if (Number(valueText) === Number(limitText)) expect(shown.atLimit).toBe(true);
        },
      ),
      { numRuns: 3000 },
    );
  });

  test('ranges (both bounds), e.g. rider acceleration', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -3, max: 0, noNaN: true }),
        fc.double({ min: 0.1, max: 8, noNaN: true }),
        fc.double({ min: -4, max: 9, noNaN: true }),
        fc.constantFrom(...systems),
        (min, max, g, system) => {
          const gs = (x: number) => toSI(x, 'accel', 'gee');
          const limit: Limit = { kind: 'range', min: gs(min), max: gs(max) };
          checkVisible(gs(g), limit, 'accel', system);
          checkVisible(gs(min), limit, 'accel', system);
          checkVisible(gs(max), limit, 'accel', system);
        },
      ),
      { numRuns: 2000 },
    );
  });

  test('the share of the limit is on the same side of 100 % as the ratio is of 1', () => {
    fc.assert(
      fc.property(fc.double({ min: -0.01, max: 0.01, noNaN: true }), (d) => {
        const ratio = 1 + d * d * d * 1e2;
        const shown = Number(formatShareOfLimit(ratio).replace(' %', ''));
        const truth = compareSI(ratio, 1);
        expect(shown === 100 ? 'equal' : shown < 100 ? 'below' : 'above').toBe(truth);
      }),
      { numRuns: 3000 },
    );
  });
});
