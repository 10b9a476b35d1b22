import { StyleSheet, View, type ViewProps } from 'react-native';

import { colors, radius, space } from '@/components/theme';

export function Card({ style, ...rest }: ViewProps) {
  return <View style={[styles.card, style]} {...rest} />;
}

const styles = StyleSheet.create({
  card: {
    backgroundColor: colors.surface,
    borderRadius: radius.lg,
    borderWidth: 1,
    borderColor: colors.border,
    padding: space.lg,
    gap: space.sm,
  },
});

/** The card's look for a pressable that must read as a card (a Card is a View and takes no pressed state). */
export const cardLook = styles.card;
