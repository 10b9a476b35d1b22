/**
 * The app's fonts on a phone: the full TTF files, loaded before the first screen draws (a native Text
 * laid out in the system font would not reflow when the face arrives). The web has its own loader
 * (`app-fonts.web.ts`): WOFF2 subsets that load beside the first screen.
 */
import Feather from '@expo/vector-icons/Feather';
import { useFonts } from 'expo-font';

import { fonts } from '@/components/theme';

export const iconFontSource: number = Feather.font.feather as number;

const fontFiles = {
  [fonts.regular]: require('@/fonts/IBMPlexSans_400Regular.ttf'),
  [fonts.semibold]: require('@/fonts/IBMPlexSans_600SemiBold.ttf'),
  [fonts.bold]: require('@/fonts/IBMPlexSans_700Bold.ttf'),
  [fonts.mono]: require('@/fonts/IBMPlexMono_500Medium.ttf'),
  feather: iconFontSource,
};

/** True once screens may draw: here, when every face has loaded (or failed, then the system font). */
export function useAppFonts(): boolean {
  const [loaded, error] = useFonts(fontFiles);
  return loaded || error !== null;
}

/** Nothing left to load on a phone: every face loaded before the first screen (see app-fonts.web.ts). */
export function loadSignedInFonts(): void {}
