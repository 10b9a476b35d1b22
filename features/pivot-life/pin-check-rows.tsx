import { StyleSheet, View } from 'react-native';

import { EnvelopeMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { space } from '@/components/theme';
import { formatValue } from '@/features/loads';
import type { PinCheckData } from '@/features/loads/design-schema';
import { PIN_CHECK_STANDARD, envelopeStatus, pinCheckFactors } from '@/features/loads/engine';
import type { PinUtilisation } from '@/features/pivot-life/schema';
import { formatShareOfLimit, formatStated } from '@/lib/measured-format';
import type { UnitSystem } from '@/lib/units';

type Row = { key: string; label: string; formula: string; ratio: number };

function rowsOf(pin: PinUtilisation): Row[] {
  const rows: Row[] = [
    { key: 'shear', label: 'Shear', formula: 'F_v,Ed ÷ F_v,Rd, F_v,Rd = 0.6·A·f_up / γM2', ratio: pin.shear },
    {
      key: 'bearing',
      label: 'Bearing',
      formula: 'F_b,Ed ÷ F_b,Rd, F_b,Rd = 1.5·t·d·f_y / γM0 (the plate that governs)',
      ratio: pin.bearing,
    },
    {
      key: 'bending',
      label: 'Bending',
      formula: 'M_Ed ÷ M_Rd, M_Rd = 1.5·W_el·f_yp / γM0',
      ratio: pin.bending,
    },
    {
      key: 'combined',
      label: 'Shear and bending combined',
      // The envelope holds the same check as a load against a load (√ of this sum); say both.
      formula:
        '(M_Ed / M_Rd)² + (F_v,Ed / F_v,Rd)² ≤ 1; the load is at ' +
        `${formatShareOfLimit(Math.sqrt(pin.combined))} of the load that brings it to 1`,
      ratio: pin.combined,
    },
  ];
  if (pin.bearingService !== null)
    rows.push({
      key: 'bearing_ser',
      label: 'Bearing, replaceable pin',
      formula: 'F_b,Ed,ser ÷ 0.6·t·d·f_y / γM6,ser',
      ratio: pin.bearingService,
    });
  if (pin.bendingService !== null)
    rows.push({
      key: 'bending_ser',
      label: 'Bending, replaceable pin',
      formula: 'M_Ed,ser ÷ 0.8·W_el·f_yp / γM6,ser',
      ratio: pin.bendingService,
    });
  return rows;
}

/**
 * A pivot's pin checked per EN 1993-1-8 §3.13 Table 3.10: each utilisation (design effect ÷ design
 * resistance; above 100 % fails) with its status mark and the formula it comes from, the force and
 * diameter checked, and the partial factors used (the design data's, else the standard's recommended
 * values). `pinCheck` is the pivot's pin data from the design in force, to name the factors.
 */
export function PinCheckRows({
  pin,
  pinCheck,
  system,
}: {
  pin: PinUtilisation;
  pinCheck?: PinCheckData | null;
  system: UnitSystem;
}) {
  const f = pinCheckFactors(pinCheck ?? {});
  const factors = `γM0 = ${f.gammaM0}, γM2 = ${f.gammaM2}, γM6,ser = ${f.gammaM6ser}, γF = ${f.gammaF}`;
  return (
    <View style={styles.block} accessibilityLabel={`Pin checks, ${PIN_CHECK_STANDARD}`}>
      <Text variant="label" muted>
        {`PIN CHECKS · ${PIN_CHECK_STANDARD.toUpperCase()}`}
      </Text>
      {rowsOf(pin).map((r) => (
        <View key={r.key} style={styles.row} testID={`pin-check-${r.key}`}>
          <View style={styles.words}>
            <Text variant="body">{r.label}</Text>
            <Text variant="small" muted>
              {r.formula}
            </Text>
          </View>
          <View style={styles.figure}>
            <Text variant="figure">{formatShareOfLimit(r.ratio)}</Text>
            <EnvelopeMark status={envelopeStatus(r.ratio)} compact />
          </View>
        </View>
      ))}
      <Text variant="small" muted>
        {`At the peak force over all load cases × γF: ${formatValue(pin.forceN, 'force', system)}, pin ` +
          `diameter ${formatStated(pin.diameterM, 'lengthSmall', system).text}. Partial factors ${factors}` +
          `${pinCheck ? '' : ' (the standard’s recommended values)'}.`}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  block: { gap: space.sm },
  row: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: space.sm,
    minHeight: 44,
  },
  words: { flexShrink: 1, flexBasis: 220, flexGrow: 1, gap: 2 },
  figure: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
});
