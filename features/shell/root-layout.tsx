import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { Slot } from 'expo-router';
import { useState } from 'react';
import { Platform, StyleSheet, View } from 'react-native';
import { SafeAreaProvider } from 'react-native-safe-area-context';

import { Spinner } from '@/components/spinner';
import { useAppFonts } from '@/components/app-fonts';
import { colors } from '@/components/theme';
import { makeQueryClient } from '@/features/api';
import { preloadStoredSession } from '@/features/shell/lazy-screens';

// A reload of a signed-in page starts fetching its screens now rather than after the first render and the
// session's confirmation (the web's chunks; a phone has all its code already).
if (Platform.OS === 'web') preloadStoredSession();

/** Every page's frame: the fonts and one query client (the update prompt comes with sign-in: signed-in-frame.tsx). */
export function RootLayout() {
  const fontsReady = useAppFonts();
  const [client] = useState<QueryClient>(makeQueryClient);
  if (!fontsReady) {
    return (
      <View style={styles.splash}>
        <Spinner color={colors.chromeText} />
      </View>
    );
  }
  return (
    <SafeAreaProvider>
      <QueryClientProvider client={client}>
        <Slot />
      </QueryClientProvider>
    </SafeAreaProvider>
  );
}

const styles = StyleSheet.create({
  splash: { flex: 1, alignItems: 'center', justifyContent: 'center', backgroundColor: colors.chrome },
});
