import { Link, router, type Href } from 'expo-router';
import type { ReactNode, Ref } from 'react';
import { Pressable, StyleSheet, type StyleProp, type View, type ViewStyle } from 'react-native';

import { cardLook } from '@/components/card';

/**
 * Whether a click on a larger area (a card, a table row) has already been taken by a link inside it: a
 * link follows itself (and a ctrl- or middle-click on it opens a tab), so the area must not go there too.
 * Only the web has such clicks bubbling out of a link; on a phone the innermost pressable takes the touch.
 */
export function pressedOnLink(e?: { nativeEvent?: unknown; defaultPrevented?: boolean }): boolean {
  if (!e) return false;
  const native = e.nativeEvent as { defaultPrevented?: boolean; target?: unknown } | undefined;
  if (e.defaultPrevented || native?.defaultPrevented) return true;
  const target = native?.target as { closest?: (selector: string) => unknown } | undefined;
  return Boolean(target?.closest?.('a, [role="link"]'));
}

/**
 * A card that leads to a page. Its title is the link (one tab stop, named by its words or by `label`,
 * which must hold them: WCAG 2.5.3, label in name), and a click or tap anywhere else on the card follows it too.
 * The card itself is no control, so the words on it are read as text, not crammed into a link's name.
 * Place `title` where the card's layout wants it through `children(title)`.
 */
export function LinkCard({
  href,
  label,
  title,
  plain = false,
  style,
  linkRef,
  current = false,
  children,
}: {
  href: Href;
  /** The link's name when the title's words alone say too little; it must hold them. */
  label?: string;
  /** What the link shows: the card's title. */
  title: ReactNode;
  /** Without the card's frame (a row of a list drawn by `style`). */
  plain?: boolean;
  style?: StyleProp<ViewStyle>;
  /** The title link, to move the focus to it. */
  linkRef?: Ref<View>;
  /** The card a keyboard shortcut has moved to (aria-current on the card, as on a table row). */
  current?: boolean;
  /** The card's content, given the title link to place. */
  children: (titleLink: ReactNode) => ReactNode;
}) {
  const titleLink = (
    <Link href={href} asChild>
      <Pressable ref={linkRef} role="link" accessibilityLabel={label} style={styles.title}>
        {title}
      </Pressable>
    </Link>
  );
  return (
    <Pressable
      testID="link-card"
      aria-current={current ? 'true' : undefined}
      focusable={false}
      accessible={false}
      style={StyleSheet.flatten([plain ? null : cardLook, styles.card, style])}
      onPress={(e) => {
        if (!pressedOnLink(e)) router.push(href);
      }}
    >
      {children(titleLink)}
    </Pressable>
  );
}

const styles = StyleSheet.create({
  card: { cursor: 'pointer' },
  title: { alignSelf: 'flex-start', maxWidth: '100%' },
});
