/**
 * Measures a ride's period by hand: tap the big pad each time the arm passes a mark (one revolution, or
 * one swing). Shows period, rate and spread live, lists the taps it does not trust and why, and hands
 * the result over with "Use this value".
 */
import { useMemo, useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { StatRow, StatTile } from '@/components/stat-tile';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import {
  MIN_INTERVALS_FOR_CHECKS,
  type TapTimerResult,
  tapResult,
  tapStats,
} from '@/features/tap-timer/stats';

export type { TapTimerResult } from '@/features/tap-timer/stats';

type Props = {
  /** What one tap marks, for the pad's label. */
  per?: 'revolution' | 'swing';
  onUse?: (result: TapTimerResult) => void;
};

const PAD_HEIGHT = 160;

export function TapTimer({ per = 'revolution', onUse }: Props) {
  const [taps, setTaps] = useState<number[]>([]);
  // Taps come from one clock and in order; a throw here would be a bug, so it is not caught.
  const stats = useMemo(() => tapStats(taps), [taps]);
  const result: TapTimerResult | null = stats ? tapResult(stats) : null;
  const discarded = stats?.intervals.filter((i) => !i.kept) ?? [];

  return (
    <Card>
      <Pressable
        accessibilityRole="button"
        accessibilityLabel={`Tap at each ${per}`}
        accessibilityHint="Each tap marks one pass; the timer works out the period from the gaps"
        // Press-in, not press: the moment the finger lands is the moment that counts.
        onPressIn={() => setTaps((t) => [...t, Date.now()])}
        style={({ pressed }) => [styles.pad, pressed && styles.padPressed]}
      >
        <Text variant="title" color={colors.baseText}>
          Tap at each {per}
        </Text>
        <Text color={colors.baseMuted}>
          {taps.length === 0 ? 'Start when the arm passes your mark' : `${taps.length} taps`}
        </Text>
      </Pressable>

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
    backgroundColor: colors.base,
    alignItems: 'center',
    justifyContent: 'center',
    gap: space.xs,
    padding: space.lg,
  },
  padPressed: { backgroundColor: colors.baseRaised },
  list: { gap: space.xs, padding: space.md, backgroundColor: colors.nearSoft, borderRadius: radius.md },
  actions: { flexDirection: 'row', gap: space.sm, flexWrap: 'wrap', justifyContent: 'flex-end' },
});
