// Found by the fuzz harness (seed 20261203, cases 300, 700, … of a long run): a spec over the size
// limit got two different file-too-large messages — the editor's "The file is 9.5 MB, more than the
// 1 MB waveplan reads", the checker's "The file it is 9.5 MiB (… bytes), …" (sic). Both now give the
// file's size in bytes as UTF-8 in one sentence; sizes derived: the text's length plus one extra
// byte for the "é" (U+00E9 takes two bytes in UTF-8; from memory).

import * as fs from 'node:fs';
import * as path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { analyze } from '../../server/src/spec/analyze';
import { runChecker } from '../support/fuzz/checker-side';
import { scratchDir } from '../support/cli';

const dir = scratchDir('too-large');
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

describe('file-too-large', () => {
  // Over the 1 Mi-character limit and under the 3 MiB the checker reads (the spec layer decides),
  // and over 3 MiB (the checker decides from the size on disk, without reading).
  for (const [name, chars] of [['read', 1.5 * 2 ** 20], ['not read', 4 * 2 ** 20]] as const) {
    it(`says the same in the editor and the checker for a file ${name}`, () => {
      const file = path.join(dir, `big-${chars}.wave.yaml`);
      const text = `clock: ./none.clock.yaml\n# é ${'x'.repeat(chars)}\n`;
      fs.writeFileSync(file, text);
      const editor = analyze(file, text, { readFile: () => undefined }).diagnostics;
      const checked = runChecker([file], dir);
      expect(checked.problems).toStrictEqual([]);
      const checker = checked.files[0].findings;
      expect(editor.map((d) => d.code)).toStrictEqual(['file-too-large']);
      expect(checker.map((d) => d.message)).toStrictEqual(editor.map((d) => d.message));
      expect(editor[0].message).toContain(`(${text.length + 1} bytes)`);
      expect(editor[0].message).toMatch(/^The file is \d+\.\d MiB \(\d+ bytes\), more than a spec can be/);
    });
  }
});
