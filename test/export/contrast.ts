// Colour arithmetic of the theme tests, from WCAG 2.1 (W3C Web Content Accessibility Guidelines
// 2.1, definitions of "relative luminance" and "contrast ratio"; `from memory`): an sRGB channel c in 0…1
// is linearised as c/12.92 when c ≤ 0.03928, else ((c + 0.055)/1.055)^2.4; the luminance is
// L = 0.2126 R + 0.7152 G + 0.0722 B; the contrast ratio of two colours is (L1 + 0.05)/(L2 + 0.05)
// with L1 the lighter. Success criterion 1.4.3 asks 4.5:1 for body text, 1.4.11 asks 3:1 for the
// edges of interface parts. Colours with alpha are composited over what lies beneath
// (source-over, the browser's default) before the ratio is taken.

export interface Rgba {
  r: number;
  g: number;
  b: number;
  a: number;
}

/** A computed CSS colour as Chromium serialises it: `rgb(r, g, b)` or `rgba(r, g, b, a)`. */
export function parseColour(css: string): Rgba {
  const m = /^rgba?\(\s*([\d.]+),\s*([\d.]+),\s*([\d.]+)(?:,\s*([\d.]+))?\s*\)$/.exec(css.trim());
  if (!m) throw new Error(`not a computed sRGB colour: ${css}`);
  return { r: Number(m[1]), g: Number(m[2]), b: Number(m[3]), a: m[4] === undefined ? 1 : Number(m[4]) };
}

/** `top` painted over the opaque `under` (source-over). */
export function over(top: Rgba, under: Rgba): Rgba {
  const mix = (t: number, u: number) => t * top.a + u * (1 - top.a);
  return { r: mix(top.r, under.r), g: mix(top.g, under.g), b: mix(top.b, under.b), a: 1 };
}

/** The colour a stack of backgrounds shows, listed from the element outwards, on a white canvas. */
export function effectiveBackground(stack: readonly string[]): Rgba {
  let colour: Rgba = { r: 255, g: 255, b: 255, a: 1 };
  for (let i = stack.length - 1; i >= 0; i--) colour = over(parseColour(stack[i]!), colour);
  return colour;
}

function channel(c8: number): number {
  const c = c8 / 255;
  return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
}

/** WCAG 2.1 relative luminance of an opaque colour. */
export function luminance(c: Rgba): number {
  return 0.2126 * channel(c.r) + 0.7152 * channel(c.g) + 0.0722 * channel(c.b);
}

/** WCAG 2.1 contrast ratio of `fg` (composited over `bg` if translucent) against `bg`. */
export function contrast(fg: Rgba, bg: Rgba): number {
  const a = luminance(over(fg, bg));
  const b = luminance(bg);
  return (Math.max(a, b) + 0.05) / (Math.min(a, b) + 0.05);
}
