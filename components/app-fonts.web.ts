/**
 * The app's fonts in a browser: WOFF2 subsets built by `scripts/build-fonts.ts` (the characters and icons
 * the app uses), declared at once with `font-display: swap` so the first screen draws without waiting for
 * them and takes the faces when they land; their metrics are the TTF's, so the settled page is the same.
 * Icons use `block`: a missing icon glyph would show as a box, a blank is better for the moment it takes.
 */
import { FontDisplay, loadAsync, type FontSource } from 'expo-font';

import { fonts } from '@/components/theme';
import featherIcons from '@/fonts/web/feather-icons.woff2';
import mono500 from '@/fonts/web/mono-500.woff2';
import sans400 from '@/fonts/web/sans-400.woff2';
import sans600 from '@/fonts/web/sans-600.woff2';
import sans700 from '@/fonts/web/sans-700.woff2';

export const iconFontSource: number = featherIcons;

const faces: Record<string, FontSource> = {
  [fonts.regular]: { uri: sans400, display: FontDisplay.SWAP },
  [fonts.semibold]: { uri: sans600, display: FontDisplay.SWAP },
  [fonts.bold]: { uri: sans700, display: FontDisplay.SWAP },
  [fonts.mono]: { uri: mono500, display: FontDisplay.SWAP },
  feather: { uri: iconFontSource, display: FontDisplay.BLOCK },
};

let declared = false;

/** Always true: the @font-face rules go in on the first call, and text never waits for the files. */
export function useAppFonts(): boolean {
  if (!declared) {
    declared = true;
    // loadAsync writes the rules synchronously (so icons count the font as loaded from the first
    // render); its promise only reports the download, which a slow network may take past its timeout.
    loadAsync(faces).catch(() => undefined);
  }
  return true;
}
