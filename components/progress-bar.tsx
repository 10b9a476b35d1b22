import { useEffect, useMemo, useState } from 'react';
import { Animated, Platform, StyleSheet, View } from 'react-native';

import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';

/** How far a piece of work is: `done` of `total`, or a total nobody can know yet (`total: null`). */
export type ProgressAmount = { done: number; total: number | null };

/** "62 %": the share of the whole, rounded down so 100 % means finished, never nearly. */
export function percentText(value: number, max: number): string {
  if (!(max > 0)) return '0 %';
  return `${Math.floor((100 * Math.min(max, Math.max(0, value))) / max)} %`;
}

/** "3 of 8 photos" (or "1 of 1 photo"): the unit follows the total, as it is read aloud. */
export function ofText(done: number, total: number, one: string, many = `${one}s`): string {
  return `${done} of ${total} ${total === 1 ? one : many}`;
}

type Tone = 'active' | 'stopped' | 'done';

const FILL: Record<Tone, string> = { active: colors.info, stopped: colors.near, done: colors.within };

/**
 * A progress bar with its read-out. Determinate whenever the total is known (`max`): the fill is
 * `value / max`, the read-out says how far in words ("3 of 8 photos", else "62 %"), and assistive
 * technology reads `role="progressbar"` with its `aria-valuenow/min/max` and `label`. With `max` null
 * (a total nobody knows yet, as the number of pages an update comes in) it has no value, as ARIA asks,
 * and a band moves along the track instead of a fill that would pretend to a share.
 * `tone`: `stopped` keeps the fill where the work stopped, in the warning colour; `done` is finished.
 */
export function ProgressBar({
  label,
  value,
  max,
  valueText,
  tone = 'active',
  caption = true,
}: {
  /** The bar's accessible name, and its caption unless `caption` is false. */
  label: string;
  value: number;
  max: number | null;
  /** The read-out in words; defaults to the percentage (or nothing when the total is unknown). */
  valueText?: string;
  tone?: Tone;
  /** Show the label above the bar (off where a heading beside it already says it). */
  caption?: boolean;
}) {
  const determinate = max !== null && Number.isFinite(max) && max > 0;
  const shown = determinate ? Math.min(max, Math.max(0, value)) : 0;
  const readOut = valueText ?? (determinate ? percentText(shown, max) : '');
  const share = determinate ? shown / max : 0;
  return (
    <View style={styles.box}>
      {caption || readOut ? (
        <View style={styles.line}>
          {caption ? (
            <Text variant="small" style={styles.label} numberOfLines={2}>
              {label}
            </Text>
          ) : null}
          {readOut ? (
            <Text variant="small" muted style={styles.readOut}>
              {readOut}
            </Text>
          ) : null}
        </View>
      ) : null}
      <View
        accessible
        role="progressbar"
        aria-label={label}
        aria-valuemin={determinate ? 0 : undefined}
        aria-valuemax={determinate ? max : undefined}
        aria-valuenow={determinate ? shown : undefined}
        aria-valuetext={readOut || undefined}
        aria-busy={tone === 'active'}
        style={styles.track}
      >
        {determinate ? (
          <View style={[styles.fill, { width: `${share * 100}%`, backgroundColor: FILL[tone] }]} />
        ) : (
          <MovingBand color={FILL[tone]} still={tone !== 'active'} />
        )}
      </View>
    </View>
  );
}

const BAND = 0.35;

/** The unknown-total look: a band sweeping the track (still when the work is not running). */
function MovingBand({ color, still }: { color: string; still: boolean }) {
  const [at] = useState(() => new Animated.Value(0));
  const left = useMemo(() => at.interpolate({ inputRange: [0, 1], outputRange: ['-35%', '100%'] }), [at]);
  useEffect(() => {
    if (still) return;
    const loop = Animated.loop(
      Animated.timing(at, { toValue: 1, duration: 1400, useNativeDriver: Platform.OS !== 'web' }),
    );
    loop.start();
    return () => loop.stop();
  }, [at, still]);
  return <Animated.View style={[styles.band, { backgroundColor: color, left }]} />;
}

const styles = StyleSheet.create({
  box: { gap: space.xs },
  line: { flexDirection: 'row', alignItems: 'baseline', gap: space.sm, flexWrap: 'wrap' },
  label: { flexShrink: 1 },
  readOut: { marginLeft: 'auto', fontVariant: ['tabular-nums'] },
  track: {
    height: 10,
    borderRadius: radius.sm,
    backgroundColor: colors.surfaceSunk,
    borderWidth: 1,
    borderColor: colors.border,
    overflow: 'hidden',
  },
  fill: { height: '100%', borderRadius: radius.sm },
  band: { position: 'absolute', top: 0, bottom: 0, width: `${BAND * 100}%`, borderRadius: radius.sm },
});
