import { StyleSheet, View } from 'react-native';

import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { type ReviewState, useCachedReview } from '@/features/review/decision-api';
import { formatDateTime } from '@/lib/dates';

const stateWords: Record<ReviewState, { title: string; glyph: string }> = {
  submitted: { title: 'Waiting for a decision', glyph: '◷' },
  approved: { title: 'Approved', glyph: '✓' },
  returned: { title: 'Returned to the inspector', glyph: '↩' },
};

export function ReviewStateView({
  inspectionId,
  reviewState,
  reviewNote,
  saving,
}: {
  inspectionId: string;
  reviewState: ReviewState;
  reviewNote: string | null;
  saving: boolean;
}) {
  const cached = useCachedReview(inspectionId);
  const who = cached?.reviewedByName;
  const when = cached?.reviewedAt;
  const words = stateWords[reviewState];
  const by =
    reviewState !== 'submitted' && (who || when)
      ? [who ? `by ${who}` : null, when ? formatDateTime(when) : null].filter(Boolean).join(', ')
      : null;
  return (
    <View
      style={StyleSheet.flatten([styles.state, reviewState === 'approved' && styles.stateApproved])}
      accessibilityLabel={`Review: ${words.title}`}
    >
      <Text variant="heading">
        {words.glyph} {words.title}
        {by ? ` ${by}` : ''}
      </Text>
      {saving ? (
        <Text variant="small" color={colors.focus} accessibilityLiveRegion="polite">
          Saving the decision…
        </Text>
      ) : null}
      {reviewState === 'submitted' ? (
        <Text variant="small" muted>
          Record the findings, then approve the inspection or return it to the inspector.
        </Text>
      ) : null}
      {reviewNote ? (
        <Text>
          <Text variant="label" muted>
            {reviewState === 'returned'
              ? 'COMMENT FOR THE INSPECTOR '
              : reviewState === 'submitted'
                ? 'EARLIER COMMENT '
                : 'NOTE '}
          </Text>
          {reviewNote}
        </Text>
      ) : null}
      {reviewState === 'returned' ? (
        <Text variant="small" muted>
          The inspector sees this comment on the phone after the next sync, corrects the inspection and
          submits it again.
        </Text>
      ) : null}
      {reviewState === 'approved' ? (
        <Text variant="small" muted>
          The decision is final. The findings below say where each one stands now: the operator reports
          corrective actions on the notice, where they are verified and closed.
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  state: {
    gap: space.xs,
    paddingLeft: space.md,
    borderLeftWidth: 4,
    borderLeftColor: colors.border,
  },
  stateApproved: { borderLeftColor: colors.within },
});
