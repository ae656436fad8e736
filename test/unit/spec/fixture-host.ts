// Test helpers: a disk host (the checker's view of files) and the expectations a fixture marks
// in its own comments (see test/fixtures/bad/README.md).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Range, SpecHost } from '../../../server/src/spec/types';

export const FIXTURES = join(__dirname, '..', '..', 'fixtures');

export const diskHost: SpecHost = {
  readFile(path: string) {
    try {
      return readFileSync(path, 'utf8');
    } catch {
      return undefined;
    }
  },
};

export interface Expected {
  code: string;
  severity: string;
  range: Range;
}

const CARET = /^(\s*#\s*?)(\s*)(\^+)\s+([a-z-]+)\s+(error|warning|information)\s*$/;
const EXPLICIT = /^\s*#\s*@(\d+):(\d+)-(\d+):(\d+)\s+([a-z-]+)\s+(error|warning|information)\s*$/;

/** Every expectation marked in a fixture's comments. */
export function expectations(text: string): Expected[] {
  const lines = text.split('\n');
  const out: Expected[] = [];
  let target = -1;
  lines.forEach((line, i) => {
    const explicit = EXPLICIT.exec(line);
    if (explicit) {
      const [, l1, c1, l2, c2, code, severity] = explicit;
      out.push({ code, severity, range: { start: { line: +l1, character: +c1 }, end: { line: +l2, character: +c2 } } });
      return;
    }
    const caret = CARET.exec(line);
    if (caret) {
      const start = line.indexOf('^');
      const end = start + caret[3].length;
      out.push({ code: caret[4], severity: caret[5], range: { start: { line: target, character: start }, end: { line: target, character: end } } });
      return;
    }
    target = i;
  });
  return out;
}
