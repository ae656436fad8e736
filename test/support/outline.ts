// Helpers of the outline tests (unit and protocol): spec files under a folder, a text with its line
// breaks rewritten, and the output names a reader finds line by line.

import { readdirSync } from 'node:fs';
import { join } from 'node:path';

export const BREAKS = { lf: '\n', crlf: '\r\n', cr: '\r' } as const;
export type Break = keyof typeof BREAKS;

/** Every `*.wave.yaml` and `*.clock.yaml` under `dir`, depth first. */
export function specFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) =>
    e.isDirectory() ? specFiles(join(dir, e.name)) : /\.(wave|clock)\.yaml$/.test(e.name) ? [join(dir, e.name)] : [],
  );
}

/** The text with every line break (CR LF, lone CR, LF) written as `b`. */
export const withBreaks = (text: string, b: Break): string => text.replace(/\r\n|\r|\n/g, BREAKS[b]);

/**
 * The output names as a reader finds them, line by line (derived from the YAML 1.2 block-mapping
 * layout, not from the spec layer): the lines under `outputs:` at the indentation of its first
 * entry, each name up to its colon. A flow `outputs:` value lists none.
 */
export function outputNamesByLine(text: string): string[] {
  const lines = text.split(/\r\n|\r|\n/);
  const start = lines.findIndex((l) => /^outputs:\s*(#.*)?$/.test(l));
  if (start < 0) return [];
  const names: string[] = [];
  let column = -1;
  for (const line of lines.slice(start + 1)) {
    if (line.trim() === '' || line.trimStart().startsWith('#')) continue;
    const indent = line.length - line.trimStart().length;
    if (indent === 0) break;
    if (column < 0) column = indent;
    if (indent === column) names.push(line.trim().replace(/:(\s.*)?$/, ''));
  }
  return names;
}
