import { ScrollView, StyleSheet, View } from 'react-native';

import { PageTitle } from '@/components/page-title';
import { Text } from '@/components/text';
import { colors, layout, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';

type Props = {
  title: string;
  subtitle?: string;
  actions?: React.ReactNode;
  children: React.ReactNode;
};

/** A page: title block and scrolling content, centred up to the maximum content width. */
export function Screen({ title, subtitle, actions, children }: Props) {
  const wide = useWide();
  return (
    <ScrollView style={styles.scroll} contentContainerStyle={[styles.content, wide && styles.contentWide]}>
      <View style={styles.inner}>
        <PageTitle title={title} subtitle={subtitle} actions={actions} />
        {children}
      </View>
    </ScrollView>
  );
}

/** Lays children in columns on desktop, stacked on a phone. */
export function Columns({ children }: { children: React.ReactNode }) {
  const wide = useWide();
  return <View style={wide ? styles.columns : styles.stack}>{children}</View>;
}

export function Column({ children, grow = 1 }: { children: React.ReactNode; grow?: number }) {
  const wide = useWide();
  // Side by side the columns share the row from a zero basis; stacked, a zero basis would give each a
  // height of nothing and let the next one draw over it.
  return <View style={wide ? [styles.column, { flexGrow: grow }] : styles.stacked}>{children}</View>;
}

export function SectionTitle({ children }: { children: string }) {
  return (
    <Text variant="label" muted style={styles.section} accessibilityRole="header">
      {children.toUpperCase()}
    </Text>
  );
}

const styles = StyleSheet.create({
  scroll: { flex: 1, backgroundColor: colors.bg },
  content: { padding: space.lg, paddingBottom: space.xxl },
  contentWide: { padding: space.xxl },
  inner: { width: '100%', maxWidth: layout.maxContentWidth, alignSelf: 'center', gap: space.lg },
  columns: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  stack: { gap: space.lg },
  column: { flexBasis: 0, gap: space.lg, minWidth: 0 },
  stacked: { gap: space.lg },
  section: { marginTop: space.sm },
});
