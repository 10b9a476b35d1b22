/**
 * What the web fonts must hold: every character the app's source strings use, the ranges people's names
 * and everyday punctuation need, and every icon name the screens draw. `scripts/build-fonts.ts` subsets
 * the fonts from this, and `tests/lint/web-fonts.test.ts` checks the committed subsets against it, so a
 * new string or icon cannot ship with a character or glyph the web font lacks.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';

import ts from 'typescript';

export const repoRoot = join(__dirname, '..');

/** Where text shown in the app comes from: the app itself, and the server's error messages and demo data. */
const textRoots = ['app', 'features', 'components', 'lib', 'server'];
/** Where icons are drawn (`lib/` cannot import the icon component; its `icon` fields are mark shapes). */
const iconRoots = ['app', 'features', 'components'];

/**
 * Code points every web font keeps whatever the sources say: printable ASCII, Latin-1 Supplement and
 * Latin Extended-A (people's and places' names typed by users), and the general punctuation and signs that
 * browsers' number and date formatting or pasted text commonly bring (dashes, quotes, primes for feet and
 * inches, the narrow no-break space some locales put before AM/PM, the minus sign, the euro).
 */
export const baseRanges: readonly (readonly [number, number])[] = [
  [0x20, 0x7e],
  [0xa0, 0xff],
  [0x100, 0x17f],
  // The Greek alphabet: the app writes Δ, γ, σ, τ and Ω, and FreeType's auto-hinter (Chromium on Linux)
  // sets Greek glyphs against zones measured on other Greek letters (ο, Ο, θ …): without those they hint
  // a shade differently from the full font.
  [0x391, 0x3a1],
  [0x3a3, 0x3a9],
  [0x3b1, 0x3c9],
  [0x2010, 0x2027],
  [0x202f, 0x2030],
  [0x2032, 0x2033],
  [0x2039, 0x203a],
  [0x2044, 0x2044],
  [0x20ac, 0x20ac],
  [0x2212, 0x2212],
  // The Latin ligatures' own code points (ﬀ ﬁ ﬂ ﬃ ﬄ ﬅ ﬆ). Text never uses them, but with them in the cmap
  // FreeType's auto-hinter (Chromium on Linux) counts the "fi"-style ligature glyphs as Latin and hints them
  // as it does in the full font; without them the ligatures render a shade differently.
  [0xfb00, 0xfb06],
];

function sourceFiles(roots: readonly string[]): string[] {
  const out: string[] = [];
  const walk = (dir: string) => {
    for (const entry of readdirSync(dir, { withFileTypes: true })) {
      const path = join(dir, entry.name);
      if (entry.isDirectory()) walk(path);
      else if (/\.tsx?$/.test(entry.name) && !entry.name.endsWith('.d.ts')) out.push(path);
    }
  };
  for (const root of roots) walk(join(repoRoot, root));
  return out.sort();
}

function parse(path: string): ts.SourceFile {
  const kind = path.endsWith('.tsx') ? ts.ScriptKind.TSX : ts.ScriptKind.TS;
  return ts.createSourceFile(path, readFileSync(path, 'utf8'), ts.ScriptTarget.Latest, true, kind);
}

/** The text of a string, template piece or JSX text node; comments and identifiers are not text. */
function literalText(node: ts.Node): string | undefined {
  if (
    ts.isStringLiteral(node) ||
    ts.isNoSubstitutionTemplateLiteral(node) ||
    ts.isTemplateHead(node) ||
    ts.isTemplateMiddle(node) ||
    ts.isTemplateTail(node) ||
    ts.isJsxText(node)
  ) {
    return node.text;
  }
  return undefined;
}

/** Each character outside printable ASCII found in a source string, with the files that use it. */
export function sourceCharacters(): Map<string, string[]> {
  const found = new Map<string, string[]>();
  for (const path of sourceFiles(textRoots)) {
    const file = relative(repoRoot, path);
    const visit = (node: ts.Node) => {
      const text = literalText(node);
      for (const ch of text ?? '') {
        if (ch.codePointAt(0)! <= 0x7e) continue;
        const files = found.get(ch) ?? [];
        if (!files.includes(file)) files.push(file);
        found.set(ch, files);
      }
      ts.forEachChild(node, visit);
    };
    visit(parse(path));
  }
  return found;
}

/** Every code point a web text font must keep, ascending. */
export function neededCodePoints(): number[] {
  const points = new Set<number>();
  for (const [from, to] of baseRanges) for (let cp = from; cp <= to; cp++) points.add(cp);
  for (const ch of sourceCharacters().keys()) points.add(ch.codePointAt(0)!);
  return [...points].sort((a, b) => a - b);
}

export const featherGlyphMapPath = join(
  repoRoot,
  'node_modules/@expo/vector-icons/build/vendor/react-native-vector-icons/glyphmaps/Feather.json',
);
export const featherFontPath = join(
  repoRoot,
  'node_modules/@expo/vector-icons/build/vendor/react-native-vector-icons/Fonts/Feather.ttf',
);

export function featherGlyphMap(): Record<string, number> {
  return JSON.parse(readFileSync(featherGlyphMapPath, 'utf8'));
}

const iconElement = 'Feather';
/** A type naming an icon: `FeatherName`, `IconName`, `ComponentProps<typeof Feather>['name']`. */
const iconType = /Feather|IconName/;

/**
 * Where an icon name is written: the `name` of a <Feather> element, any `icon` prop, an `icon` field of an
 * object or of a type (the status tables that pick an icon per state), a value declared or cast with the
 * icon name type. A name written anywhere else fails tsc, because the icon component's `name` type is the
 * generated list.
 */
function isIconSlot(node: ts.Node): boolean {
  if (ts.isJsxAttribute(node)) {
    const attr = node.name.getText();
    if (attr === 'icon') return true;
    const element = node.parent.parent;
    return (
      attr === 'name' && ts.isJsxOpeningLikeElement(element) && element.tagName.getText() === iconElement
    );
  }
  if (ts.isPropertyAssignment(node) || ts.isPropertySignature(node)) {
    return ts.isIdentifier(node.name) && node.name.text === 'icon';
  }
  const declared =
    ts.isVariableDeclaration(node) || ts.isAsExpression(node) || ts.isSatisfiesExpression(node)
      ? node.type
      : undefined;
  return declared !== undefined && iconType.test(declared.getText());
}

/** Every Feather icon name the sources draw, ascending, with the files that name it. */
export function usedIconNames(): Map<string, string[]> {
  const glyphs = featherGlyphMap();
  const found = new Map<string, string[]>();
  for (const path of sourceFiles(iconRoots)) {
    const file = relative(repoRoot, path);
    const visit = (node: ts.Node, inSlot: boolean) => {
      const slot = inSlot || isIconSlot(node);
      if (
        slot &&
        (ts.isStringLiteral(node) || ts.isNoSubstitutionTemplateLiteral(node)) &&
        node.text in glyphs
      ) {
        const files = found.get(node.text) ?? [];
        if (!files.includes(file)) files.push(file);
        found.set(node.text, files);
      }
      ts.forEachChild(node, (child) => visit(child, slot));
    };
    visit(parse(path), false);
  }
  return new Map([...found].sort(([a], [b]) => (a < b ? -1 : 1)));
}
