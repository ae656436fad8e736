// Every spec exported into one folder builds into one firmware: the headers of all of them
// compile together and their objects link (gcc/g++, -Wall -Wextra -Werror -pedantic, C99 and
// C++17). Names that would clash are refused before anything is written, naming both specs,
// whether the clash is within one run or with a header an earlier export left in the folder; and
// no header takes the name of one of the C library's (ISO/IEC 9899 §7.1.2).

import * as fs from 'node:fs';
import * as path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { STANDARD_HEADERS } from '../../server/src/export/identifiers';
import { compile, FIXTURES, requireTool, run, scratch, STRICT } from './support';

const CLOCK = fs.readFileSync(path.join(FIXTURES, 'tone-lab.clock.yaml'), 'utf8');

function workspace(specs: Record<string, string[]>): string {
  const ws = scratch('link');
  fs.writeFileSync(path.join(ws, 'tone-lab.clock.yaml'), CLOCK);
  for (const [name, outputs] of Object.entries(specs)) {
    // 93.75 kHz and 46.875 kHz are exact on the 96 MHz tone-lab clock (96 MHz / 1024, / 2048).
    const body = outputs.map((o, i) => `  ${o}:\n    shape: sine\n    frequency: ${i % 2 ? '46.875' : '93.75'} kHz\n`).join('');
    fs.writeFileSync(path.join(ws, `${name}.wave.yaml`), `clock: ./tone-lab.clock.yaml\noutputs:\n${body}`);
  }
  return ws;
}

beforeAll(() => {
  requireTool('gcc');
  requireTool('g++');
});

describe('two specs in one folder', () => {
  it('with the same output names export, compile and link together (C99 objects, a C++17 main)', async () => {
    const ws = workspace({ 'left-rig': ['tone', 'probe'], 'right-rig': ['tone', 'probe'] });
    const r = await run('export', [path.join(ws, 'left-rig.wave.yaml'), path.join(ws, 'right-rig.wave.yaml'), '--c', path.join(ws, 'gen')]);
    expect(r.code, r.stderr).toBe(0);
    const gen = path.join(ws, 'gen');
    for (const [compiler, std, lang] of [
      ['gcc', '-std=c99', 'c'],
      ['g++', '-std=c++17', 'c++'],
    ] as const)
      for (const unit of ['left_rig', 'right_rig']) {
        const c = compile(compiler, [std, ...STRICT, '-x', lang, '-c', `${unit}.c`, '-o', `${unit}-${lang}.o`], gen);
        expect(c.output, `${compiler} ${unit}`).toBe('');
      }
    fs.writeFileSync(
      path.join(gen, 'main.cpp'),
      [
        '#include <stdint.h>',
        '#include "left_rig.h"',
        '#include "right_rig.h"',
        '#define SUM(lower, UPPER) total += lower##_table[UPPER##_TABLE_LENGTH - 1];',
        'int main() { unsigned long total = 0; LEFT_RIG_OUTPUTS(SUM) RIGHT_RIG_OUTPUTS(SUM) return total > 0 ? 0 : 1; }',
        '',
      ].join('\n'),
    );
    const link = compile('g++', ['-std=c++17', ...STRICT, '-I', gen, 'main.cpp', 'left_rig-c.o', 'right_rig-c.o', '-o', 'both'], gen);
    expect(link.output).toBe('');
    expect(link.ok).toBe(true);
    fs.rmSync(ws, { recursive: true, force: true });
  });

  // a-b.wave.yaml's output x and a.wave.yaml's output b-x both give A_B_X_* and a_b_x_table.
  const clashing = { 'a-b': ['x'], a: ['b-x'] };

  it('whose names would clash are refused in one run, naming both, and nothing is written', async () => {
    const ws = workspace(clashing);
    const gen = path.join(ws, 'gen');
    const r = await run('export', [path.join(ws, 'a-b.wave.yaml'), path.join(ws, 'a.wave.yaml'), '--c', gen]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/a-b\.wave\.yaml \(a_b\.h\) and .*a\.wave\.yaml \(a\.h\) would both declare A_B_X_DIVIDER_INT, /);
    expect(fs.existsSync(gen)).toBe(false);

    // The oracle that the clash is real: the two exported apart define the same table, and the
    // linker (GNU ld) refuses the pair with "multiple definition".
    for (const spec of ['a-b', 'a']) {
      expect((await run('export', [path.join(ws, `${spec}.wave.yaml`), '--c', path.join(ws, spec)])).code).toBe(0);
      const unit = spec.replace('-', '_');
      expect(compile('gcc', ['-std=c99', ...STRICT, '-c', path.join(spec, `${unit}.c`), '-o', `${unit}.o`], ws).output).toBe('');
    }
    fs.writeFileSync(path.join(ws, 'main.c'), 'int main(void) { return 0; }\n');
    const both = compile('gcc', ['-std=c99', 'main.c', 'a_b.o', 'a.o', '-o', 'both'], ws);
    expect(both.ok).toBe(false);
    expect(both.output).toContain('multiple definition of `a_b_x_table');
    fs.rmSync(ws, { recursive: true, force: true });
  });

  it('whose names would clash with a header an earlier export left in the folder are refused too', async () => {
    const ws = workspace(clashing);
    const gen = path.join(ws, 'gen');
    expect((await run('export', [path.join(ws, 'a-b.wave.yaml'), '--c', gen])).code).toBe(0);
    const before = fs.readdirSync(gen).sort();
    const r = await run('export', [path.join(ws, 'a.wave.yaml'), '--c', gen]);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('(a_b.h) and ');
    expect(r.stderr).toContain('a.wave.yaml (a.h) would both declare');
    expect(fs.readdirSync(gen).sort()).toEqual(before);
    // Re-exporting the spec that wrote the header replaces it: no clash with itself.
    expect((await run('export', [path.join(ws, 'a-b.wave.yaml'), '--c', gen])).code).toBe(0);
    fs.rmSync(ws, { recursive: true, force: true });
  });
});

describe('header names', () => {
  it.each(['stdint', 'string', 'math', 'time'])('a spec named %s.wave.yaml is refused: its header would shadow the C library’s', async (name) => {
    expect(STANDARD_HEADERS.has(name)).toBe(true);
    const ws = workspace({ [name]: ['tone'] });
    const r = await run('export', [path.join(ws, `${name}.wave.yaml`), '--c', path.join(ws, 'gen')]);
    expect(r.code).toBe(1);
    expect(r.stderr).toContain(`error c-identifier The file name gives the header ${name}.h, which would shadow the C library's <${name}.h>`);
    expect(fs.existsSync(path.join(ws, 'gen'))).toBe(false);
    fs.rmSync(ws, { recursive: true, force: true });
  });

  it('the shadowing is real: a stdint.h in an -I folder replaces the library’s for <stdint.h> (the reason for the rule)', () => {
    const dir = scratch('shadow');
    fs.mkdirSync(path.join(dir, 'gen'));
    fs.writeFileSync(path.join(dir, 'gen', 'stdint.h'), '#error "the generated folder shadowed <stdint.h>"\n');
    fs.writeFileSync(path.join(dir, 'use.c'), '#include <stdint.h>\nint main(void) { return (int)sizeof(uint8_t) - 1; }\n');
    const r = compile('gcc', ['-std=c99', '-I', 'gen', '-c', 'use.c', '-o', 'use.o'], dir);
    expect(r.ok).toBe(false);
    expect(r.output).toContain('the generated folder shadowed <stdint.h>');
    fs.rmSync(dir, { recursive: true, force: true });
  });
});
