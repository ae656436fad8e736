// The generated sources compile as C99, C11 and C++17 with warnings as errors (Debian gcc/g++;
// the language levels are the ISO standards named by -std). gcc and g++ must be installed.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { compile, DEMO, FIXTURES, requireTool, run, scratch, STRICT } from './support';

interface Exported {
  dir: string;
  prefix: string;
  forced: boolean;
}

const specs: Array<[string, string, string[]]> = [
  ['tone-lab fixture (DMA ring, aligned tables, fractional divider)', path.join(FIXTURES, 'tone-lab.wave.yaml'), []],
  ['odd-names fixture (names that crowd the macro namespace)', path.join(FIXTURES, 'odd-names.wave.yaml'), []],
  ['demo (examples/), forced', DEMO, ['--force']],
  ['stage-divider demo (examples/tone-bench: stage values and registers)', path.join(path.dirname(DEMO), 'tone-bench.wave.yaml'), []],
];

const exported = new Map<string, Exported>();

beforeAll(async () => {
  requireTool('gcc');
  requireTool('g++');
  for (const [name, spec, extra] of specs) {
    const dir = scratch('compile');
    const r = await run('export', [spec, '--c', dir, ...extra]);
    expect(r.code, r.stderr).toBeLessThan(2);
    const header = fs.readdirSync(dir).find((f) => f.endsWith('.h'))!;
    exported.set(name, { dir, prefix: header.slice(0, -2), forced: fs.readFileSync(path.join(dir, header), 'utf8').includes('UNCHECKED EXPORT') });
  }
});

describe.each(specs.map(([name]) => name))('%s', (name) => {
  const flags = (e: Exported) => (e.forced ? ['-DWAVEPLAN_ALLOW_UNCHECKED'] : []);

  it.each([
    ['gcc', '-std=c99', 'c'],
    ['gcc', '-std=c11', 'c'],
    ['g++', '-std=c++17', 'c++'],
  ] as const)('%s %s -Wall -Wextra -Werror -pedantic', (compiler, std, lang) => {
    const e = exported.get(name)!;
    const r = compile(compiler, [std, ...STRICT, ...flags(e), '-x', lang, '-c', `${e.prefix}.c`, '-o', `${e.prefix}-${lang}.o`], e.dir);
    expect(r.output).toBe('');
    expect(r.ok).toBe(true);
  });

  it('C and C++ translation units link together (extern "C" linkage)', () => {
    const e = exported.get(name)!;
    fs.writeFileSync(
      path.join(e.dir, 'use.cpp'),
      `#include "${e.prefix}.h"\n#define TOUCH(lower, UPPER) total += lower##_table[0] + UPPER##_TABLE_LENGTH;\nint main() { unsigned long total = 0; ${e.prefix.toUpperCase()}_OUTPUTS(TOUCH) return total == 0 ? 1 : 0; }\n`,
    );
    const c = compile('gcc', ['-std=c99', ...STRICT, ...flags(e), '-c', `${e.prefix}.c`, '-o', 'lib.o'], e.dir);
    expect(c.output).toBe('');
    const cpp = compile('g++', ['-std=c++17', ...STRICT, ...flags(e), 'use.cpp', 'lib.o', '-o', 'use'], e.dir);
    expect(cpp.output).toBe('');
    expect(cpp.ok).toBe(true);
  });
});

describe('a forced export does not build by accident', () => {
  it('#error without WAVEPLAN_ALLOW_UNCHECKED', async () => {
    const dir = scratch('forced');
    await run('export', [path.join(FIXTURES, 'off-target.wave.yaml'), '--c', dir, '--force']);
    const r = compile('gcc', ['-std=c99', '-c', 'off_target.c', '-o', 'x.o'], dir);
    expect(r.ok).toBe(false);
    expect(r.output).toContain('exported with --force from a spec with errors');
  });
});
