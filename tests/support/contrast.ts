/**
 * WCAG 2.x contrast ratio, from the W3C Recommendation's definitions of "relative luminance" and
 * "contrast ratio" (success criterion 1.4.3 asks 4.5:1 for normal text). The sRGB linearisation uses the
 * 0.03928 threshold as written in WCAG 2.0–2.2; IEC 61966-2-1 says 0.04045, which changes no 8-bit
 * channel's result. Colours are `#RRGGBB`.
 */
export function relativeLuminance(hex: string): number {
  const n = parseInt(hex.slice(1), 16);
  const channel = (v: number) => {
    const c = v / 255;
    return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  };
  return 0.2126 * channel((n >> 16) & 255) + 0.7152 * channel((n >> 8) & 255) + 0.0722 * channel(n & 255);
}

/** (L1 + 0.05) / (L2 + 0.05), the lighter colour's luminance over the darker's: 1 to 21. */
export function contrast(a: string, b: string): number {
  const [hi, lo] = [relativeLuminance(a), relativeLuminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}
