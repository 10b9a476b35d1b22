import { StyleSheet, View } from 'react-native';

import { Spinner } from '@/components/spinner';
import { Button } from '@/components/button';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { OfflineError } from '@/lib/api-errors';

/** Loading and error states for a query, with a retry; renders children only with data. */
export function QueryState<T>({
  query,
  children,
  empty,
}: {
  query: { isPending: boolean; error: unknown; data: T | undefined; refetch: () => unknown };
  children: (data: T) => React.ReactNode;
  empty?: (data: T) => boolean;
}) {
  if (query.isPending) {
    return (
      <View style={styles.box}>
        <Spinner color={colors.base} />
      </View>
    );
  }
  if (query.error || query.data === undefined) {
    const offline = query.error instanceof OfflineError;
    return (
      <View style={styles.box} accessibilityRole="alert">
        <Text>
          {offline ? 'No connection, and nothing saved for this view yet.' : 'This could not be loaded.'}
        </Text>
        <Button label="Try again" tone="quiet" onPress={() => query.refetch()} />
      </View>
    );
  }
  if (empty?.(query.data)) {
    return (
      <View style={styles.box}>
        <Text muted>Nothing here yet.</Text>
      </View>
    );
  }
  return <>{children(query.data)}</>;
}

const styles = StyleSheet.create({ box: { padding: space.xl, alignItems: 'center', gap: space.md } });
