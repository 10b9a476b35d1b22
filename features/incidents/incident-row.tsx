import { Link } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';

import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import { incidentHref } from '@/features/incidents/hrefs';
import { incidentKindVocabulary, incidentSummary, type Incident } from '@/features/incidents/schema';
import { formatDateTime } from '@/lib/dates';

type Flag = {
  icon: 'alert-octagon' | 'alert-triangle' | 'check-circle' | 'clock';
  text: string;
  color: string;
};

/** What a report says at a glance, each with an icon and words (never colour alone). */
export function incidentFlags(i: Pick<Incident, 'stoppedRide' | 'anyoneHurt' | 'reviewedAt'>): Flag[] {
  const flags: Flag[] = [];
  if (i.stoppedRide) flags.push({ icon: 'alert-octagon', text: 'Ride stopped', color: colors.over });
  if (i.anyoneHurt) flags.push({ icon: 'alert-triangle', text: 'Someone hurt', color: colors.over });
  flags.push(
    i.reviewedAt
      ? { icon: 'check-circle', text: 'Reviewed', color: colors.within }
      : { icon: 'clock', text: 'Awaiting review', color: colors.textMuted },
  );
  return flags;
}

export function IncidentFlags({
  incident,
}: {
  incident: Pick<Incident, 'stoppedRide' | 'anyoneHurt' | 'reviewedAt'>;
}) {
  return (
    <View style={styles.flags}>
      {incidentFlags(incident).map((f) => (
        <View key={f.text} style={styles.flag}>
          <Feather name={f.icon} size={14} color={f.color} />
          <Text variant="small" color={f.color}>
            {f.text}
          </Text>
        </View>
      ))}
    </View>
  );
}

/** One report in a list: kind and when (site clock), the first line of what happened, its flags; opens it. */
export function IncidentRow({ incident: i }: { incident: Incident }) {
  const kind = incidentKindVocabulary[i.kind].label;
  const when = formatDateTime(i.occurredAt, i.timeZone);
  return (
    <Link href={incidentHref(i.id)} asChild>
      <Pressable
        role="link"
        accessibilityLabel={`${kind}, ${when}: ${incidentSummary(i.what)}`}
        style={styles.row}
      >
        <View style={styles.text}>
          <Text variant="heading">{kind}</Text>
          <Text variant="small" muted>
            {when}
          </Text>
          <Text numberOfLines={2}>{incidentSummary(i.what)}</Text>
          <IncidentFlags incident={i} />
        </View>
        <Feather name="chevron-right" size={18} color={colors.textMuted} />
      </Pressable>
    </Link>
  );
}

const styles = StyleSheet.create({
  row: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    minHeight: layout.touchTarget,
    paddingVertical: space.sm,
    paddingHorizontal: space.sm,
    borderRadius: radius.sm,
    borderWidth: 1,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  text: { flex: 1, gap: 2 },
  flags: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, marginTop: space.xs },
  flag: { flexDirection: 'row', alignItems: 'center', gap: space.xs },
});
