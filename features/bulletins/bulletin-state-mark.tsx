import { StyleSheet, View } from 'react-native';

import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import { type BulletinState, bulletinStateLabel } from '@/features/bulletins/schema';

/** A bulletin's state on a ride: a shape and words of its own for each, so colour is never the only signal. */
const look: Record<
  BulletinState,
  { icon: 'alert-octagon' | 'alert-triangle' | 'check-circle'; color: string }
> = {
  overdue: { icon: 'alert-octagon', color: colors.over },
  open: { icon: 'alert-triangle', color: colors.near },
  done: { icon: 'check-circle', color: colors.within },
};

export function BulletinStateMark({ state }: { state: BulletinState }) {
  const { icon, color } = look[state];
  return (
    <View style={[styles.mark, { borderColor: color }]}>
      <Feather name={icon} size={14} color={color} />
      <Text variant="label" color={color}>
        {bulletinStateLabel[state]}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  mark: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.xs,
    alignSelf: 'flex-start',
    borderWidth: 1.5,
    borderRadius: radius.md,
    paddingHorizontal: space.sm,
    paddingVertical: 2,
  },
});
