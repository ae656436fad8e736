// A wave spec's frame (its top-level keys) read entry by entry, for while the file does not parse:
// each top-level key with its indented lines is read on its own, so a half-typed `descr` line
// leaves `clock:` readable and the outputs planned. Only what the split reading needs is taken:
// the clock, the `outputs` key and the syntax errors, each where it is in the frame.

import { linesWithBreaks } from './line-breaks';
import { Memo } from './memo';
import { keyRange, valueRange } from './nodes';
import { readSource } from './source';
import type { Range, SpecDiagnostic } from './types';

/** What the split reading takes from the frame; ranges are on the frame's own lines. */
export interface FrameReading {
  clock: unknown;
  clockRange: Range | undefined;
  outputsKey: Range | undefined;
  /** Syntax errors (only while the file does not parse). */
  syntax: SpecDiagnostic[];
}

const down = (r: Range, lines: number): Range => ({
  start: { line: r.start.line + lines, character: r.start.character },
  end: { line: r.end.line + lines, character: r.end.character },
});

/** A line that starts a top-level entry: content at the margin that is not a comment. */
const startsEntry = (line: string): boolean => line.length > 0 && !/^[ #\r\n]/.test(line);

function read(frameText: string): FrameReading {
  const lines = linesWithBreaks(frameText);
  const out: FrameReading = { clock: undefined, clockRange: undefined, outputsKey: undefined, syntax: [] };
  let first = 0;
  while (first < lines.length) {
    let next = first + 1;
    while (next < lines.length && !startsEntry(lines[next])) next++;
    // A key after the entry, as in the file: a stray word alone would read as a whole document.
    const text = lines.slice(first, next).join('') + (next < lines.length ? (/[\r\n]$/.test(lines[next - 1]) ? '' : '\n') + 'next-0:\n' : '');
    const src = readSource(text);
    if (src.doc) {
      const data = src.data as Record<string, unknown> | null;
      if (data && typeof data === 'object' && Object.hasOwn(data, 'clock') && out.clockRange === undefined) {
        out.clock = data.clock;
        out.clockRange = down(valueRange(src.doc, src.lines, ['clock']) ?? src.lines.firstLine(), first);
      }
      const outputs = keyRange(src.doc, src.lines, ['outputs']);
      if (outputs && out.outputsKey === undefined) out.outputsKey = down(outputs, first);
    } else {
      const last = next - first - 1;
      for (const d of src.diagnostics) {
        if (d.code !== 'yaml-syntax') continue;
        // The parser may point at the key added after the entry: show it on the entry's last line.
        const range = d.range.start.line > last ? { start: { line: last, character: 0 }, end: { line: last, character: lines[next - 1].replace(/[\r\n]+$/, '').length } } : d.range;
        out.syntax.push({ ...d, range: down(range, first) });
      }
    }
    first = next;
  }
  return out;
}

const readings = new Memo<string, FrameReading>(16);

export function frameSyntax(frameText: string): FrameReading {
  return readings.get(frameText, read);
}
