// A picture as a data URI, the form VS Code renders in hover markdown and <img> takes anywhere.
// Base64 (not percent-encoding): spaces and quotes in SVG text would break markdown links.
export function svgDataUri(svg: string): string {
  return `data:image/svg+xml;base64,${Buffer.from(svg, 'utf8').toString('base64')}`;
}
