// Spec text reaches generated C only inside comments, through commentSafe (c-text.ts). These
// tests try to break out: comment terminators, look-alike signs that map to `/` and `*`,
// newlines, trigraphs (ISO C 5.2.1.1: `??/` is a backslash), backslash line splices (ISO C
// 5.1.1.2 phase 2), NUL and non-ASCII. The oracle is the compiler itself: the preprocessed text
// (comments removed, gcc -E) must hold exactly the tokens waveplan wrote, nothing of the spec.

import * as fs from 'node:fs';
import * as path from 'node:path';
import { spawnSync } from 'node:child_process';
import { beforeAll, describe, expect, it } from 'vitest';
import { block, commentSafe, lineComment } from '../../server/src/export/c-text';
import { seededRandom } from '../support/seeded';
import { compile, FIXTURES, requireTool, run, scratch, STRICT } from './support';

const HOSTILE = [
  '*/ int pwned; /*',
  'x·÷ int pwned; ÷·',
  '÷* int pwned; *÷',
  '*÷ int pwned; ·/',
  '??/',
  'end ??/\nint pwned;',
  'a*/b\\',
  'trailing backslash \\',
  '\\\nint pwned;',
  'line\nint pwned;\n/*',
  'cr\rint pwned;',
  'nul\u0000int pwned;',
  '\u2028int pwned;\u2029',
  '??=define pwned 1',
  '???/',
  '*//*/*/**/',
  '/**/ int pwned; /**/',
  'µ±≈→≤≥ ok',
  '"quoted" \'single\' #define pwned',
  'emoji 🎛️ and 中文',
];

/** Seeded strings drawn from the characters that matter, to reach combinations no list names. */
function randomHostile(count: number): string[] {
  const rnd = seededRandom(20240917);
  const alphabet = ['*', '/', '?', '\\', '÷', '·', '\n', '\r', '\t', '\u0000', '"', '#', ' ', 'x', '=', '(', ')', '🎛', 'é', '\u2028'];
  return Array.from({ length: count }, () => {
    let s = '';
    const n = 1 + Math.floor(rnd() * 24);
    for (let i = 0; i < n; i++) s += alphabet[Math.floor(rnd() * alphabet.length)];
    return s;
  });
}

const ALL = [...HOSTILE, ...randomHostile(2000)];

describe('commentSafe', () => {
  it('leaves printable ASCII only, with no delimiter, trigraph start or backslash, on every input', () => {
    for (const s of ALL) {
      const safe = commentSafe(s);
      expect(safe, JSON.stringify(s)).toMatch(/^[\x20-\x7e]*$/);
      expect(safe, JSON.stringify(s)).not.toMatch(/\*\/|\/\*|\?\?|\\/);
    }
  });

  it('keeps plain text as written and spells our signs in ASCII', () => {
    expect(commentSafe('target 93.75 kHz +/- 5 Hz; f_s = 96 MHz / 1024')).toBe('target 93.75 kHz +/- 5 Hz; f_s = 96 MHz / 1024');
    expect(commentSafe('÷6 · N ≈ 5 µs ± 1')).toBe('/6 * N ~ 5 us +/- 1');
  });
});

describe('gcc sees only the tokens waveplan wrote', () => {
  let dir: string;
  beforeAll(() => {
    requireTool('gcc');
    requireTool('g++');
    dir = scratch('escaping');
  });

  it('each hostile string in a block comment and a line comment leaves the token stream untouched (C99 with trigraphs, C++17)', () => {
    const lines: string[] = [];
    ALL.forEach((s, i) => lines.push(block([s, `spec text ${i}`]), `int ok_${i} = ${i}; ${lineComment(s)}`));
    fs.writeFileSync(path.join(dir, 'comments.c'), `${lines.join('\n')}\n`);
    for (const [compiler, std, lang] of [
      ['gcc', '-std=c99', 'c'],
      ['g++', '-std=c++17', 'c++'],
    ] as const) {
      const r = compile(compiler, [std, '-trigraphs', ...STRICT, '-x', lang, '-c', 'comments.c', '-o', `comments-${lang}.o`], dir);
      expect(r.output, `${compiler} ${std}`).toBe('');
      const pre = spawnSync(compiler, [std, '-trigraphs', '-x', lang, '-E', '-P', 'comments.c'], { cwd: dir, encoding: 'utf8' });
      const tokens = pre.stdout.split(/\s+/).filter((t) => t !== '');
      expect(tokens.join(' ')).toBe(ALL.map((_, i) => `int ok_${i} = ${i};`).join(' '));
    }
  });

  it('a forced export of a spec whose keys quote hostile text builds, and holds nothing of it but comments', async () => {
    const ws = scratch('escaping-spec');
    fs.copyFileSync(path.join(FIXTURES, 'tone-lab.clock.yaml'), path.join(ws, 'tone-lab.clock.yaml'));
    const keys = HOSTILE.map((k, i) => `${JSON.stringify(k)}: ${i}`).join('\n');
    fs.writeFileSync(path.join(ws, 'hostile.wave.yaml'), `clock: ./tone-lab.clock.yaml\n${keys}\noutputs:\n  pilot:\n    shape: sine\n    frequency: 93.75 kHz\n`);
    const r = await run('export', [path.join(ws, 'hostile.wave.yaml'), '--c', path.join(ws, 'gen'), '--force']);
    // Exit 1: the spec has errors (the unknown keys), exported anyway with --force.
    expect(r.code, r.stderr).toBe(1);
    const header = fs.readFileSync(path.join(ws, 'gen', 'hostile.h'), 'utf8');
    expect(header).toContain('unknown-key');
    expect(header).toMatch(/^[\x20-\x7e\n]*$/);
    const flags = ['-DWAVEPLAN_ALLOW_UNCHECKED', '-trigraphs', ...STRICT];
    expect(compile('gcc', ['-std=c99', ...flags, '-c', 'hostile.c', '-o', 'c.o'], path.join(ws, 'gen')).output).toBe('');
    expect(compile('g++', ['-std=c++17', ...flags, '-x', 'c++', '-c', 'hostile.c', '-o', 'cpp.o'], path.join(ws, 'gen')).output).toBe('');
    const pre = spawnSync('gcc', ['-std=c99', '-trigraphs', '-DWAVEPLAN_ALLOW_UNCHECKED', '-E', '-P', 'hostile.c'], { cwd: path.join(ws, 'gen'), encoding: 'utf8' });
    expect(pre.status).toBe(0);
    expect(pre.stdout).not.toContain('pwned');
    fs.rmSync(ws, { recursive: true, force: true });
  });
});
