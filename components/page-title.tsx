import { StyleSheet, View } from 'react-native';

import { HeadingTitle } from '@/components/route-title';
import { Text } from '@/components/text';
import { space } from '@/components/theme';
import { useWide } from '@/components/use-wide';

type Props = {
  title: string;
  subtitle?: string;
  /** Beside the title on a desktop, under it on a phone. */
  badge?: React.ReactNode;
  actions?: React.ReactNode;
};

/**
 * A page's title block (Screen, SubScreen): the page's one heading, and its actions beside it on a desktop.
 * It also names the browser tab after the heading's object (components/route-title.tsx).
 */
export function PageTitle({ title, subtitle, badge, actions }: Props) {
  const wide = useWide();
  return (
    <View style={[styles.header, wide && styles.headerWide]}>
      <HeadingTitle title={title} subtitle={subtitle} />
      <View style={styles.titles}>
        <View style={styles.titleRow}>
          {/* An h1 on the web, a header to native screen readers. */}
          <Text variant={wide ? 'display' : 'title'} accessibilityRole="header" aria-level={1}>
            {title}
          </Text>
          {badge}
        </View>
        {subtitle ? <Text muted>{subtitle}</Text> : null}
      </View>
      {actions ? <View style={styles.actions}>{actions}</View> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  header: { gap: space.md },
  headerWide: { flexDirection: 'row', alignItems: 'flex-end', justifyContent: 'space-between' },
  titles: { gap: space.xs, flexShrink: 1 },
  titleRow: { flexDirection: 'row', alignItems: 'center', flexWrap: 'wrap', gap: space.md },
  actions: { flexDirection: 'row', gap: space.sm, flexWrap: 'wrap' },
});
