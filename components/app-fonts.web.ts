/**
 * The app's fonts in a browser: WOFF2 subsets built by `scripts/build-fonts.ts` (the characters and icons
 * the app uses), declared with `font-display: swap` so the first screen draws without waiting for them and
 * takes the faces when they land; their metrics are the TTF's, so the settled page is the same.
 * Icons use `block`: a missing icon glyph would show as a box, a blank is better for the moment it takes.
 *
 * expo-font's `loadAsync` fetches every face it declares at once, drawn or not. So only the faces the
 * pages before sign-in draw (the sans: sign-in, set-password) are declared as the app starts; the figures'
 * mono face and the icons are declared, and so fetched, once someone is signed in (`loadSignedInFonts`,
 * from features/shell/lazy-screens.ts), alongside the signed-in frame's code.
 */
import { FontDisplay, loadAsync, type FontSource } from 'expo-font';

import { fonts } from '@/components/theme';
import featherIcons from '@/fonts/web/feather-icons.woff2';
import mono500 from '@/fonts/web/mono-500.woff2';
import sans400 from '@/fonts/web/sans-400.woff2';
import sans600 from '@/fonts/web/sans-600.woff2';
import sans700 from '@/fonts/web/sans-700.woff2';

export const iconFontSource: number = featherIcons;

/** Drawn before sign-in. */
const firstFaces: Record<string, FontSource> = {
  [fonts.regular]: { uri: sans400, display: FontDisplay.SWAP },
  [fonts.semibold]: { uri: sans600, display: FontDisplay.SWAP },
  [fonts.bold]: { uri: sans700, display: FontDisplay.SWAP },
};

/** Drawn only by signed-in pages: figures and icons. */
const signedInFaces: Record<string, FontSource> = {
  [fonts.mono]: { uri: mono500, display: FontDisplay.SWAP },
  feather: { uri: iconFontSource, display: FontDisplay.BLOCK },
};

/** Writes the faces' @font-face rules and fetches the files (its promise reports only the download). */
function declare(faces: Record<string, FontSource>): void {
  // loadAsync writes the rules synchronously (so icons count the font as loaded from the first render);
  // its promise only reports the download, which a slow network may take past its timeout.
  loadAsync(faces).catch(() => undefined);
}

let declared = false;

/** Always true: the first faces' @font-face rules go in on the first call; text never waits for the files. */
export function useAppFonts(): boolean {
  if (!declared) {
    declared = true;
    declare(firstFaces);
  }
  return true;
}

let signedInDeclared = false;

/** The signed-in pages' faces: declared (and fetched) once, as the signed-in frame starts loading. */
export function loadSignedInFonts(): void {
  if (signedInDeclared) return;
  signedInDeclared = true;
  declare(signedInFaces);
}
