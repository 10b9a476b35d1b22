import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Text } from '@/components/text';
import { space } from '@/components/theme';

/** "21–40 of 57" with previous and next; pages count from 1 as the API's do. */
export function Pager({
  page,
  pageSize,
  total,
  onPage,
  noun = 'rows',
}: {
  page: number;
  pageSize: number;
  total: number;
  onPage: (page: number) => void;
  noun?: string;
}) {
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const first = total === 0 ? 0 : (page - 1) * pageSize + 1;
  const last = Math.min(total, page * pageSize);
  return (
    <View style={styles.row} role="navigation" accessibilityLabel="Pages">
      <Text variant="figure" muted accessibilityLiveRegion="polite">
        {total === 0 ? `No ${noun}` : `${first}–${last} of ${total} ${noun}`}
      </Text>
      <View style={styles.buttons}>
        <Button label="Previous" tone="quiet" disabled={page <= 1} onPress={() => onPage(page - 1)} />
        <Text variant="figure" muted>
          {page} / {pages}
        </Text>
        <Button label="Next" tone="quiet" disabled={page >= pages} onPress={() => onPage(page + 1)} />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  row: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: space.md,
  },
  buttons: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
});
