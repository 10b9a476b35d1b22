/**
 * The shipped IBM Plex fonts for the server's PDFs (the notice and the inspection report); nothing else is
 * embedded.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';

import { repoRoot } from '@/server/paths';

export const fontDir = path.join(repoRoot, 'fonts');
export const FONT_FILES = {
  regular: 'IBMPlexSans_400Regular.ttf',
  semibold: 'IBMPlexSans_600SemiBold.ttf',
  bold: 'IBMPlexSans_700Bold.ttf',
  mono: 'IBMPlexMono_500Medium.ttf',
} as const;
export type FontName = keyof typeof FONT_FILES;

let fontData: Record<FontName, Buffer> | undefined;

/**
 * The font files, each followed by a few zero bytes. The shipped Mono keeps its empty glyphs (the space
 * among them) at the very end of its glyf table, which ends the file; fontkit reads a 10-byte glyph
 * header even for an empty glyph and fails there ("Offset is outside the bounds of the DataView"). The
 * padding gives that read zeros; it lies past every table, so nothing embedded changes.
 */
export function fonts(): Record<FontName, Buffer> {
  fontData ??= Object.fromEntries(
    Object.entries(FONT_FILES).map(([name, file]) => [
      name,
      Buffer.concat([readFileSync(path.join(fontDir, file)), Buffer.alloc(16)]),
    ]),
  ) as Record<FontName, Buffer>;
  return fontData;
}
