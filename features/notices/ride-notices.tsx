import { Link } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';

import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import type { NoticeListItem } from '@/features/notices/schema';
import { noticeKindLabel } from '@/features/notices/notice-text';
import { formatDateTime } from '@/lib/dates';
import { NoticeDeliveryMark } from '@/features/notices/notice-delivery-mark';
import { noticeHref } from '@/features/notices/hrefs';

function acknowledgement(n: NoticeListItem): string {
  if (!n.acknowledgedAt) return 'Not acknowledged yet';
  return `Acknowledged ${formatDateTime(n.acknowledgedAt)}${n.acknowledgedByName ? ` by ${n.acknowledgedByName}` : ''}`;
}

function findingsWords(n: NoticeListItem): string | null {
  if (n.findingsTotal === 0) return null;
  if (n.openFindings === 0)
    return n.findingsTotal === 1 ? 'Its finding is closed' : `All ${n.findingsTotal} findings closed`;
  return `${n.openFindings} of ${n.findingsTotal} ${n.findingsTotal === 1 ? 'finding' : 'findings'} not closed`;
}

/**
 * One notice as a link to it: reference and kind (or the given headline), when it was issued and by whom,
 * the operator's acknowledgement, its findings still to close, and where its e-mail stands.
 */
export function NoticeRow({ notice: n, headline }: { notice: NoticeListItem; headline?: string }) {
  const findings = findingsWords(n);
  return (
    <Link href={noticeHref(n.id)} asChild>
      <Pressable role="link" accessibilityLabel={`Notice ${n.reference}`} style={styles.row}>
        <View style={styles.text}>
          {headline ? (
            <Text variant="heading">{headline}</Text>
          ) : (
            <Text variant="heading">
              <Text variant="figure">{n.reference}</Text> · {noticeKindLabel[n.kind]}
            </Text>
          )}
          <Text variant="small" muted>
            Issued {formatDateTime(n.issuedAt)}
            {n.issuedByName ? ` by ${n.issuedByName}` : ''}
          </Text>
          <Text variant="small" color={n.acknowledgedAt ? colors.text : colors.textMuted}>
            {n.acknowledgedAt ? '✓ ' : '○ '}
            {acknowledgement(n)}
          </Text>
          <View style={styles.meta}>
            <NoticeDeliveryMark state={n.delivery.state} />
            {findings ? (
              <Text variant="small" muted>
                {findings}
              </Text>
            ) : null}
          </View>
        </View>
        <Feather name="chevron-right" size={20} color={colors.accent} />
      </Pressable>
    </Link>
  );
}

/** A notice known only from the decision's answer (the list has not caught up yet). */
export function IssuedNoticeRow({ id, headline }: { id: string; headline: string }) {
  return (
    <Link href={noticeHref(id)} asChild>
      <Pressable role="link" accessibilityLabel={headline} style={styles.row}>
        <View style={styles.text}>
          <Text variant="heading">{headline}</Text>
          <Text variant="small" muted>
            Open the notice to follow its e-mail and the operator’s acknowledgement.
          </Text>
        </View>
        <Feather name="chevron-right" size={20} color={colors.accent} />
      </Pressable>
    </Link>
  );
}

const styles = StyleSheet.create({
  row: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    minHeight: layout.touchTarget,
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  text: { flex: 1, gap: 2, minWidth: 0 },
  meta: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm, marginTop: 2 },
});
