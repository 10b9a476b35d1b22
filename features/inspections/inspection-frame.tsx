import { forwardRef } from 'react';
import { ScrollView, StyleSheet, View } from 'react-native';

import { PageTitle } from '@/components/page-title';
import { colors, layout, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';

/**
 * The recording screen's page: its title and content scroll; the undo message and the action bar stay
 * under them, on screen at every scroll position (at phone width, where the thumb rests).
 */
export const InspectionFrame = forwardRef<
  ScrollView,
  {
    title: string;
    subtitle?: string;
    children: React.ReactNode;
    /** Shown just above the bar while a removal can be undone. */
    snackbar?: React.ReactNode;
    bar: React.ReactNode;
  }
>(function InspectionFrame({ title, subtitle, children, snackbar, bar }, ref) {
  const wide = useWide();
  return (
    <View style={styles.root}>
      <ScrollView
        ref={ref}
        style={styles.scroll}
        contentContainerStyle={[styles.content, wide && styles.contentWide]}
        keyboardShouldPersistTaps="handled"
      >
        <View style={styles.inner}>
          <PageTitle title={title} subtitle={subtitle} />
          {children}
        </View>
      </ScrollView>
      {snackbar}
      {bar}
    </View>
  );
});

const styles = StyleSheet.create({
  root: { flex: 1, backgroundColor: colors.bg },
  scroll: { flex: 1 },
  content: { padding: space.lg, paddingBottom: space.xxl },
  contentWide: { padding: space.xxl },
  inner: { width: '100%', maxWidth: layout.maxContentWidth, alignSelf: 'center', gap: space.lg },
});
