import { router, useLocalSearchParams } from 'expo-router';
import { ScrollView, StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import { Caution } from '@/components/caution';
import { Logo } from '@/components/logo';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { ApiRequestError, OfflineError } from '@/lib/api-errors';
import { useSignInMutation } from '@/features/auth/api';
import { roleHome } from '@/features/auth/hrefs';
import { forgetNextPath, nextPathAfterSignIn } from '@/features/auth/next-path';
import { SignInForm } from '@/features/auth/sign-in-form';

function errorText(err: unknown): string | null {
  if (!err) return null;
  if (err instanceof OfflineError)
    return 'No connection. Sign in once while online; after that the app works offline.';
  if (err instanceof ApiRequestError) {
    if (err.status === 429) return 'Too many failed attempts. Wait a few minutes, then try again.';
    return err.message;
  }
  return 'Sign-in failed. Try again.';
}

export function SignInScreen() {
  const wide = useWide();
  const signIn = useSignInMutation();
  // The page that sent the visitor here (an e-mailed link to a notice): back there after signing in.
  const next = nextPathAfterSignIn(useLocalSearchParams<{ next?: string }>().next);
  const form = (
    <Card style={styles.card}>
      <Text variant="title">Sign in</Text>
      <Text muted>
        {next?.startsWith('/notices/')
          ? 'Sign in with your company’s account to open the notice you were sent.'
          : 'Use the account your inspection body or ride company gave you.'}
      </Text>
      <SignInForm
        busy={signIn.isPending}
        error={errorText(signIn.error)}
        onSubmit={(values) =>
          signIn.mutate(values, {
            onSuccess: (user) => {
              forgetNextPath();
              router.replace(next ?? roleHome[user.role]);
            },
          })
        }
      />
    </Card>
  );

  return (
    <ScrollView style={styles.root} contentContainerStyle={wide ? styles.wide : styles.phone}>
      <View style={wide ? styles.brandWide : styles.brandPhone}>
        <Logo size={wide ? 48 : 36} onDark />
        <Text variant={wide ? 'display' : 'title'} color={colors.chromeText} style={styles.claim}>
          Pivot loads, wear and findings for rotating-arm rides — recorded at the ride, checked against its
          design envelope.
        </Text>
        {wide ? (
          <View style={styles.points}>
            {[
              'Inspectors record checklists, speeds, wear and photos on a phone, with or without signal.',
              'Supervisors see flagged rides first and decide with loads, photos and findings side by side.',
              'Ride operators receive notices, acknowledge them and report corrective work.',
            ].map((p) => (
              <Text key={p} color={colors.chromeMuted}>
                — {p}
              </Text>
            ))}
          </View>
        ) : null}
      </View>
      <View style={wide ? styles.formWide : styles.formPhone}>
        {form}
        <Caution />
      </View>
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  root: { flex: 1, backgroundColor: colors.chrome },
  phone: { flexGrow: 1 },
  wide: { flexGrow: 1, flexDirection: 'row', minHeight: '100%' },
  brandPhone: { padding: space.xl, paddingTop: space.xxl, gap: space.lg },
  brandWide: { flex: 1, padding: 64, gap: space.xl, justifyContent: 'center', maxWidth: 680 },
  claim: { maxWidth: 560 },
  points: { gap: space.md, maxWidth: 520 },
  formPhone: {
    flexGrow: 1,
    backgroundColor: colors.bg,
    borderTopLeftRadius: 20,
    borderTopRightRadius: 20,
    padding: space.lg,
    gap: space.lg,
  },
  formWide: { flex: 1, backgroundColor: colors.bg, padding: 64, justifyContent: 'center', gap: space.lg },
  card: { gap: space.md, maxWidth: 460, width: '100%', alignSelf: 'center', padding: space.xl },
});
