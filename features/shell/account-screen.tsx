import { Card } from '@/components/card';
import { Caution } from '@/components/caution';
import { Screen } from '@/components/screen';
import { Text } from '@/components/text';
import { roleLabel, useSession } from '@/features/auth';
import { PhoneStorageCard } from '@/features/device-db/ui';
import { InspectorSignOut, SignOutButton } from '@/features/shell/sign-out-card';

/**
 * The person's own page. It lives in the shell, above the device database and sync, because signing out
 * an inspector has to count and wipe what the phone holds for them.
 */
export function AccountScreen() {
  const session = useSession();
  const user = session.data?.user;
  if (!user) return null;
  return (
    <Screen title="Account">
      <Card>
        <Text variant="heading">{user.name}</Text>
        <Text muted>{user.email}</Text>
        <Text>
          {roleLabel[user.role]}
          {user.companyName ? ` · ${user.companyName}` : ''}
        </Text>
      </Card>
      <PhoneStorageCard />
      {user.role === 'inspector' ? <InspectorSignOut /> : <SignOutButton />}
      <Caution full />
    </Screen>
  );
}
