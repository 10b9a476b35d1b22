/**
 * The Pivotwatch mark as SVG markup: a pivot with a swinging arm and its arc of travel,
 * on the base colour. One source for the in-app logo and the rendered icon/favicon PNGs
 * (scripts/render-icons.ts).
 */
export function logoMarkSvg(size: number, opts: { rounded?: boolean } = {}): string {
  const r = opts.rounded === false ? 0 : 22;
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${size}" height="${size}" viewBox="0 0 100 100">
  <rect width="100" height="100" rx="${r}" fill="#102A38"/>
  <path d="M 22.5 65.3 A 48 48 0 0 0 77.5 65.3" fill="none" stroke="#5E7D8E" stroke-width="4" stroke-linecap="round" stroke-dasharray="2 7"/>
  <line x1="50" y1="26" x2="66.4" y2="64.7" stroke="#FFFFFF" stroke-width="7" stroke-linecap="round"/>
  <rect x="58.2" y="63.2" width="22" height="15" rx="4" fill="#E0763A" transform="rotate(-23 69.2 70.7)"/>
  <circle cx="50" cy="26" r="10" fill="#FFFFFF"/>
  <circle cx="50" cy="26" r="4" fill="#102A38"/>
</svg>`;
}
