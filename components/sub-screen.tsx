import { type Href } from 'expo-router';
import { ScrollView, StyleSheet, View } from 'react-native';

import { BackLink } from '@/components/back-link';
import { PageTitle } from '@/components/page-title';
import { colors, layout, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';

type Props = {
  title: string;
  subtitle?: string;
  /** Where "back" goes, shown above the title (the web shell has no stack header). */
  back?: { href: Href; label: string };
  /** Beside the title on a desktop, under it on a phone. */
  badge?: React.ReactNode;
  actions?: React.ReactNode;
  /** Desktop screens that hold wide tables may use the full width. */
  wideContent?: boolean;
  children: React.ReactNode;
};

/** A page one level down from a navigation item: a way back, the title block, and scrolling content. */
export function SubScreen({ title, subtitle, back, badge, actions, wideContent, children }: Props) {
  const wide = useWide();
  return (
    <ScrollView style={styles.scroll} contentContainerStyle={[styles.content, wide && styles.contentWide]}>
      <View style={[styles.inner, wideContent && wide ? styles.innerFull : null]}>
        {back ? <BackLink href={back.href} label={back.label} /> : null}
        <PageTitle title={title} subtitle={subtitle} badge={badge} actions={actions} />
        {children}
      </View>
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  scroll: { flex: 1, backgroundColor: colors.bg },
  content: { padding: space.lg, paddingBottom: space.xxl },
  contentWide: { padding: space.xxl, paddingTop: space.xl },
  inner: { width: '100%', maxWidth: layout.maxContentWidth, alignSelf: 'center', gap: space.lg },
  innerFull: { maxWidth: 1600 },
});
