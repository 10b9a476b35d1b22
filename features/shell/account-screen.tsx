import { Card } from '@/components/card';
import { Caution } from '@/components/caution';
import { Column, Columns, Screen } from '@/components/screen';
import { Text } from '@/components/text';
import { useWide } from '@/components/use-wide';
import { roleLabel, useSession } from '@/features/auth';
import { PasswordChangeCard } from '@/features/auth/ui';
import { PhoneStorageCard } from '@/features/device-db/ui';
import { InspectorSignOut, SignOutButton } from '@/features/shell/sign-out-card';
import { ThemeCard } from '@/features/shell/theme-card';

/**
 * The person's own page. It lives in the shell, above the device database and sync, because signing out
 * an inspector has to count and wipe what the phone holds for them. Who you are and signing out first
 * (the phone's thumb reach), then the password and the phone's storage; side by side on a wide screen.
 */
export function AccountScreen() {
  const session = useSession();
  const wide = useWide();
  const user = session.data?.user;
  if (!user) return null;
  const who = (
    <>
      <Card>
        <Text variant="heading">{user.name}</Text>
        <Text muted>{user.email}</Text>
        <Text>
          {roleLabel[user.role]}
          {user.companyName ? ` · ${user.companyName}` : ''}
        </Text>
      </Card>
      {user.role === 'inspector' ? <InspectorSignOut /> : <SignOutButton />}
    </>
  );
  const settings = (
    <>
      <PasswordChangeCard user={user} />
      <ThemeCard />
      <PhoneStorageCard />
    </>
  );
  return (
    <Screen title="Account">
      {/* Columns only side by side: stacked, a Column's zero basis would fold its cards over each other. */}
      {wide ? (
        <Columns>
          <Column>{who}</Column>
          <Column>{settings}</Column>
        </Columns>
      ) : (
        <>
          {who}
          {settings}
        </>
      )}
      <Caution full />
    </Screen>
  );
}
