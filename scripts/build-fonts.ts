/**
 * Builds the web app's fonts: WOFF2 subsets of the four IBM Plex faces in use (to the characters
 * `scripts/font-usage.ts` finds) and of the Feather icon font (to the icons the screens draw), plus the icon
 * component's glyph table `components/feather-glyphs.generated.ts`. Native builds keep the full TTF files.
 *
 *   npx tsx scripts/build-fonts.ts          write fonts/web/*.woff2 and the glyph table, print the sizes
 *   npx tsx scripts/build-fonts.ts --check  exit 1 if the glyph table is stale (the fonts are checked by
 *                                           tests/lint/web-fonts.test.ts, which reads their character maps)
 *
 * Subsetting is HarfBuzz's hb-subset (the `subset-font` package); hinting is kept, so glyphs render as the
 * TTF did. A subset is a Modified Version under the SIL OFL and the Plex faces carry the Reserved Font Name
 * "Plex", so the subsets' name tables call them "Pivotwatch Sans"/"Pivotwatch Mono" and keep IBM's
 * copyright, trademark and licence records (fonts/OFL.txt, section 3 of the licence).
 */
import { readFileSync, statSync, writeFileSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';

import subsetFont from 'subset-font';

import {
  featherFontPath,
  featherGlyphMap,
  neededCodePoints,
  repoRoot,
  usedIconNames,
} from '@/scripts/font-usage';

/**
 * Layout features kept: those HarfBuzz (as in Chromium) applies to left-to-right Latin and Greek text by
 * itself, and those FreeType's auto-hinter reads to sort glyphs into styles (superscripts, ordinals, small
 * capitals …; afstyles.h), so each glyph hints as in the full font. Stylistic sets and alternates go.
 */
const keptFeatures = [
  ...['abvm', 'blwm', 'ccmp', 'locl', 'mark', 'mkmk', 'rlig', 'rvrn', 'ltra', 'ltrm'],
  ...['calt', 'clig', 'curs', 'dist', 'kern', 'liga', 'rclt', 'frac', 'numr', 'dnom'],
  ...['c2cp', 'c2sc', 'ordn', 'pcap', 'sinf', 'smcp', 'subs', 'sups', 'titl'],
];

export type WebFace = { source: string; out: string; family: string; style: string };

export const webFaces: readonly WebFace[] = [
  {
    source: 'fonts/IBMPlexSans_400Regular.ttf',
    out: 'fonts/web/sans-400.woff2',
    family: 'Sans',
    style: 'Regular',
  },
  {
    source: 'fonts/IBMPlexSans_600SemiBold.ttf',
    out: 'fonts/web/sans-600.woff2',
    family: 'Sans',
    style: 'SemiBold',
  },
  { source: 'fonts/IBMPlexSans_700Bold.ttf', out: 'fonts/web/sans-700.woff2', family: 'Sans', style: 'Bold' },
  {
    source: 'fonts/IBMPlexMono_500Medium.ttf',
    out: 'fonts/web/mono-500.woff2',
    family: 'Mono',
    style: 'Medium',
  },
];

export const iconFontOut = 'fonts/web/feather-icons.woff2';
export const glyphTableOut = 'components/feather-glyphs.generated.ts';

// --- the name table ---------------------------------------------------------------------------------

type NameRecord = { id: number; text: string };

/** Reads the Windows Unicode English (3/1/0x409) records of a `name` table. */
function readNames(table: Buffer): NameRecord[] {
  const count = table.readUInt16BE(2);
  const strings = table.readUInt16BE(4);
  const out: NameRecord[] = [];
  for (let i = 0; i < count; i++) {
    const at = 6 + i * 12;
    const [platform, encoding, language, id, length, offset] = [0, 2, 4, 6, 8, 10].map((d) =>
      table.readUInt16BE(at + d),
    );
    if (platform !== 3 || encoding !== 1 || language !== 0x409) continue;
    const bytes = Buffer.from(table.subarray(strings + offset, strings + offset + length));
    out.push({ id, text: bytes.swap16().toString('utf16le') });
  }
  return out;
}

/** A format-0 `name` table holding the given records as Windows Unicode English. */
function writeNames(records: NameRecord[]): Buffer {
  const sorted = [...records].sort((a, b) => a.id - b.id);
  const strings = sorted.map((r) => Buffer.from(r.text, 'utf16le').swap16());
  const header = Buffer.alloc(6 + sorted.length * 12);
  header.writeUInt16BE(0, 0);
  header.writeUInt16BE(sorted.length, 2);
  header.writeUInt16BE(header.length, 4);
  let offset = 0;
  sorted.forEach((r, i) => {
    const at = 6 + i * 12;
    [3, 1, 0x409, r.id, strings[i].length, offset].forEach((v, k) => header.writeUInt16BE(v, at + k * 2));
    offset += strings[i].length;
  });
  return Buffer.concat([header, ...strings]);
}

/** The subset's own names: the family renamed (Reserved Font Name), IBM's notices and licence kept. */
function subsetNames(original: NameRecord[], face: WebFace): NameRecord[] {
  const keep = (id: number) => original.find((r) => r.id === id)?.text;
  const family = `Pivotwatch ${face.family}`;
  const postscript = `Pivotwatch${face.family}-${face.style}`;
  const records: NameRecord[] = [
    { id: 1, text: face.style === 'Regular' ? family : `${family} ${face.style}` },
    { id: 2, text: 'Regular' },
    { id: 3, text: `${keep(5) ?? 'Version 1'};${postscript}` },
    { id: 4, text: `${family} ${face.style}` },
    { id: 6, text: postscript },
    { id: 10, text: `A subset of ${keep(4) ?? 'IBM Plex'} for the Pivotwatch web app.` },
    { id: 16, text: family },
    { id: 17, text: face.style },
  ];
  for (const id of [0, 5, 7, 8, 9, 11, 12, 13, 14]) {
    const text = keep(id);
    if (text) records.push({ id, text });
  }
  return records;
}

// --- the sfnt container -----------------------------------------------------------------------------

function checksum(data: Buffer): number {
  const padded = Buffer.concat([data, Buffer.alloc((4 - (data.length % 4)) % 4)]);
  let sum = 0;
  for (let i = 0; i < padded.length; i += 4) sum = (sum + padded.readUInt32BE(i)) >>> 0;
  return sum;
}

/** The font with one table replaced, its directory, checksums and `head.checkSumAdjustment` redone. */
function replaceTable(font: Buffer, tag: string, data: Buffer): Buffer {
  const count = font.readUInt16BE(4);
  const tables = new Map<string, Buffer>();
  for (let i = 0; i < count; i++) {
    const at = 12 + i * 16;
    const t = font.toString('latin1', at, at + 4);
    const offset = font.readUInt32BE(at + 8);
    tables.set(t, Buffer.from(font.subarray(offset, offset + font.readUInt32BE(at + 12))));
  }
  tables.set(tag, data);
  const head = tables.get('head')!;
  head.writeUInt32BE(0, 8);
  const tags = [...tables.keys()].sort();
  const directory = Buffer.alloc(12 + tags.length * 16);
  font.copy(directory, 0, 0, 12);
  directory.writeUInt16BE(tags.length, 4);
  const bodies: Buffer[] = [];
  let offset = directory.length;
  tags.forEach((t, i) => {
    const body = tables.get(t)!;
    const at = 12 + i * 16;
    directory.write(t, at, 'latin1');
    directory.writeUInt32BE(checksum(body), at + 4);
    directory.writeUInt32BE(offset, at + 8);
    directory.writeUInt32BE(body.length, at + 12);
    const padded = Buffer.concat([body, Buffer.alloc((4 - (body.length % 4)) % 4)]);
    bodies.push(padded);
    offset += padded.length;
  });
  const out = Buffer.concat([directory, ...bodies]);
  const headAt = directory.length + bodies.slice(0, tags.indexOf('head')).reduce((n, b) => n + b.length, 0);
  out.writeUInt32BE((0xb1b0afba - checksum(out)) >>> 0, headAt + 8);
  return out;
}

function tableOf(font: Buffer, tag: string): Buffer {
  for (let i = 0; i < font.readUInt16BE(4); i++) {
    const at = 12 + i * 16;
    if (font.toString('latin1', at, at + 4) !== tag) continue;
    const offset = font.readUInt32BE(at + 8);
    return font.subarray(offset, offset + font.readUInt32BE(at + 12));
  }
  throw new Error(`no ${tag} table`);
}

// --- building ---------------------------------------------------------------------------------------

export async function buildTextFace(face: WebFace, text: string): Promise<Buffer> {
  const ttf = readFileSync(join(repoRoot, face.source));
  // Renamed before subsetting, so one hb-subset pass writes the WOFF2. STAT names the faces of a family for
  // font menus with names the new table no longer holds; a web font needs none of it.
  const renamed = replaceTable(ttf, 'name', writeNames(subsetNames(readNames(tableOf(ttf, 'name')), face)));
  return subsetFont(renamed, text, {
    targetFormat: 'woff2',
    keepFeatures: keptFeatures,
    dropTables: ['STAT'],
    preserveNameIds: [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14, 16, 17],
  });
}

export async function buildIconFont(names: string[]): Promise<Buffer> {
  const glyphs = featherGlyphMap();
  const text = names.map((n) => String.fromCodePoint(glyphs[n])).join('');
  return subsetFont(readFileSync(featherFontPath), text, { targetFormat: 'woff2' });
}

/** The glyph table as prettier writes it (quotes only on names that are not identifiers). */
export function glyphTableSource(names: string[]): string {
  const glyphs = featherGlyphMap();
  const key = (n: string) => (/^[A-Za-z_$][\w$]*$/.test(n) ? n : `'${n}'`);
  return [
    '// Generated by scripts/build-fonts.ts from the icons the screens draw; do not edit. A new icon name',
    '// fails tsc until the script is run again (it then lands in this table and in the web icon font).',
    'export const featherGlyphs = {',
    ...names.map((n) => `  ${key(n)}: ${glyphs[n]},`),
    '} as const;',
    '',
  ].join('\n');
}

async function main() {
  const icons = [...usedIconNames().keys()];
  const table = glyphTableSource(icons);
  const tablePath = join(repoRoot, glyphTableOut);
  if (process.argv.includes('--check')) {
    const stale = readFileSync(tablePath, 'utf8') !== table;
    console.log(
      stale ? `${glyphTableOut} is stale: run npx tsx scripts/build-fonts.ts` : 'glyph table up to date',
    );
    process.exit(stale ? 1 : 0);
  }
  mkdirSync(join(repoRoot, 'fonts/web'), { recursive: true });
  const text = String.fromCodePoint(...neededCodePoints());
  const row = (label: string, before: number, after: number) =>
    console.log(`${label.padEnd(34)} ${String(before).padStart(8)} B  →  ${String(after).padStart(7)} B`);
  for (const face of webFaces) {
    const woff2 = await buildTextFace(face, text);
    writeFileSync(join(repoRoot, face.out), woff2);
    row(`${face.source} → ${face.out.slice(6)}`, statSync(join(repoRoot, face.source)).size, woff2.length);
  }
  const iconFont = await buildIconFont(icons);
  writeFileSync(join(repoRoot, iconFontOut), iconFont);
  row(
    `Feather.ttf → ${iconFontOut.slice(6)} (${icons.length})`,
    statSync(featherFontPath).size,
    iconFont.length,
  );
  writeFileSync(tablePath, table);
}

if (require.main === module) {
  main().catch((err) => {
    console.error(err);
    process.exit(1);
  });
}
