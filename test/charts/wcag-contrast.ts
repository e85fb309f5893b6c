/**
 * The contrast ratio of WCAG 2.1, written out from its definitions
 * (W3C Recommendation, 5 June 2018, https://www.w3.org/TR/WCAG21/):
 * - relative luminance, https://www.w3.org/TR/WCAG21/#dfn-relative-luminance:
 *   L = 0.2126 R + 0.7152 G + 0.0722 B, where each channel c of sRGB (0..1)
 *   becomes c / 12.92 if c <= 0.03928, else ((c + 0.055) / 1.055) ^ 2.4;
 * - contrast ratio, https://www.w3.org/TR/WCAG21/#dfn-contrast-ratio:
 *   (L1 + 0.05) / (L2 + 0.05), L1 the lighter of the two.
 */

/** '#rrggbb' as three sRGB channels in 0..1. */
export function srgbChannels(hex: string): [number, number, number] {
  const m = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
  if (!m) throw new Error(`"${hex}" is not a colour of the form #rrggbb`);
  return [m[1], m[2], m[3]].map((h) => parseInt(h, 16) / 255) as [number, number, number];
}

/** One sRGB channel made linear, as WCAG 2.1's relative-luminance definition gives it. */
export function linearChannel(c: number): number {
  return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
}

export function relativeLuminance(hex: string): number {
  const [r, g, b] = srgbChannels(hex).map(linearChannel);
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

export function contrastRatio(a: string, b: string): number {
  const [hi, lo] = [relativeLuminance(a), relativeLuminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

/** A colour drawn with an opacity over a background, as a canvas or SVG blends it (in sRGB). */
export function overBackground(hex: string, opacity: number, background: string): string {
  const fg = srgbChannels(hex);
  const bg = srgbChannels(background);
  return `#${fg.map((c, k) => Math.round((opacity * c + (1 - opacity) * bg[k]) * 255).toString(16).padStart(2, '0')).join('')}`;
}
