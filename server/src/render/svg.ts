// Text-building helpers shared by the picture renderers. Pictures are plain SVG strings so they
// can travel anywhere (hover data URIs, the HTML report, files) without a DOM. Every number goes
// through `num` so the same plan always gives the same bytes.

/** A coordinate or length with at most one decimal: enough for screen pixels, small output. */
export function num(x: number): string {
  if (!Number.isFinite(x)) return '0';
  const r = Math.round(x * 10) / 10;
  return Object.is(r, -0) || r === 0 ? '0' : String(r);
}

export function escapeXml(text: string): string {
  return text.replace(/[&<>"']/g, (c) =>
    c === '&' ? '&amp;' : c === '<' ? '&lt;' : c === '>' ? '&gt;' : c === '"' ? '&quot;' : '&apos;',
  );
}

export type Attrs = Record<string, string | number | undefined>;

function attrText(attrs: Attrs): string {
  let out = '';
  for (const [k, v] of Object.entries(attrs)) {
    if (v === undefined) continue;
    out += ` ${k}="${typeof v === 'number' ? num(v) : escapeXml(v)}"`;
  }
  return out;
}

/** One element; `body` is already SVG text (use `text()` for character data). */
export function el(name: string, attrs: Attrs, body?: string): string {
  return body === undefined || body === '' ? `<${name}${attrText(attrs)}/>` : `<${name}${attrText(attrs)}>${body}</${name}>`;
}

export function text(x: number, y: number, content: string, attrs: Attrs = {}): string {
  return el('text', { x, y, ...attrs }, escapeXml(content));
}

/**
 * The whole picture. `label` becomes the <title> (what a screen reader or a broken image shows),
 * and the size is fixed in pixels with a viewBox so the picture scales in a report page.
 */
export function svgDocument(width: number, height: number, label: string, body: string, background: string): string {
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}"` +
    ` role="img" font-family="Verdana, 'DejaVu Sans', sans-serif" font-size="11">` +
    `<title>${escapeXml(label)}</title>` +
    el('rect', { x: 0, y: 0, width, height, fill: background }) +
    body +
    '</svg>'
  );
}

/** Path data from points, as one move and then line-tos. */
export function polylineData(xs: ArrayLike<number>, ys: ArrayLike<number>): string {
  let d = '';
  for (let i = 0; i < xs.length; i++) d += `${i === 0 ? 'M' : 'L'}${num(xs[i])} ${num(ys[i])}`;
  return d;
}
