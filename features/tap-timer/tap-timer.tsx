/**
 * Measures a ride's period by hand: tap the big pad each time the arm passes a mark (once per revolution,
 * or once per full swing there and back). Shows period, rate and spread live, lists the taps it does not
 * trust and why, and hands the result over with "Use this value".
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { StatRow, StatTile } from '@/components/stat-tile';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import { MotionPicture } from '@/features/tap-timer/motion-picture';
import {
  MIN_INTERVALS_FOR_CHECKS,
  type TapTimerResult,
  tapResult,
  tapStats,
} from '@/features/tap-timer/stats';
import { TapPad } from '@/features/tap-timer/tap-pad';

export type { TapTimerResult } from '@/features/tap-timer/stats';

/** What the pad says for each kind of period: the swing wording makes "there and back" explicit. */
const padWords = {
  revolution: {
    label: 'Tap once per revolution',
    hint: 'Tap each time the arm passes your mark',
  },
  swing: {
    label: 'Tap once per full swing',
    hint: 'Tap each time the arm passes your mark going the same way (there and back is one swing)',
  },
} as const;

type Props = {
  /** What one tap marks, for the pad's label. */
  per?: 'revolution' | 'swing';
  onUse?: (result: TapTimerResult) => void;
};

const PAD_HEIGHT = 160;

export function TapTimer({ per = 'revolution', onUse }: Props) {
  const [taps, setTaps] = useState<number[]>([]);
  const [lit, setLit] = useState(false);
  const unlight = useRef<ReturnType<typeof setTimeout> | null>(null);
  useEffect(() => () => clearTimeout(unlight.current ?? undefined), []);
  const words = padWords[per];
  const onTap = (atMs: number) => {
    // Two fingers landing in the same millisecond are one tap; the stats need strictly later times.
    setTaps((t) => (t.length > 0 && atMs <= t[t.length - 1] ? t : [...t, atMs]));
    // The pad lights briefly on each tap, so a glance confirms it was taken.
    setLit(true);
    clearTimeout(unlight.current ?? undefined);
    unlight.current = setTimeout(() => setLit(false), 120);
  };
  // Taps come from one clock and in order; a throw here would be a bug, so it is not caught.
  const stats = useMemo(() => tapStats(taps), [taps]);
  const result: TapTimerResult | null = stats ? tapResult(stats) : null;
  const discarded = stats?.intervals.filter((i) => !i.kept) ?? [];

  return (
    <Card>
      <MotionPicture kind={per} />
      <TapPad onTap={onTap} label={words.label} hint={words.hint} style={[styles.pad, lit && styles.padLit]}>
        <Text variant="title" color={colors.chromeText}>
          {words.label}
        </Text>
        <Text color={colors.chromeMuted} style={styles.center}>
          {taps.length === 0 ? words.hint : `${taps.length} taps`}
        </Text>
      </TapPad>

      <StatRow>
        <StatTile label="Period s" value={stats?.periodS != null ? stats.periodS.toFixed(2) : '–'} />
        <StatTile
          label={per === 'swing' ? 'Swings/min' : 'rpm'}
          value={stats?.rpm != null ? stats.rpm.toFixed(2) : '–'}
        />
        <StatTile label="Spread s (SD)" value={stats?.spreadS != null ? stats.spreadS.toFixed(3) : '–'} />
      </StatRow>
      <Text muted>
        {stats === null
          ? 'Tap at least four times; more taps give a steadier value.'
          : `${stats.used} intervals used, ${stats.discarded} set aside` +
            (stats.intervals.length < MIN_INTERVALS_FOR_CHECKS ? ' — checks start at four taps.' : '.')}
      </Text>

      {discarded.length > 0 ? (
        <View style={styles.list} accessibilityLabel="Intervals set aside">
          {discarded.map((i) => (
            <Text key={i.index} variant="small">
              Tap {i.index + 1}→{i.index + 2}: {i.reason}
            </Text>
          ))}
        </View>
      ) : null}

      <View style={styles.actions}>
        <Button label="Reset" tone="quiet" onPress={() => setTaps([])} disabled={taps.length === 0} />
        <Button
          label="Use this value"
          disabled={result === null}
          onPress={() => {
            if (result) onUse?.(result);
          }}
        />
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  pad: {
    minHeight: PAD_HEIGHT,
    borderRadius: radius.lg,
    backgroundColor: colors.chrome,
    alignItems: 'center',
    justifyContent: 'center',
    gap: space.xs,
    padding: space.lg,
  },
  padLit: { backgroundColor: colors.chromeRaised },
  center: { textAlign: 'center' },
  list: { gap: space.xs, padding: space.md, backgroundColor: colors.nearSoft, borderRadius: radius.md },
  actions: { flexDirection: 'row', gap: space.sm, flexWrap: 'wrap', justifyContent: 'flex-end' },
});
