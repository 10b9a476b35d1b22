import Feather from '@expo/vector-icons/Feather';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { useFonts } from 'expo-font';
import { Slot } from 'expo-router';
import { useState } from 'react';
import { ActivityIndicator, StyleSheet, View } from 'react-native';
import { SafeAreaProvider } from 'react-native-safe-area-context';

import { colors, fontFiles } from '@/components/theme';
import { makeQueryClient } from '@/features/api';
import { UpdatePrompt } from '@/features/sync/ui';

/** Every page's frame: fonts loaded, one query client, the app-update prompt. */
export function RootLayout() {
  const [fontsLoaded, fontError] = useFonts({ ...fontFiles, ...Feather.font });
  const [client] = useState<QueryClient>(makeQueryClient);
  if (!fontsLoaded && !fontError) {
    return (
      <View style={styles.splash}>
        <ActivityIndicator color={colors.baseText} />
      </View>
    );
  }
  return (
    <SafeAreaProvider>
      <QueryClientProvider client={client}>
        <UpdatePrompt />
        <Slot />
      </QueryClientProvider>
    </SafeAreaProvider>
  );
}

const styles = StyleSheet.create({
  splash: { flex: 1, alignItems: 'center', justifyContent: 'center', backgroundColor: colors.base },
});
