/**
 * The two palettes (lib/colors.ts) against WCAG 2.x: the W3C's definitions of "relative luminance" and
 * "contrast ratio" (https://www.w3.org/TR/WCAG22/#dfn-relative-luminance, #dfn-contrast-ratio) and
 * success criterion 1.4.3 Contrast (Minimum): 4.5:1 for normal text. The ratio is ours
 * (tests/support/contrast.ts) and is checked against the `color` npm package's `contrast()`, which
 * implements the same W3C definition (it comes with expo-router; read with jest.requireActual).
 */
import { contrastPairs } from '@/components/theme';
import { cssVarName, themeCss } from '@/components/theme-colors.web';
import { parseThemeChoice, resolveTheme } from '@/components/theme-resolve';
import {
  type ColorToken,
  type Palette,
  colors,
  contrastPairsOf,
  darkColors,
  palettes,
  textPairs,
} from '@/lib/colors';
import { markedVocabularies } from '@/lib/vocabulary';
import { contrast } from '@/tests/support/contrast';

type ColorLib = (hex: string) => { contrast(other: unknown): number; level(other: unknown): string };
const Color = jest.requireActual<ColorLib>('color');

test('the WCAG formula reproduces its known extremes (black on white is 21:1)', () => {
  expect(contrast('#000000', '#FFFFFF')).toBeCloseTo(21, 5);
  expect(contrast('#777777', '#FFFFFF')).toBeCloseTo(4.48, 2); // the well-known "#777 just fails AA" value
});

test.each(contrastPairs)('text %s on %s meets WCAG AA (4.5:1)', (fg, bg) => {
  expect(contrast(fg, bg)).toBeGreaterThanOrEqual(4.5);
});

const themes = Object.keys(palettes) as (keyof typeof palettes)[];

describe.each(themes)('the %s palette', (theme) => {
  const palette: Palette = palettes[theme];

  test.each(textPairs)('%s on %s meets WCAG AA (4.5:1), as the color package also finds', (fg, bg) => {
    const ratio = contrast(palette[fg], palette[bg]);
    expect(ratio).toBeGreaterThanOrEqual(4.5);
    // Same definition, independent code: equal to rounding, and the package's own verdict is AA or AAA.
    expect(Color(palette[fg]).contrast(Color(palette[bg]))).toBeCloseTo(ratio, 2);
    expect(['AA', 'AAA']).toContain(Color(palette[fg]).level(Color(palette[bg])));
  });

  // Every state's badge: its word colour on its badge colour, as components/mark-icon.tsx paints it.
  const marks = Object.entries(markedVocabularies).flatMap(([table, words]) =>
    Object.entries(words).map(([key, word]) => [`${table}.${key}`, word.mark.fg, word.mark.bg] as const),
  );
  test.each(marks)('the mark of %s (%s on %s) meets WCAG AA', (_name, fg, bg) => {
    expect(contrast(palette[fg], palette[bg])).toBeGreaterThanOrEqual(4.5);
  });

  test('every value is a #RRGGBB colour', () => {
    for (const value of Object.values(palette)) expect(value).toMatch(/^#[0-9A-F]{6}$/);
  });
});

test('the dark palette has exactly the light palette’s tokens', () => {
  expect(Object.keys(darkColors).sort()).toEqual(Object.keys(colors).sort());
});

test('contrastPairs (what the PDFs and e-mails use too) are the light palette’s text pairs', () => {
  expect(contrastPairs).toEqual(contrastPairsOf(colors));
  expect(contrastPairs).toHaveLength(textPairs.length);
});

test('in the light theme the frame tokens are the base tokens the frame used before: nothing changes', () => {
  const same: [ColorToken, ColorToken][] = [
    ['chrome', 'base'],
    ['chromeRaised', 'baseRaised'],
    ['chromeText', 'baseText'],
    ['chromeMuted', 'baseMuted'],
    ['chromeAccent', 'accentSoft'],
  ];
  for (const [frame, base] of same) expect(colors[frame]).toBe(colors[base]);
});

describe('the web theme sheet', () => {
  const css = themeCss();
  const block = (re: RegExp) => re.exec(css)?.[1] ?? '';
  const declared = (body: string, token: ColorToken) =>
    new RegExp(`${cssVarName(token)}:(#[0-9A-F]{6});`).exec(body)?.[1];

  test('custom property names are the tokens in kebab case', () => {
    expect(cssVarName('surfaceSunk')).toBe('--pw-surface-sunk');
    expect(cssVarName('bg')).toBe('--pw-bg');
  });

  test('light by default, dark under the system’s dark scheme unless chosen light, and dark when chosen', () => {
    const root = block(/^:root\{([^}]*)\}/m);
    const system = block(
      /@media \(prefers-color-scheme: dark\)\{:root:not\(\[data-theme="light"\]\)\{([^}]*)\}\}/,
    );
    const chosen = block(/:root\[data-theme="dark"\]\{([^}]*)\}/);
    for (const token of Object.keys(colors) as ColorToken[]) {
      expect(declared(root, token)).toBe(colors[token]);
      expect(declared(system, token)).toBe(darkColors[token]);
      expect(declared(chosen, token)).toBe(darkColors[token]);
    }
    expect(system).toContain('color-scheme:dark');
    expect(css).toContain('html,body{background:var(--pw-bg);}');
  });

  test('index.html paints the dark background before the entry runs (public/index.html)', () => {
    const { readFileSync } = jest.requireActual<typeof import('node:fs')>('node:fs');
    const html = readFileSync(`${__dirname}/../../public/index.html`, 'utf8');
    const dark = /prefers-color-scheme: dark\)\s*\{[^}]*background:\s*(#[0-9a-f]{6})/i.exec(html)?.[1];
    expect(dark?.toUpperCase()).toBe(darkColors.bg);
    const light = /body\s*\{[^}]*background:\s*(#[0-9a-f]{6})/i.exec(html)?.[1];
    expect(light?.toUpperCase()).toBe(colors.bg);
  });
});

test('a stored choice reads back; anything else follows the system', () => {
  expect(parseThemeChoice('dark')).toBe('dark');
  expect(parseThemeChoice('light')).toBe('light');
  for (const raw of [null, undefined, '', 'system', 'DARK', 'blue'])
    expect(parseThemeChoice(raw)).toBe('system');
});

test('the theme in force: a manual choice wins over the system; following it, unknown is light', () => {
  expect(resolveTheme('dark', 'light')).toBe('dark');
  expect(resolveTheme('light', 'dark')).toBe('light');
  expect(resolveTheme('system', 'dark')).toBe('dark');
  expect(resolveTheme('system', 'light')).toBe('light');
  expect(resolveTheme('system', null)).toBe('light');
});
