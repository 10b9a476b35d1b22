import { Pressable, StyleSheet } from 'react-native';

import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, layout, space } from '@/components/theme';

/** A "show / hide more" line under a section: the chevron and the words both say which way it goes. */
export function DisclosureToggle({
  open,
  onToggle,
  label,
}: {
  open: boolean;
  onToggle: () => void;
  /** The words for the current state, e.g. "Hide the numbers" when open. */
  label: string;
}) {
  return (
    <Pressable role="button" aria-expanded={open} onPress={onToggle} style={styles.toggle}>
      <Feather name={open ? 'chevron-up' : 'chevron-down'} size={18} color={colors.accent} />
      <Text variant="heading" color={colors.accent}>
        {label}
      </Text>
    </Pressable>
  );
}

const styles = StyleSheet.create({
  toggle: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    minHeight: layout.touchTarget,
    alignSelf: 'flex-start',
  },
});
