import { StyleSheet, View } from 'react-native';

import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import type { NdtDue } from '@/features/pivot-life/schema';
import { daysBetween, formatDate } from '@/lib/dates';

type Spec = {
  label: string;
  icon: 'alert-octagon' | 'clock' | 'calendar' | 'help-circle';
  fg: string;
  bg: string;
};

/**
 * A planned test's state: icon, colour and words together (the schedules' calendar icons, since being due
 * is about the calendar). A test never made is "Never tested", and overdue as well once its plan's first
 * due day has passed.
 */
export function ndtDueSpec(due: NdtDue, asOf: string): Spec {
  const past = due.dueOn !== null && due.dueOn < asOf;
  if (due.state === 'never_tested')
    return past
      ? { label: 'Never tested · overdue', icon: 'alert-octagon', fg: colors.over, bg: colors.overSoft }
      : { label: 'Never tested', icon: 'help-circle', fg: colors.near, bg: colors.nearSoft };
  if (due.state === 'overdue')
    return { label: 'Overdue', icon: 'alert-octagon', fg: colors.over, bg: colors.overSoft };
  if (due.state === 'due') return { label: 'Due soon', icon: 'clock', fg: colors.near, bg: colors.nearSoft };
  return { label: 'Upcoming', icon: 'calendar', fg: colors.text, bg: colors.surfaceSunk };
}

/** "due 3 May 2026 (in 12 days)", "due since 1 Apr 2026 (33 days ago)". */
export function ndtDueWords(due: NdtDue, asOf: string): string {
  if (due.dueOn === null) return 'no due date';
  const days = daysBetween(asOf, due.dueOn);
  const when =
    days === 0
      ? 'today'
      : days > 0
        ? `in ${days} day${days === 1 ? '' : 's'}`
        : `${-days} day${days === -1 ? '' : 's'} ago`;
  return `${days < 0 ? 'due since' : 'due'} ${formatDate(due.dueOn)} (${when})`;
}

export function NdtDueMark({ due, asOf }: { due: NdtDue; asOf: string }) {
  const s = ndtDueSpec(due, asOf);
  return (
    <View style={[styles.mark, { backgroundColor: s.bg }]} accessibilityLabel={s.label}>
      <Feather name={s.icon} size={14} color={s.fg} />
      <Text variant="label" color={s.fg}>
        {s.label}
      </Text>
    </View>
  );
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
