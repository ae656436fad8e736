// DMA ring tables are aligned to their size, which must be a power of two (C11 §6.2.8: an
// alignment is a non-negative integral power of two — from memory for the clause; gcc rejects
// any other with "requested alignment … is not a positive power of 2"). A forced export of a
// pinned table whose size is not one still builds: it is aligned to the next power of two, and
// its comment says the ring is not possible.

import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ringAlignment } from '../../server/src/export/model';
import { compile, FIXTURES, requireTool, run, runBinary, scratch, STRICT } from './support';

describe('ring alignment', () => {
  it('is the size for a power of two, else the next power of two (exhaustive up to 2^16)', () => {
    for (let bytes = 1; bytes <= 65536; bytes++) {
      const a = ringAlignment(bytes);
      // A power of two (one bit set), not below the size, and less than twice it.
      expect((a & (a - 1)) === 0 && a >= bytes && a < 2 * bytes).toBe(true);
    }
  });

  it('a forced export of a pinned 1000-sample (2000-byte) table on a power-of-two clock compiles as C99, C11 and C++17 and is aligned', async () => {
    requireTool('gcc');
    requireTool('g++');
    const ws = scratch('align');
    fs.copyFileSync(path.join(FIXTURES, 'tone-lab.clock.yaml'), path.join(ws, 'tone-lab.clock.yaml'));
    // 96 MHz / (96 · 1000) = 1 kHz exactly (derived): the plan is right but N = 1000 is no power of two.
    fs.writeFileSync(
      path.join(ws, 'odd-ring.wave.yaml'),
      'clock: ./tone-lab.clock.yaml\noutputs:\n  hum:\n    shape: sine\n    frequency: 1 kHz\n    plan: { divider: 96, table-length: 1000, cycles: 1 }\n',
    );
    const gen = path.join(ws, 'gen');
    const r = await run('export', [path.join(ws, 'odd-ring.wave.yaml'), '--c', gen, '--force']);
    expect(r.code).toBe(1);
    expect(r.stderr).toContain('power of two');
    const header = fs.readFileSync(path.join(gen, 'odd_ring.h'), 'utf8');
    expect(header).toMatch(/#define ODD_RING_HUM_TABLE_ALIGN\s+2048u/);
    expect(header).toContain('DMA ring: NOT possible, 2000 bytes is not a power of two; aligned to 2048 bytes, the next one');
    const flags = ['-DWAVEPLAN_ALLOW_UNCHECKED', ...STRICT];
    for (const [compiler, std, lang] of [
      ['gcc', '-std=c99', 'c'],
      ['gcc', '-std=c11', 'c'],
      ['g++', '-std=c++17', 'c++'],
    ] as const) {
      const c = compile(compiler, [std, ...flags, '-x', lang, '-c', 'odd_ring.c', '-o', `odd-${lang}${std}.o`], gen);
      expect(c.output, `${compiler} ${std}`).toBe('');
    }
    fs.writeFileSync(
      path.join(gen, 'check.c'),
      '#include <stdint.h>\n#include <stdio.h>\n#include "odd_ring.h"\nint main(void) { printf("%u\\n", (unsigned)((uintptr_t)odd_ring_hum_table % ODD_RING_HUM_TABLE_ALIGN)); return 0; }\n',
    );
    const link = compile('gcc', ['-std=c11', ...flags, 'check.c', 'odd-c-std=c11.o', '-o', 'check'], gen);
    expect(link.output).toBe('');
    expect(runBinary(path.join(gen, 'check')).trim()).toBe('0');
    fs.rmSync(ws, { recursive: true, force: true });
  });
});
