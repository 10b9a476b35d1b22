import { ActivityIndicator } from 'react-native';

import { colors } from '@/components/theme';

/**
 * A wait without a measure, named for assistive technology ("Loading" unless it says what for): an
 * unnamed progress bar is only "progress bar" to a screen reader (WCAG 4.1.2). `testID` marks it as a
 * spinner on the web (`data-testid`), so a check can tell it from a progress bar with a measure.
 */
export function Spinner({
  label = 'Loading',
  color = colors.base,
  size,
}: {
  label?: string;
  color?: string;
  size?: 'small' | 'large';
}) {
  return <ActivityIndicator testID="spinner" accessibilityLabel={label} color={color} size={size} />;
}
