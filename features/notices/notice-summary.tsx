import { StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import { Caution } from '@/components/caution';
import { RideStatusMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import { severityInfo } from '@/features/notices/finding-schema';
import { FindingStateMark } from '@/features/notices/finding-state-mark';
import { isPastDue, todayIso } from '@/features/notices/notice-text';
import type { NoticeDetail } from '@/features/notices/schema';
import { SeverityMark } from '@/features/notices/severity-mark';
import { formatDate } from '@/lib/dates';

/**
 * What the notice means for the ride, at the top of its page: the operating status it sets, whether the
 * ride must be inspected again, and what must be done by when (each finding as it stands now, in one
 * line), with the safety caution. The full document, results and all, follows further down.
 */
export function NoticeSummary({ notice }: { notice: NoticeDetail }) {
  const doc = notice.document;
  const today = todayIso();
  const toDo = notice.findings.filter((f) => f.state !== 'closed' && f.severity !== 'note');
  return (
    <Card accessibilityLabel="What this notice asks">
      <Text variant="heading" role="heading" aria-level={2}>
        What this notice asks
      </Text>

      <View style={styles.part} accessibilityLabel="Operating status">
        <Text variant="label" muted>
          OPERATING STATUS
        </Text>
        <View style={styles.row}>
          <RideStatusMark status={doc.operatingStatus.status} />
        </View>
        {doc.operatingStatus.reason ? <Text variant="small">{doc.operatingStatus.reason}</Text> : null}
        <Text>
          {doc.reinspection.required ? 'Re-inspection required' : 'No re-inspection required'}
          {doc.reinspection.reason ? ` — ${doc.reinspection.reason}` : ''}
        </Text>
      </View>

      <View style={styles.part}>
        <Text variant="label" muted>
          WHAT TO DO AND BY WHEN
        </Text>
        {toDo.length === 0 ? (
          <Text>
            {notice.findings.length === 0
              ? 'This notice lists no findings: nothing to correct.'
              : 'Nothing left to correct: every finding that asked for action is closed.'}
          </Text>
        ) : (
          <View style={styles.list} role="list" accessibilityLabel="What to do and by when">
            {toDo.map((f) => {
              const late = isPastDue(f, today);
              return (
                <View
                  key={f.id}
                  style={styles.item}
                  role="listitem"
                  accessibilityLabel={`To do: finding ${f.number}`}
                >
                  <View style={styles.row}>
                    <Text variant="heading">Finding {f.number}</Text>
                    <SeverityMark severity={f.severity} compact />
                    <FindingStateMark state={f.state} />
                  </View>
                  <Text>{f.requiredAction ?? f.description}</Text>
                  <Text variant="label" color={late ? colors.danger : colors.text}>
                    {byWhen(f, late)}
                  </Text>
                </View>
              );
            })}
          </View>
        )}
      </View>

      <Caution />
    </Card>
  );
}

/** The due date; without one, a finding that forbids operation is due before the ride runs again. */
function byWhen(f: NoticeDetail['findings'][number], late: boolean): string {
  if (f.dueOn) return `By ${formatDate(f.dueOn)}${late ? ' — past due' : ''}`;
  return severityInfo[f.severity].mayOperate ? 'No due date set' : 'Before the ride carries riders again';
}

const styles = StyleSheet.create({
  part: { gap: space.xs },
  row: { flexDirection: 'row', alignItems: 'center', flexWrap: 'wrap', gap: space.sm },
  list: { gap: space.sm },
  item: {
    gap: 2,
    padding: space.sm,
    borderRadius: radius.sm,
    backgroundColor: colors.bg,
  },
});
