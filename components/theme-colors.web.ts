import { type ThemeChoice } from '@/components/theme-resolve';
import { readThemeChoice, writeThemeChoice } from '@/components/theme-store';
import { type ColorToken, type Palette, colors as light, darkColors } from '@/lib/colors';

/**
 * Web: every token is a CSS custom property (`var(--pw-base)`), so the ~160 stylesheets built once at load
 * follow the theme without being rebuilt. One <style> defines both palettes: light by default, dark under
 * `prefers-color-scheme: dark` unless `data-theme` on <html> holds a manual choice. react-native-web and
 * react-native-svg pass `var(…)` through as written; nothing may do arithmetic on these values.
 */
const tokens = Object.keys(light) as ColorToken[];

/** The custom property of a token: `surfaceSunk` → `--pw-surface-sunk`. */
export const cssVarName = (token: ColorToken) =>
  `--pw-${token.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`)}`;

export const colors = Object.fromEntries(tokens.map((t) => [t, `var(${cssVarName(t)})`])) as Palette;

const declarations = (palette: Palette) => tokens.map((t) => `${cssVarName(t)}:${palette[t]};`).join('');

/** The style sheet: both palettes, the page's own background, and native controls in the same scheme. */
export function themeCss(): string {
  const dark = `${declarations(darkColors)}color-scheme:dark;`;
  return [
    `:root{${declarations(light)}}`,
    `@media (prefers-color-scheme: dark){:root:not([data-theme="light"]){${dark}}}`,
    `:root[data-theme="dark"]{${dark}}`,
    'html,body{background:var(--pw-bg);}',
  ].join('\n');
}

export const THEME_STYLE_ID = 'pivotwatch-theme';

/** Shows a choice at once: "system" leaves the media query in charge. */
function setThemeAttribute(choice: ThemeChoice) {
  const root = document.documentElement;
  if (choice === 'system') root.removeAttribute('data-theme');
  else root.setAttribute('data-theme', choice);
}

// As the entry runs, before React renders anything: the first paint already has the right colours.
if (typeof document !== 'undefined' && !document.getElementById(THEME_STYLE_ID)) {
  const style = document.createElement('style');
  style.id = THEME_STYLE_ID;
  style.textContent = themeCss();
  document.head.appendChild(style);
  setThemeAttribute(readThemeChoice());
}

export const themeChoiceShowsAtOnce = true;

/** Stores the choice and shows it; false when the browser would not store it (it then lasts this page). */
export function applyThemeChoice(choice: ThemeChoice): boolean {
  setThemeAttribute(choice);
  return writeThemeChoice(choice);
}
