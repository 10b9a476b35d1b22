/**
 * The Pivotwatch mark as SVG markup: a pivot with a swinging arm and its arc of travel,
 * on the base colour. One source for the in-app logo, the rendered icon/favicon PNGs
 * (scripts/render-icons.ts) and, through `logoColors`, the notice PDF's header.
 */
import { colors } from '@/lib/colors';

/** The mark's colours: the base and white of the palette, and two of its own. */
export const logoColors = {
  base: colors.base,
  arc: '#5E7D8E',
  gondola: '#E0763A',
  white: '#FFFFFF',
} as const;

export function logoMarkSvg(size: number, opts: { rounded?: boolean } = {}): string {
  const r = opts.rounded === false ? 0 : 22;
  const c = logoColors;
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${size}" height="${size}" viewBox="0 0 100 100">
  <rect width="100" height="100" rx="${r}" fill="${c.base}"/>
  <path d="M 22.5 65.3 A 48 48 0 0 0 77.5 65.3" fill="none" stroke="${c.arc}" stroke-width="4" stroke-linecap="round" stroke-dasharray="2 7"/>
  <line x1="50" y1="26" x2="66.4" y2="64.7" stroke="${c.white}" stroke-width="7" stroke-linecap="round"/>
  <rect x="58.2" y="63.2" width="22" height="15" rx="4" fill="${c.gondola}" transform="rotate(-23 69.2 70.7)"/>
  <circle cx="50" cy="26" r="10" fill="${c.white}"/>
  <circle cx="50" cy="26" r="4" fill="${c.base}"/>
</svg>`;
}
