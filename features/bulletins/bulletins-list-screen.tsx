import { router } from 'expo-router';
import { StyleSheet } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { PagedList } from '@/components/paged-list';
import { Screen } from '@/components/screen';
import { SortableTable } from '@/components/sortable-table';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, space } from '@/components/theme';
import { ToggleChips } from '@/components/toggle-chips';
import { useListParams, useSearchText } from '@/components/use-list-params';
import { useWide } from '@/components/use-wide';
import { RoleGate } from '@/features/auth/ui';
import { useBulletinListQuery } from '@/features/bulletins/api';
import {
  type Bulletin,
  bulletinListQuerySchema,
  bulletinSeverities,
  bulletinSeverityLabel,
} from '@/features/bulletins/schema';
import { deadlineWords } from '@/features/bulletins/words';
import { bulletinHref, newBulletinHref } from '@/features/registry';
import { RegisterTabs, RemovalNotice } from '@/features/registry/ui';
import type { SessionUser } from '@/features/session/schema';
import { formatDate } from '@/lib/dates';

const PAGE_SIZE = 25;
const staff = ['admin', 'supervisor', 'inspector'] as const;

/** "2 of 3 rides done", or that no ride in the register is of its models. */
const doneWords = (b: Bulletin) =>
  b.rideCount === 0
    ? 'No ride of these models'
    : `${b.doneCount} of ${b.rideCount} ${b.rideCount === 1 ? 'ride' : 'rides'} done`;

/** Makers' safety bulletins: the register, searched and filtered by how much they matter. */
export function BulletinsListScreen() {
  return <RoleGate roles={staff}>{(user) => <BulletinsList user={user} />}</RoleGate>;
}

function BulletinsList({ user }: { user: SessionUser }) {
  const wide = useWide();
  const [query, setQuery] = useListParams(bulletinListQuerySchema, ['q', 'severity', 'page']);
  const list = useBulletinListQuery({ ...query, pageSize: PAGE_SIZE });
  const [search, setSearch] = useSearchText(query.q, (q) => setQuery({ q, page: undefined }));
  const keeper = user.role === 'admin' || user.role === 'supervisor';
  return (
    <Screen
      title="Bulletins"
      subtitle="Makers’ safety bulletins and where each ride stands on them."
      actions={
        keeper ? (
          <Button
            label="New bulletin"
            tone="accent"
            icon={<Feather name="plus" size={18} color={colors.baseText} />}
            onPress={() => router.push(newBulletinHref)}
          />
        ) : null
      }
    >
      <RegisterTabs role={user.role} />
      <RemovalNotice />
      <Card style={styles.filters}>
        <TextField
          label="Search bulletins"
          hint="Maker, model, reference, title or action"
          value={search}
          onChangeText={setSearch}
          autoCapitalize="none"
        />
        <ToggleChips
          label="How much it matters"
          values={query.severity ?? []}
          options={bulletinSeverities.map((s) => ({ value: s, label: bulletinSeverityLabel[s] }))}
          onChange={(v) => setQuery({ severity: v, page: undefined })}
        />
      </Card>
      <PagedList query={list} noun="bulletins" setPage={(page) => setQuery({ page })}>
        {(page) =>
          wide ? (
            <SortableTable<Bulletin, never>
              label="Bulletins"
              rows={page.bulletins}
              rowKey={(b) => b.id}
              rowHref={(b) => bulletinHref(b.id)}
              rowLabel={(b) => `${b.reference} ${b.title}`}
              columns={[
                { key: 'reference', title: 'Reference', flex: 1.3, render: (b) => b.reference },
                { key: 'title', title: 'Title', flex: 2, render: (b) => b.title },
                {
                  key: 'maker',
                  title: 'Maker and models',
                  flex: 1.5,
                  render: (b) => `${b.maker} ${b.models.join(', ')}`,
                },
                { key: 'issued', title: 'Issued', render: (b) => formatDate(b.issuedOn) },
                { key: 'severity', title: 'Matters', render: (b) => bulletinSeverityLabel[b.severity] },
                { key: 'deadline', title: 'Deadline', flex: 1.2, render: (b) => deadlineWords(b) },
                { key: 'done', title: 'Rides', flex: 1.2, render: doneWords },
              ]}
            />
          ) : (
            page.bulletins.map((b) => (
              <Card key={b.id}>
                <Text variant="heading">
                  {b.reference} · {b.title}
                </Text>
                <Text variant="small" muted>
                  {b.maker} {b.models.join(', ')} · issued {formatDate(b.issuedOn)}
                </Text>
                <Text variant="small">
                  {bulletinSeverityLabel[b.severity]} · {deadlineWords(b)} · {doneWords(b)}
                </Text>
                <Button
                  label="Open"
                  tone="quiet"
                  onPress={() => router.push(bulletinHref(b.id))}
                  style={styles.start}
                />
              </Card>
            ))
          )
        }
      </PagedList>
    </Screen>
  );
}

const styles = StyleSheet.create({
  filters: { gap: space.md },
  start: { alignSelf: 'flex-start' },
});
