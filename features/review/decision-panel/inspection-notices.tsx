import { View } from 'react-native';

import { Button } from '@/components/button';
import { Text } from '@/components/text';
import { useRideNotices } from '@/features/notices';
import { IssuedNoticeRow, NoticeRow } from '@/features/notices/ui';
import type { NoticeListItem } from '@/features/notices/schema';
import { sharedStyles } from '@/features/review/decision-panel/styles';
import { useRideQuery } from '@/features/registry/ui';
import { OfflineError } from '@/lib/api-errors';

type IssuedNotice = { id: string; reference: string };

export function InspectionNotices({
  rideId,
  query,
  notices,
  issued,
  findingsCount,
}: {
  rideId: string;
  query: ReturnType<typeof useRideNotices>;
  notices: NoticeListItem[];
  issued: IssuedNotice | null;
  findingsCount: number | null;
}) {
  // The operator's name for a notice the list does not hold yet; the inspection screen keeps the ride.
  const ride = useRideQuery(rideId);
  const operatorName = ride.data?.ride.operatorName ?? 'the ride’s operator';
  const headline = (reference: string, operator: string) => `Notice ${reference} issued to ${operator}`;
  const listed = issued ? notices.some((n) => n.id === issued.id) : true;
  return (
    <View style={sharedStyles.section}>
      {notices.map((n) => (
        <NoticeRow
          key={n.id}
          notice={n}
          headline={n.kind === 'inspection' ? headline(n.reference, n.operatorName) : undefined}
        />
      ))}
      {issued && !listed ? (
        <IssuedNoticeRow id={issued.id} headline={headline(issued.reference, operatorName)} />
      ) : null}
      {notices.length === 0 && !issued ? (
        query.isPending && query.fetchStatus !== 'idle' ? (
          <Text muted>Looking for the notice…</Text>
        ) : query.error ? (
          <View style={sharedStyles.problem} role="alert">
            <Text>
              {query.error instanceof OfflineError
                ? 'No connection to the server, so the notices could not be loaded.'
                : 'The notices could not be loaded.'}
            </Text>
            <Button label="Try again" tone="quiet" onPress={() => void query.refetch()} />
          </View>
        ) : (
          <Text muted>
            {findingsCount === 0
              ? 'No notice was issued: the inspection was approved without findings, so there is nothing new to tell the operator.'
              : 'No notice has been issued for this inspection.'}
          </Text>
        )
      ) : null}
    </View>
  );
}
