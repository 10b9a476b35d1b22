/** Styles more than one part of the panel uses. */
import { StyleSheet } from 'react-native';

import { colors, radius, space } from '@/components/theme';

export const sharedStyles = StyleSheet.create({
  section: { gap: space.md },
  problem: {
    gap: space.sm,
    padding: space.md,
    borderRadius: radius.sm,
    backgroundColor: colors.overSoft,
  },
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
