import { router } from 'expo-router';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { Caution } from '@/components/caution';
import { Screen } from '@/components/screen';
import { Text } from '@/components/text';
import { roleLabel, useSession, useSignOutMutation } from '@/features/auth/api';
import { signInHref } from '@/features/auth/hrefs';

export function AccountScreen() {
  const session = useSession();
  const signOut = useSignOutMutation();
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
      <Button
        label="Sign out"
        tone="danger"
        busy={signOut.isPending}
        onPress={() => signOut.mutate(undefined, { onSuccess: () => router.replace(signInHref()) })}
      />
      <Caution full />
    </Screen>
  );
}
