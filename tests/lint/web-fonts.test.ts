/**
 * The web fonts (fonts/web/*.woff2, built by scripts/build-fonts.ts) against the files they come from:
 * IBM Plex's TTF faces in fonts/ and the Feather icon font shipped in @expo/vector-icons. Read with fontkit
 * (an independent OpenType/WOFF2 reader, not the HarfBuzz that wrote them). A failure here after changing
 * a string or an icon means: run `npx tsx scripts/build-fonts.ts` and commit what it writes.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';

import { openSync } from 'fontkit';

import { glyphTableOut, glyphTableSource, iconFontOut, webFaces } from '@/scripts/build-fonts';
import {
  featherFontPath,
  featherGlyphMap,
  neededCodePoints,
  repoRoot,
  sourceCharacters,
  usedIconNames,
} from '@/scripts/font-usage';

type Glyph = { id: number; advanceWidth: number; path: { toSVG(): string } };
type Font = {
  familyName: string;
  postscriptName: string;
  characterSet: number[];
  unitsPerEm: number;
  ascent: number;
  descent: number;
  lineGap: number;
  name: { records: Record<string, Record<string, string>> };
  type: string;
  hmtx: { metrics: { length: number; get(id: number): { advance: number } } };
  loca?: { offsets: number[] };
  hasGlyphForCodePoint(cp: number): boolean;
  glyphForCodePoint(cp: number): Glyph;
  layout(text: string): {
    glyphs: Glyph[];
    positions: { xAdvance: number; xOffset: number; yOffset: number }[];
  };
};

const open = (path: string) => openSync(join(repoRoot, path)) as unknown as Font;

// Parsing every source file once is the slow part; share it between the tests.
const needed = neededCodePoints();
const icons = usedIconNames();
/** The mapped code points, less the 0xFFFF end marker that a format-4 cmap must have (OpenType, cmap). */
const mapped = (font: Font) => font.characterSet.filter((cp) => cp !== 0xffff);
/**
 * A character's advance (read from hmtx) and outline. An empty glyph stored last in glyf (Plex Mono's space)
 * makes fontkit read past the table, so a glyph whose loca range is empty is drawn as nothing directly.
 */
function drawn(font: Font, cp: number): [number, string] {
  const glyph = font.glyphForCodePoint(cp);
  // Past numberOfHMetrics, a glyph takes the last advance listed (OpenType spec, hmtx).
  const metrics = font.hmtx.metrics;
  const advance = metrics.get(Math.min(glyph.id, metrics.length - 1)).advance;
  // WOFF2 stores glyf and loca transformed; its loca as read is not offsets into glyf.
  const offsets = font.type === 'TTF' ? font.loca?.offsets : undefined;
  const empty = offsets !== undefined && offsets[glyph.id] === offsets[glyph.id + 1];
  return [advance, empty ? '' : glyph.path.toSVG()];
}
const hex = (cp: number) => `U+${cp.toString(16).toUpperCase().padStart(4, '0')}`;

describe.each(webFaces)('$out', (face) => {
  const original = open(face.source);
  const subset = open(face.out);

  it('maps exactly the characters the app needs that the TTF has', () => {
    const want = needed.filter((cp) => original.hasGlyphForCodePoint(cp));
    const missing = want.filter((cp) => !subset.hasGlyphForCodePoint(cp));
    const extra = mapped(subset).filter((cp) => !want.includes(cp));
    expect({ missing: missing.map(hex), extra: extra.map(hex) }).toEqual({ missing: [], extra: [] });
    // Latin Extended-A (people's names) is in IBM Plex, so it must have come through whole.
    for (let cp = 0x100; cp <= 0x17f; cp++) expect(subset.hasGlyphForCodePoint(cp)).toBe(true);
  });

  it('keeps the TTF metrics and outlines, so text sets the same once the face has loaded', () => {
    for (const key of ['unitsPerEm', 'ascent', 'descent', 'lineGap'] as const) {
      expect(subset[key]).toBe(original[key]);
    }
    for (const cp of mapped(subset))
      expect([hex(cp), ...drawn(subset, cp)]).toEqual([hex(cp), ...drawn(original, cp)]);
  });

  it('keeps kerning and ligatures: every pair of letters, digits and common signs lays out the same', () => {
    const chars = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789.,-–—’“”()/·×°';
    const words = [...[...chars].flatMap((a) => [...chars].map((b) => a + b)), 'fi', 'fl', 'ffi', 'ffl'];
    // Word by word: fontkit fails on one long run of the original Plex Mono TTF, never on a short one.
    const positions = (font: Font) =>
      words.map((w) => font.layout(w).positions.map((p) => [p.xAdvance, p.xOffset, p.yOffset].join(',')));
    expect(positions(subset)).toEqual(positions(original));
  });

  it('does not carry the Reserved Font Name "Plex" as its name, and keeps the copyright and licence', () => {
    // SIL OFL 1.1, condition 3: a Modified Version may not use a Reserved Font Name (fonts/OFL.txt).
    expect(subset.familyName).not.toMatch(/plex/i);
    expect(subset.postscriptName).not.toMatch(/plex/i);
    expect(subset.name.records.copyright.en).toBe(original.name.records.copyright.en);
    expect(subset.name.records.license.en).toMatch(/SIL Open Font License, Version 1\.1/);
  });
});

describe('text the app shows', () => {
  it('finds the characters of source strings (a check that the scan reads strings, not comments)', () => {
    const found = sourceCharacters();
    // Strings known to be on screens: the middle dot of "Returned · correction sent", the right single
    // quote of possessives, the ≤ of pin limits.
    expect(found.get('·')).toEqual(expect.arrayContaining(['features/inspections/sent-inspections.tsx']));
    expect(found.has('’')).toBe(true);
    expect(found.has('≤')).toBe(true);
    // Box-drawing characters appear only in comments (DEVELOPERS.md-style pictures), never on screen.
    expect(found.has('│')).toBe(false);
  });
});

describe(iconFontOut, () => {
  const original = open(featherFontPath.slice(repoRoot.length + 1));
  const subset = open(iconFontOut);
  const upstream = featherGlyphMap();

  it('holds the committed glyph table, which is the icons the sources draw', () => {
    const committed = readFileSync(join(repoRoot, glyphTableOut), 'utf8');
    expect(committed).toBe(glyphTableSource([...icons.keys()]));
    // Icons every signed-in page draws (the shell's tab bar), so a scan that found nothing would fail.
    expect([...icons.keys()]).toEqual(expect.arrayContaining(['sun', 'inbox', 'list', 'file-text', 'user']));
  });

  it('has each used icon drawn exactly as the full Feather font draws it, and no other', () => {
    const codes = [...icons.keys()].map((name) => upstream[name]);
    expect(mapped(subset).sort()).toEqual([...codes].sort());
    for (const [name] of icons) {
      const cp = upstream[name];
      expect([name, ...drawn(subset, cp)]).toEqual([name, ...drawn(original, cp)]);
    }
  });
});
