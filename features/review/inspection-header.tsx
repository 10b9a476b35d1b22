import { Link } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { EnvelopeMark, RideStatusMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import { inspectionTypeLabel } from '@/features/registry/schema';
import { reviewHref } from '@/features/review/hrefs';
import type { InspectionDetail, ReviewState } from '@/features/review/inspection-schema';
import { reviewStateLabel } from '@/features/review/review-format';
import { rideHref } from '@/features/rides';
import { deviceTimeZone, formatDateTime, formatWhen } from '@/lib/dates';

/** Who, what, when and where it stands: the ride (with its status), the load check, the review. */
export function InspectionHeader({
  inspection: i,
  rideStatus,
}: {
  inspection: InspectionDetail;
  rideStatus: 'in_service' | 'restricted' | 'out_of_service' | null;
}) {
  // Times on the site's clock (the zone is written after the submission and receipt times).
  const zone = i.siteTimeZone ?? deviceTimeZone();
  return (
    <Card style={styles.header}>
      <View style={styles.headerTop}>
        <Link href={rideHref(i.rideId)} asChild>
          <Pressable role="link" accessibilityLabel={`Ride ${i.rideName}`} style={styles.rideLink}>
            <Text variant="title" color={colors.accent}>
              {i.rideName}
            </Text>
            <Feather name="chevron-right" size={22} color={colors.accent} />
          </Pressable>
        </Link>
        <View style={styles.marks}>
          {rideStatus ? <RideStatusMark status={rideStatus} /> : null}
          {i.analysisStatus ? (
            <EnvelopeMark status={i.analysisStatus} />
          ) : (
            <View style={styles.plainMark}>
              <Text variant="label" muted>
                {i.analysis ? 'No limits to check' : 'Not checked'}
              </Text>
            </View>
          )}
        </View>
      </View>
      <View style={styles.facts}>
        <Fact label="Type" value={inspectionTypeLabel[i.type]} />
        <Fact label="Inspector" value={i.inspectorName} />
        <Fact label="Submitted" value={formatWhen(i.submittedAt, zone)} />
        <Fact label="Received" value={formatWhen(i.receivedAt, zone)} />
        <Fact label="Review" value={reviewStateLabel[i.reviewState]} />
        <Fact
          label="Recorded"
          value={`${i.failedItems} failed · ${i.readingCount} readings · ${i.photoCount} photos`}
        />
      </View>
      {i.reviewedAt ? (
        <Text variant="small" muted>
          {reviewStateLabel[i.reviewState]} by {i.reviewedByName ?? 'someone'} on{' '}
          {formatDateTime(i.reviewedAt, zone)}
          {i.reviewNote ? `: “${i.reviewNote}”` : ''}
        </Text>
      ) : null}
      {i.amendsId ? <InspectionLink id={i.amendsId} label="Corrects an earlier inspection" /> : null}
      {i.amendedBy.map((a) => (
        <InspectionLink
          key={a.id}
          id={a.id}
          label={`Corrected by a later inspection (${formatDateTime(a.submittedAt, zone)})`}
        />
      ))}
      {i.record.declaration ? (
        <View style={styles.notes} accessibilityLabel="Declaration">
          <Text variant="label" muted>
            DECLARATION
          </Text>
          <Text>“{i.record.declaration.text}”</Text>
          <Text variant="small" muted>
            Made by {i.record.declaration.declaredByName} on{' '}
            {formatDateTime(i.record.declaration.declaredAt, zone)}
          </Text>
        </View>
      ) : (
        <Text variant="small" muted>
          No declaration: recorded before inspectors were asked for one.
        </Text>
      )}
      {i.record.notes ? (
        <View style={styles.notes}>
          <Text variant="label" muted>
            INSPECTOR’S NOTES
          </Text>
          <Text>{i.record.notes}</Text>
        </View>
      ) : null}
    </Card>
  );
}

function Fact({ label, value }: { label: string; value: string }) {
  return (
    <View style={styles.fact}>
      <Text variant="label" muted>
        {label.toUpperCase()}
      </Text>
      <Text>{value}</Text>
    </View>
  );
}

function InspectionLink({ id, label }: { id: string; label: string }) {
  return (
    <Link href={reviewHref(id)} asChild>
      <Pressable role="link" style={styles.inlineLink}>
        <Feather name="git-commit" size={16} color={colors.accent} />
        <Text variant="heading" color={colors.accent}>
          {label}
        </Text>
      </Pressable>
    </Link>
  );
}

const reviewStateSpec: Record<
  ReviewState,
  { icon: 'clock' | 'check-circle' | 'corner-up-left'; fg: string; bg: string }
> = {
  submitted: { icon: 'clock', fg: colors.text, bg: colors.surfaceSunk },
  approved: { icon: 'check-circle', fg: colors.within, bg: colors.withinSoft },
  returned: { icon: 'corner-up-left', fg: colors.near, bg: colors.nearSoft },
};

/** The review state in words with its own icon; colour only repeats what they say. */
export function ReviewStateMark({ state }: { state: ReviewState }) {
  const spec = reviewStateSpec[state];
  return (
    <View style={StyleSheet.flatten([styles.stateMark, { backgroundColor: spec.bg }])}>
      <Feather name={spec.icon} size={14} color={spec.fg} />
      <Text variant="label" color={spec.fg}>
        {reviewStateLabel[state]}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  header: { gap: space.md },
  headerTop: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: space.sm,
  },
  rideLink: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.xs,
    minHeight: layout.touchTarget,
    flexShrink: 1,
  },
  marks: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  plainMark: {
    paddingHorizontal: space.sm + 2,
    paddingVertical: space.xs,
    borderRadius: radius.sm,
    backgroundColor: colors.surfaceSunk,
  },
  facts: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.xl, rowGap: space.sm },
  fact: { gap: 2, minWidth: 140 },
  notes: { gap: 2 },
  inlineLink: { flexDirection: 'row', alignItems: 'center', gap: space.sm, minHeight: layout.touchTarget },
  stateMark: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.xs + 2,
    paddingHorizontal: space.sm + 2,
    paddingVertical: space.xs,
    borderRadius: radius.sm,
  },
});
