import { Link } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import { DataTable } from '@/components/data-table';
import Feather from '@/components/feather-icon';
import { QueryState } from '@/components/query-state';
import { Screen, SectionTitle } from '@/components/screen';
import { StatRow, StatTile } from '@/components/stat-tile';
import { RideStatusMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { colors, layout, space } from '@/components/theme';
import { peopleHref, useAdminUsersQuery } from '@/features/admin';
import { roleLabel } from '@/features/auth';
import { RoleGate } from '@/features/auth/ui';
import { outboxHref } from '@/features/notices';
import { roles } from '@/features/session/schema';
import { useRidesQuery } from '@/features/rides';
import { PlateSheetDownload } from '@/features/registry/ui';
import { rideClassLabel } from '@/features/rides/schema';
import { useFirstScreenSettled } from '@/components/first-screen';

/** Administrator's start page: who can sign in, the ride register at a glance, and the e-mail outbox. */
export function AdminHome() {
  const users = useAdminUsersQuery();
  const rides = useRidesQuery();
  useFirstScreenSettled(!users.isPending);
  return (
    <RoleGate roles={['admin']}>
      {() => (
        <Screen title="Administration" subtitle="People, companies and the ride register.">
          <QueryState query={users}>
            {(list) => (
              <>
                <StatRow>
                  {roles.map((r) => (
                    <StatTile
                      key={r}
                      value={list.filter((u) => u.role === r).length}
                      label={`${roleLabel[r]}s`}
                    />
                  ))}
                </StatRow>
                <SectionTitle>People</SectionTitle>
                <Link href={peopleHref} asChild>
                  <Pressable role="link" style={styles.link}>
                    <Feather name="users" size={18} color={colors.accent} />
                    <View style={styles.linkText}>
                      <Text variant="heading" color={colors.accent}>
                        Manage people: invite, change roles, disable, reset
                      </Text>
                    </View>
                    <Feather name="chevron-right" size={18} color={colors.accent} />
                  </Pressable>
                </Link>
                <DataTable
                  label="People"
                  rows={list}
                  rowKey={(u) => u.id}
                  columns={[
                    { key: 'name', title: 'Name', render: (u) => u.name, flex: 1.2 },
                    { key: 'email', title: 'E-mail', render: (u) => u.email, flex: 1.6 },
                    { key: 'role', title: 'Role', render: (u) => roleLabel[u.role] },
                    { key: 'company', title: 'Company', render: (u) => u.companyName ?? '—', flex: 1.4 },
                    { key: 'state', title: 'Account', render: (u) => (u.disabledAt ? 'Disabled' : 'Active') },
                  ]}
                />
              </>
            )}
          </QueryState>
          <SectionTitle>E-mail</SectionTitle>
          <OutboxCard />
          <SectionTitle>Ride register</SectionTitle>
          <PlateSheetDownload />
          <QueryState query={rides}>
            {(list) => (
              <DataTable
                label="Rides"
                rows={list}
                rowKey={(r) => r.id}
                columns={[
                  { key: 'name', title: 'Ride', render: (r) => r.name, flex: 1.2 },
                  { key: 'class', title: 'Class', render: (r) => rideClassLabel[r.rideClass] },
                  { key: 'site', title: 'Site', render: (r) => r.siteName ?? '—', flex: 1.3 },
                  { key: 'operator', title: 'Operator', render: (r) => r.operatorName, flex: 1.3 },
                  {
                    key: 'status',
                    title: 'Status',
                    render: (r) => <RideStatusMark status={r.status} compact />,
                  },
                ]}
              />
            )}
          </QueryState>
        </Screen>
      )}
    </RoleGate>
  );
}

function OutboxCard() {
  return (
    <Card>
      <Text muted>
        Notices go to operators by e-mail with their PDF. While the server runs with its built-in mailbox
        (development and the demo) every message it sent can be read here, attachments included.
      </Text>
      <Link href={outboxHref} asChild>
        <Pressable role="link" style={styles.link}>
          <Feather name="mail" size={18} color={colors.accent} />
          <View style={styles.linkText}>
            <Text variant="heading" color={colors.accent}>
              Outbox
            </Text>
          </View>
          <Feather name="chevron-right" size={18} color={colors.accent} />
        </Pressable>
      </Link>
    </Card>
  );
}

const styles = StyleSheet.create({
  link: { flexDirection: 'row', alignItems: 'center', gap: space.sm, minHeight: layout.touchTarget },
  linkText: { flex: 1 },
});
