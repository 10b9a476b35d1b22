import { StyleSheet, View } from 'react-native';

import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import type { DueStatus } from '@/features/registry/schema';

/**
 * When an inspection falls due: icon, colour and words together. Its own icons (not the envelope's
 * shapes), because being due is about the calendar, not about a value against its limit.
 */
const spec: Record<
  DueStatus,
  { label: string; icon: 'alert-octagon' | 'clock' | 'calendar' | 'minus-circle'; fg: string; bg: string }
> = {
  overdue: { label: 'Overdue', icon: 'alert-octagon', fg: colors.over, bg: colors.overSoft },
  due: { label: 'Due', icon: 'clock', fg: colors.near, bg: colors.nearSoft },
  upcoming: { label: 'Upcoming', icon: 'calendar', fg: colors.text, bg: colors.surfaceSunk },
  unscheduled: { label: 'No date', icon: 'minus-circle', fg: colors.textMuted, bg: colors.surfaceSunk },
};

export const dueStatusLabel = (s: DueStatus) => spec[s].label;

export function DueMark({ status }: { status: DueStatus }) {
  const s = spec[status];
  return (
    <View style={[styles.mark, { backgroundColor: s.bg }]} accessibilityLabel={s.label}>
      <Feather name={s.icon} size={14} color={s.fg} />
      <Text variant="label" color={s.fg}>
        {s.label}
      </Text>
    </View>
  );
}

/** "in 3 days", "today", "5 days ago". */
export function dueInWords(days: number | null): string {
  if (days === null) return 'no date set';
  if (days === 0) return 'today';
  if (days === 1) return 'tomorrow';
  if (days === -1) return 'yesterday';
  return days > 0 ? `in ${days} days` : `${-days} days ago`;
}

const styles = StyleSheet.create({
  mark: {
    flexDirection: 'row',
    alignItems: 'center',
    alignSelf: 'flex-start',
    gap: space.xs + 2,
    paddingHorizontal: space.sm,
    paddingVertical: 2,
    borderRadius: radius.sm,
  },
});
