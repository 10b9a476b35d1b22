import { router } from 'expo-router';
import { useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { ChoiceChips } from '@/components/choice-chips';
import Feather from '@/components/feather-icon';
import { QueryState } from '@/components/query-state';
import { Screen } from '@/components/screen';
import { SearchField } from '@/components/search-field';
import { SortableTable } from '@/components/sortable-table';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { formatDateTime } from '@/lib/dates';
import { accountStates, accountStateVocabulary, type AccountState } from '@/lib/vocabulary';
import { usePeopleQuery } from '@/features/admin/api';
import { AccountStateMark } from '@/features/admin/account-state';
import { personHref } from '@/features/admin/hrefs';
import { PersonAddForm } from '@/features/admin/person-add-form';
import type { AdminUser } from '@/features/admin/schema';
import { roleLabel } from '@/features/auth';
import { RoleGate } from '@/features/auth/ui';

type StateFilter = AccountState | 'all';

/** Whether a person matches the search: name, e-mail, role or company, any part, any case. */
function matches(u: AdminUser, q: string) {
  const needle = q.trim().toLowerCase();
  if (!needle) return true;
  return [u.name, u.email, roleLabel[u.role], u.companyName ?? ''].some((t) =>
    t.toLowerCase().includes(needle),
  );
}

/** Everyone with an account: who they are, their role and company, whether they can sign in. */
export function PeopleScreen() {
  return <RoleGate roles={['admin']}>{() => <People />}</RoleGate>;
}

function People() {
  const wide = useWide();
  const people = usePeopleQuery();
  const [adding, setAdding] = useState(false);
  const [search, setSearch] = useState('');
  const [state, setState] = useState<StateFilter>('all');
  const rows = useMemo(
    () =>
      (people.data?.users ?? []).filter((u) => matches(u, search) && (state === 'all' || u.state === state)),
    [people.data, search, state],
  );
  return (
    <Screen
      title="People"
      subtitle="Who can sign in, in which role and for which company."
      actions={
        adding ? null : (
          <Button
            label="Add a person"
            tone="accent"
            icon={<Feather name="user-plus" size={18} color={colors.baseText} />}
            onPress={() => setAdding(true)}
          />
        )
      }
    >
      {adding && people.data ? (
        <PersonAddForm companies={people.data.companies} onDone={() => setAdding(false)} />
      ) : null}
      <Card>
        <SearchField
          label="Search people"
          placeholder="Name, e-mail, role or company"
          value={search}
          onChangeText={setSearch}
        />
        <ChoiceChips<StateFilter>
          label="Account"
          value={state}
          onChange={setState}
          options={[
            { value: 'all', label: 'All' },
            ...accountStates.map((s) => ({ value: s, label: accountStateVocabulary[s].label })),
          ]}
        />
      </Card>
      <QueryState query={people}>
        {() =>
          rows.length === 0 ? (
            <Text muted>No one matches.</Text>
          ) : wide ? (
            <SortableTable<AdminUser, never>
              label="People"
              rows={rows}
              rowKey={(u) => u.id}
              rowHref={(u) => personHref(u.id)}
              rowLabel={(u) => u.name}
              columns={[
                { key: 'name', title: 'Name', flex: 1.3, render: (u) => u.name },
                { key: 'email', title: 'E-mail', flex: 1.7, render: (u) => u.email },
                { key: 'role', title: 'Role', render: (u) => roleLabel[u.role] },
                { key: 'company', title: 'Company', flex: 1.3, render: (u) => u.companyName ?? '—' },
                { key: 'state', title: 'Account', render: (u) => <AccountStateMark state={u.state} /> },
                {
                  key: 'changed',
                  title: 'Last change',
                  flex: 1.1,
                  render: (u) => formatDateTime(u.lastChangeAt),
                },
              ]}
            />
          ) : (
            <View style={styles.cards}>
              {rows.map((u) => (
                <Card key={u.id}>
                  <Text variant="heading">{u.name}</Text>
                  <Text variant="small" muted>
                    {u.email}
                  </Text>
                  <Text variant="small">
                    {roleLabel[u.role]}
                    {u.companyName ? ` · ${u.companyName}` : ''}
                  </Text>
                  <AccountStateMark state={u.state} />
                  <Text variant="small" muted>
                    Last change {formatDateTime(u.lastChangeAt)}
                  </Text>
                  <Button
                    label="Open"
                    tone="quiet"
                    accessibilityLabel={`Open ${u.name}`}
                    onPress={() => router.push(personHref(u.id))}
                    style={styles.open}
                  />
                </Card>
              ))}
            </View>
          )
        }
      </QueryState>
    </Screen>
  );
}

const styles = StyleSheet.create({
  cards: { gap: space.md },
  open: { alignSelf: 'flex-start' },
});
