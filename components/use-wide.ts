import { useWindowDimensions } from 'react-native';

import { layout } from '@/components/theme';

/** True on desktop-width windows, where the shell shows side navigation and wider layouts. */
export function useWide(): boolean {
  const { width } = useWindowDimensions();
  return width >= layout.wideBreakpoint;
}
