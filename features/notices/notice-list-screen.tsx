import { StyleSheet, View } from 'react-native';

import { Spinner } from '@/components/spinner';
import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { LinkCard } from '@/components/link-card';
import Feather from '@/components/feather-icon';
import { Screen } from '@/components/screen';
import { SelectField } from '@/components/select-field';
import { SortableTable } from '@/components/sortable-table';
import { Text } from '@/components/text';
import { colors, layout, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { useSession } from '@/features/auth';
import type { SessionUser } from '@/features/session/schema';
import { noticeHref } from '@/features/notices/hrefs';
import { noticeKindLabel } from '@/features/notices/notice-text';
import { useNoticeList } from '@/features/notices/notices-api';
import { type NoticeListItem, noticeListQuerySchema } from '@/features/notices/schema';
import { operatorChoices, useCompanyListQuery, useRidePageQuery } from '@/features/registry/ui';
import { PagedList } from '@/components/paged-list';
import { formatDate } from '@/lib/dates';
import { useListParams } from '@/components/use-list-params';
import { NoticeDeliveryMark } from '@/features/notices/notice-delivery-mark';

const PAGE_SIZE = 25;
const LIST_KEYS = ['rideId', 'operatorId', 'page'] as const;
const ALL = '__all__';

/** What the acknowledgement column says; operators are asked, staff are told. */
function acknowledgementText(n: NoticeListItem, operator: boolean): string {
  if (n.acknowledgedAt)
    return `Acknowledged ${formatDate(n.acknowledgedAt)}${n.acknowledgedByName ? ` by ${n.acknowledgedByName}` : ''}`;
  return operator ? 'Awaiting your acknowledgement' : 'Not acknowledged yet';
}

const openText = (n: NoticeListItem) =>
  n.findingsTotal === 0 ? 'No findings' : `${n.openFindings} of ${n.findingsTotal} open`;

/**
 * Notices, newest first (/notices). Operators see their own company's (the server scopes the list);
 * the inspection body's staff see every notice and may narrow the list to an operator or a ride. The
 * filters and the page live in the URL. Desktop: one dense table. Phone: a card per notice.
 */
export function NoticeListScreen() {
  const session = useSession();
  const user = session.data?.user;
  if (!user) return null;
  return <NoticeList user={user} />;
}

function NoticeList({ user }: { user: SessionUser }) {
  const wide = useWide();
  const operator = user.role === 'operator';
  const [query, setQuery] = useListParams(noticeListQuerySchema, LIST_KEYS);
  const list = useNoticeList({
    page: query.page,
    pageSize: PAGE_SIZE,
    ...(operator ? {} : { rideId: query.rideId, operatorId: query.operatorId }),
  });

  return (
    <Screen
      title="Notices"
      subtitle={
        operator
          ? `Notices to ${user.companyName ?? 'your company'}, newest first. Open one to acknowledge it and report what was done.`
          : 'Notices issued to ride operators, newest first.'
      }
    >
      {operator ? null : (
        <StaffFilters
          operatorId={query.operatorId}
          rideId={query.rideId}
          onChange={(patch) => setQuery({ ...patch, page: undefined })}
        />
      )}
      <PagedList
        query={list}
        noun={(total) => (total === 1 ? 'notice' : 'notices')}
        setPage={(page) => setQuery({ page })}
      >
        {(page) => (
          <>
            {list.isFetching ? (
              <View style={styles.fetching} accessibilityLabel="Updating">
                <Spinner color={colors.base} size="small" />
              </View>
            ) : null}
            {page.notices.length === 0 ? (
              <Card>
                <Text variant="heading">
                  No notices{query.rideId || query.operatorId ? ' match' : ' yet'}.
                </Text>
                <Text muted>
                  {operator
                    ? 'When the inspection body issues a notice about one of your rides, it appears here and is e-mailed to your notice address.'
                    : 'A notice is issued when an inspection with findings is approved, or a ride’s status changes.'}
                </Text>
              </Card>
            ) : wide ? (
              <NoticeTable notices={page.notices} operator={operator} />
            ) : (
              <View style={styles.cards}>
                {page.notices.map((n) => (
                  <NoticeCard key={n.id} notice={n} operator={operator} />
                ))}
              </View>
            )}
          </>
        )}
      </PagedList>
    </Screen>
  );
}

function StaffFilters({
  operatorId,
  rideId,
  onChange,
}: {
  operatorId: string | undefined;
  rideId: string | undefined;
  onChange: (patch: { operatorId?: string; rideId?: string }) => void;
}) {
  const wide = useWide();
  const companies = useCompanyListQuery({ pageSize: 200, sort: 'name' });
  const rides = useRidePageQuery({ pageSize: 200, sort: 'name', operatorId });
  const operatorOptions = [
    { value: ALL, label: 'All operators' },
    ...operatorChoices(companies.data?.companies),
  ];
  const rideOptions = [
    { value: ALL, label: 'All rides' },
    ...(rides.data?.rides ?? []).map((r) => ({ value: r.id, label: r.name, hint: r.operatorName })),
  ];
  return (
    <View style={StyleSheet.flatten([styles.filters, wide && styles.filtersWide])}>
      <View style={wide ? styles.select : undefined}>
        <SelectField
          label="Operator"
          value={operatorId ?? ALL}
          options={operatorOptions}
          // A ride belongs to one operator: choosing another operator lets go of the ride.
          onChange={(v) => onChange({ operatorId: v === ALL ? undefined : v, rideId: undefined })}
        />
      </View>
      <View style={wide ? styles.select : undefined}>
        <SelectField
          label="Ride"
          value={rideId ?? ALL}
          options={rideOptions}
          onChange={(v) => onChange({ rideId: v === ALL ? undefined : v })}
        />
      </View>
      {operatorId || rideId ? (
        <Button
          label="Show all notices"
          tone="quiet"
          onPress={() => onChange({ operatorId: undefined, rideId: undefined })}
        />
      ) : null}
    </View>
  );
}

function AckMark({ notice, operator }: { notice: NoticeListItem; operator: boolean }) {
  const done = notice.acknowledgedAt !== null;
  return (
    <View style={styles.mark}>
      <Feather
        name={done ? 'check-circle' : 'clock'}
        size={16}
        color={done ? colors.within : operator ? colors.accent : colors.near}
      />
      <Text variant="small" color={done ? colors.text : operator ? colors.accent : colors.near}>
        {acknowledgementText(notice, operator)}
      </Text>
    </View>
  );
}

function NoticeTable({ notices, operator }: { notices: NoticeListItem[]; operator: boolean }) {
  return (
    <SortableTable<NoticeListItem, never>
      label="Notices"
      rows={notices}
      rowKey={(n) => n.id}
      rowHref={(n) => noticeHref(n.id)}
      rowLabel={(n) => `Notice ${n.reference}, ${n.rideName}`}
      columns={[
        { key: 'ref', title: 'Reference', render: (n) => <Text variant="figure">{n.reference}</Text> },
        { key: 'ride', title: 'Ride', render: (n) => n.rideName, flex: 1.2 },
        ...(operator
          ? []
          : [{ key: 'op', title: 'Operator', render: (n: NoticeListItem) => n.operatorName, flex: 1.4 }]),
        { key: 'kind', title: 'Kind', render: (n) => noticeKindLabel[n.kind], flex: 1.1 },
        { key: 'issued', title: 'Issued', render: (n) => formatDate(n.issuedAt) },
        {
          key: 'ack',
          title: 'Acknowledgement',
          render: (n) => <AckMark notice={n} operator={operator} />,
          flex: 1.6,
        },
        ...(operator
          ? []
          : [
              {
                key: 'mail',
                title: 'E-mail',
                render: (n: NoticeListItem) => <NoticeDeliveryMark state={n.delivery.state} />,
              },
            ]),
        { key: 'open', title: 'Open findings', render: (n) => openText(n), numeric: true },
      ]}
    />
  );
}

function NoticeCard({ notice: n, operator }: { notice: NoticeListItem; operator: boolean }) {
  return (
    <LinkCard
      href={noticeHref(n.id)}
      label={`Notice ${n.reference}, ${n.rideName}`}
      title={<Text variant="figure">{n.reference}</Text>}
      style={styles.card}
    >
      {(reference) => (
        <>
          <View style={styles.cardHead}>
            {reference}
            <Text variant="small" muted>
              {formatDate(n.issuedAt)}
            </Text>
          </View>
          <Text variant="heading">{n.rideName}</Text>
          <Text variant="small" muted>
            {noticeKindLabel[n.kind]}
            {operator ? '' : ` · ${n.operatorName}`}
          </Text>
          <AckMark notice={n} operator={operator} />
          <View style={styles.cardFoot}>
            <Text variant="small">{openText(n)}</Text>
            {operator ? null : <NoticeDeliveryMark state={n.delivery.state} />}
          </View>
        </>
      )}
    </LinkCard>
  );
}

const styles = StyleSheet.create({
  fetching: { alignItems: 'flex-end' },
  filters: { gap: space.sm },
  filtersWide: { flexDirection: 'row', alignItems: 'flex-end', flexWrap: 'wrap', gap: space.md },
  select: { width: 300 },
  cards: { gap: space.sm },
  card: { padding: space.md, gap: space.xs, minHeight: layout.touchTarget },
  cardHead: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'center', gap: space.sm },
  cardFoot: {
    flexDirection: 'row',
    justifyContent: 'space-between',
    alignItems: 'center',
    flexWrap: 'wrap',
    gap: space.sm,
  },
  mark: { flexDirection: 'row', alignItems: 'center', gap: space.xs, flexShrink: 1 },
});
