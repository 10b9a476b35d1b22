import { StyleSheet, View } from 'react-native';

import { LabelledLine } from '@/components/labelled-line';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import { formatBesideLimit, formatValue } from '@/features/loads';
import type { WearTrend } from '@/features/pivot-life/schema';
import { formatDate } from '@/lib/dates';
import type { UnitSystem } from '@/lib/units';

const title: Record<WearTrend['quantity'], string> = {
  pin_diameter: 'Pin diameter',
  clearance: 'Bushing clearance',
};
const limitWord: Record<WearTrend['quantity'], string> = {
  pin_diameter: 'minimum',
  clearance: 'maximum',
};

const date = (d: string | null) => (d === null ? '—' : formatDate(d));

function signed(valueSI: number, system: UnitSystem): string {
  const text = formatValue(Math.abs(valueSI), 'lengthSmall', system);
  return valueSI === 0 ? text : `${valueSI < 0 ? '−' : '+'}${text}`;
}

/** Why a trend has no dates, in words; null when it has them. */
function noDates(t: WearTrend): string | null {
  const days = new Set(t.points.map((p) => p.on)).size;
  if (t.limitM === null) return 'No limit in the design data: nothing to project to.';
  if (days < 2) return 'Needs readings on two different days for a trend.';
  if (t.projectedOn === null) return 'The trend runs away from the limit: no date projected.';
  return null;
}

function TrendRow({ t, system }: { t: WearTrend; system: UnitSystem }) {
  const latest = t.points[t.points.length - 1];
  const beside = latest
    ? formatBesideLimit(
        latest.valueM,
        t.limitM === null ? null : { side: t.quantity === 'pin_diameter' ? 'min' : 'max', si: t.limitM },
        'lengthSmall',
        system,
        true,
      )
    : null;
  const why = noDates(t);
  const twoOnly = new Set(t.points.map((p) => p.on)).size === 2 && t.points.length === 2;
  return (
    <View style={[styles.trend, t.flagged && styles.flagged]} testID={`wear-${t.quantity}`}>
      <Text variant="heading">{title[t.quantity]}</Text>
      {beside && latest ? (
        <Text variant="figure">
          {`${beside.value} on ${date(latest.on)}`}
          {beside.limit ? ` · ${limitWord[t.quantity]} ${beside.limit}` : ''}
        </Text>
      ) : null}
      <LabelledLine
        label="Trend"
        value={
          t.slopePerDay === null
            ? '—'
            : `${signed(t.slopePerDay, system)} a day` +
              (t.slopePer1000Cycles === null
                ? ''
                : ` · ${signed(t.slopePer1000Cycles, system)} per 1000 cycles`) +
              ` (${t.points.length} readings)`
        }
      />
      {why ? (
        <Text variant="small" muted>
          {why}
        </Text>
      ) : (
        <>
          <LabelledLine label="Projected" value={date(t.projectedOn)} />
          <LabelledLine
            label="Cautious"
            value={
              t.earliestOn !== null
                ? `${date(t.earliestOn)} (95 % prediction bound)`
                : twoOnly
                  ? 'no interval from two readings'
                  : '—'
            }
          />
          {t.projectedByCyclesOn !== null ? (
            <LabelledLine
              label="By logged cycles"
              value={`${date(t.projectedByCyclesOn)} at the recent rate`}
            />
          ) : null}
        </>
      )}
      {t.flagged ? (
        <View style={styles.flag} accessibilityRole="alert">
          <Text variant="label" color={colors.text}>
            ▲ FLAGGED
          </Text>
          <Text variant="small">
            {`The limit may be reached before the next inspection (${date(t.nextInspectionOn)}). ` +
              `Inspect by ${date(t.suggestedOn)}.`}
          </Text>
        </View>
      ) : t.nextInspectionOn !== null && !why ? (
        <Text variant="small" muted>
          {`Next inspection ${date(t.nextInspectionOn)}: before the projected dates.`}
        </Text>
      ) : null}
    </View>
  );
}

/**
 * A pivot's wear trends: for the pin diameter and the bushing clearance, the latest reading against its
 * limit, the least-squares trend per day and per 1000 logged ride cycles, the dates where the trend and
 * its cautious 95 % bound reach the limit, and, when that may come before the next scheduled inspection, the
 * flag in words with the earlier date suggested. Stacked, so it reads at phone width.
 */
export function WearRows({ trends, system }: { trends: readonly WearTrend[]; system: UnitSystem }) {
  if (trends.length === 0)
    return (
      <Text variant="small" muted>
        No pin diameter or clearance readings yet.
      </Text>
    );
  return (
    <View style={styles.block} accessibilityLabel="Wear trends">
      <Text variant="label" muted>
        WEAR TRENDS
      </Text>
      {trends.map((t) => (
        <TrendRow key={t.quantity} t={t} system={system} />
      ))}
      <Text variant="small" muted>
        Least-squares line through the readings of inspections not amended since; the cautious date is where
        the 95 % prediction interval first reaches the limit.
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  block: { gap: space.md },
  trend: { gap: space.xs, paddingVertical: space.xs },
  flagged: { borderLeftWidth: 4, borderLeftColor: colors.accent, paddingLeft: space.md },
  flag: {
    gap: 2,
    backgroundColor: colors.accentSoft,
    borderRadius: radius.sm,
    padding: space.sm,
  },
});
