import { StyleSheet, View } from 'react-native';

import { EnvelopeMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import { STANDARD_GRAVITY_MS2, evaluateExtremes } from '@/features/loads/engine';
import type { MeasuredRider } from '@/features/records/motion-record-schema';
import { formatAgainstLimit } from '@/lib/measured-format';
import { formatQuantity, type UnitSystem } from '@/lib/units';

/** A seat's computed rider acceleration extremes, in g (the engine's seat history or a stored analysis). */
export type ComputedRider = { name: string; gxMin: number; gxMax: number; gzMin: number; gzMax: number };

const g = (v: number, system: UnitSystem) => formatQuantity(v * STANDARD_GRAVITY_MS2, 'accel', system).text;
const span = (min: number, max: number, system: UnitSystem) => `${g(min, system)} to ${g(max, system)}`;

/**
 * Rider accelerations measured with the phone in a seat beside the ones computed for that seat, each axis
 * with its design limit and, for the measured values, where they stand against it.
 */
export function MeasuredRiderTable({
  measured,
  computed,
  system,
}: {
  measured: readonly MeasuredRider[];
  computed: readonly (ComputedRider | undefined)[];
  system: UnitSystem;
}) {
  if (!measured.length) return null;
  return (
    <View style={styles.wrap} accessibilityLabel="Measured and computed rider accelerations">
      {measured.map((m) => {
        const c = computed[m.seat];
        return (
          <View key={m.recordId} style={styles.seat}>
            <Text variant="heading">{m.name}: rider accelerations</Text>
            <Text variant="small" muted>
              Measured with the phone, low-pass filtered at {m.cutoffHz} Hz; computed by the load engine for
              this seat.
            </Text>
            {(['gx', 'gz'] as const).map((axis) => {
              const min = axis === 'gx' ? m.gxMin : m.gzMin;
              const max = axis === 'gx' ? m.gxMax : m.gzMax;
              const lim = m.limits[axis];
              const limit =
                lim && (lim.min !== undefined || lim.max !== undefined)
                  ? {
                      kind: 'range' as const,
                      min: lim.min === undefined ? undefined : lim.min * STANDARD_GRAVITY_MS2,
                      max: lim.max === undefined ? undefined : lim.max * STANDARD_GRAVITY_MS2,
                    }
                  : null;
              const status = limit
                ? evaluateExtremes(min * STANDARD_GRAVITY_MS2, max * STANDARD_GRAVITY_MS2, limit).status
                : null;
              const limitText = limit
                ? formatAgainstLimit(max * STANDARD_GRAVITY_MS2, limit, 'accel', system).limit
                : 'no limit in the design data';
              const label = axis === 'gx' ? 'Gx (chest–back)' : 'Gz (spine)';
              return (
                <View key={axis} style={styles.row} accessibilityLabel={`${m.name} ${label}`}>
                  <Text variant="label">{label}</Text>
                  <View style={styles.cells}>
                    <View style={styles.cell}>
                      <Text variant="small" muted>
                        Measured
                      </Text>
                      <Text variant="figure">{span(min, max, system)}</Text>
                    </View>
                    <View style={styles.cell}>
                      <Text variant="small" muted>
                        Computed
                      </Text>
                      <Text variant="figure">
                        {c
                          ? span(axis === 'gx' ? c.gxMin : c.gzMin, axis === 'gx' ? c.gxMax : c.gzMax, system)
                          : '—'}
                      </Text>
                    </View>
                    <View style={styles.cell}>
                      <Text variant="small" muted>
                        Limit
                      </Text>
                      <Text variant="figure">{limitText}</Text>
                    </View>
                    {status ? <EnvelopeMark status={status} compact /> : null}
                  </View>
                </View>
              );
            })}
          </View>
        );
      })}
      <Text variant="small" muted>
        Measured values come from the phone’s own, uncalibrated accelerometer held as the recording screen
        showed. They are a check on the computed values, not a calibrated ride measurement; the status shown
        is the measured values’ against the design limits and does not change the load check’s status.
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.md },
  seat: {
    gap: space.sm,
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  row: { gap: space.xs, paddingTop: space.sm, borderTopWidth: 1, borderTopColor: colors.surfaceSunk },
  cells: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, alignItems: 'center' },
  cell: { minWidth: 120, gap: 2 },
});
