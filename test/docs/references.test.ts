// The repository documents itself: every outside source that code or tests cite is listed in
// docs/REFERENCES.md, every document a file points to is in the repository, and every source of
// the README's formula table is named beside a test that checks it.

import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ROOT, citationsIn, citingFiles, read, repoFiles } from './sources';

const REFERENCES = read('docs/REFERENCES.md');
const DESIGN = read('docs/DESIGN.md');
const headings = (md: string): string[] => [...md.matchAll(/^#+\s+(.+)$/gm)].map((m) => m[1]!.trim().toLowerCase());

describe('docs/REFERENCES.md lists every source the code and tests cite', () => {
  it('each citation in a comment, a title or a document is listed', () => {
    const missing = citingFiles()
      .flatMap((f) => citationsIn(f, read(f)))
      .filter((c) => !REFERENCES.includes(c.key))
      .map((c) => `${c.file}:${c.line} cites "${c.text}" (add "${c.key}" to docs/REFERENCES.md)`);
    expect(missing).toEqual([]);
  });

  it('the citation forms catch what they must (a source the list lacks is reported)', () => {
    // Each name is written in two pieces, so this file does not cite them itself.
    const j = (a: string, b: string): string => a + b;
    const sample = `// ADI ${j('MT', '-123')}; ${j('IEEE Std 99', '99-2031')}; ${j('RFC 99', '999')}; Smith, ${j('IMTC 20', '01')}; ${j('Jones 19', '75')}; ${j('WCAG 9', '.9')}`;
    const expected = [j('MT', '-123'), j('IEEE Std 99', '99-2031'), j('RFC 99', '999'), j('IMTC 20', '01'), 'Smith', 'Jones', j('WCAG 9', '.9')];
    const found = citationsIn('x.ts', sample).map((c) => c.key);
    expect(found).toEqual(expect.arrayContaining(expected));
    expect(found.filter((k) => !REFERENCES.includes(k)).sort()).toEqual([...expected].sort());
  });

  it('every package a test imports is named in its libraries section', () => {
    const libraries = REFERENCES.slice(REFERENCES.indexOf('## Libraries and tools the tests use'));
    const packages = new Set<string>();
    for (const f of repoFiles().filter((f) => f.startsWith('test/') && /\.(ts|mjs|cjs)$/.test(f))) {
      for (const m of read(f).matchAll(/(?:from\s+|require\(\s*|import\(\s*)['"]([^'"./][^'"]*)['"]/g)) {
        const spec = m[1]!;
        if (spec.startsWith('node:')) continue;
        packages.add(spec.startsWith('@') ? spec.split('/').slice(0, 2).join('/') : spec.split('/')[0]!);
      }
    }
    expect(packages.size).toBeGreaterThan(3);
    expect([...packages].filter((p) => !libraries.includes(`\`${p}\``)).sort()).toEqual([]);
  });
});

describe('no file points outside the repository', () => {
  const texts = repoFiles().filter((f) => !/\.(svg)$/.test(f) && !f.includes('/golden/'));

  it('relative paths stay inside the repository', () => {
    const outside: string[] = [];
    for (const f of texts) {
      for (const m of read(f).matchAll(/(?:\.\.\/)+[\w.\-/]*/g)) {
        const target = path.resolve(ROOT, path.dirname(f), m[0]);
        if (target !== ROOT && !target.startsWith(ROOT + path.sep)) outside.push(`${f}: ${m[0]}`);
      }
    }
    expect(outside).toEqual([]);
  });

  it('no absolute path into the machine the project was written on', () => {
    const hits = texts.filter((f) => /(^|[\s'"`(])\/work\//m.test(read(f)));
    expect(hits).toEqual([]);
  });

  it('every document named (an upper-case *.md) exists in the repository, beside the file or from the root', () => {
    const missing: string[] = [];
    for (const f of texts) {
      for (const m of read(f).matchAll(/(?<![\w/.*-])((?:[\w.-]+\/)*[A-Z][A-Z0-9_-]*\.md)\b/g)) {
        const name = m[1]!;
        const beside = path.join(ROOT, path.dirname(f), name);
        if (!fs.existsSync(beside) && !fs.existsSync(path.join(ROOT, name))) missing.push(`${f}: ${name}`);
      }
    }
    expect(missing).toEqual([]);
  });

  it('a section quoted after docs/DESIGN.md or docs/REFERENCES.md is a heading there', () => {
    const docs = { DESIGN: headings(DESIGN), REFERENCES: headings(REFERENCES) } as const;
    const wrong: string[] = [];
    for (const f of texts) {
      for (const m of read(f).matchAll(/docs\/(DESIGN|REFERENCES)\.md[,:]?\s*(?:section\s*)?["“]([^"”\n]+)["”]/g)) {
        const section = m[2]!.trim().toLowerCase();
        if (!docs[m[1] as keyof typeof docs].some((h) => h.startsWith(section))) wrong.push(`${f}: ${m[0]}`);
      }
    }
    expect(wrong).toEqual([]);
  });
});

describe("the README's formula table", () => {
  const readme = read('README.md');
  const start = readme.indexOf('| figure | formula | source |');
  const table = readme.slice(start, readme.indexOf('\n\n', start));
  const sourceCells = table.split('\n').slice(2).map((row) => row.split('|').slice(-2, -1)[0]!.trim());

  it('has rows, and each row names a source or says derived', () => {
    expect(start).toBeGreaterThan(0);
    expect(sourceCells.length).toBeGreaterThanOrEqual(5);
    for (const cell of sourceCells) expect(citationsIn('README.md', cell).length > 0 || /\bderived\b/.test(cell), cell).toBe(true);
  });

  it('every source it names is listed in docs/REFERENCES.md and named in a test', () => {
    const tests = repoFiles().filter((f) => f.startsWith('test/') && /\.test\.ts$/.test(f) && !f.startsWith('test/docs/references'));
    const testText = tests.map(read).join('\n');
    const keys = [...new Set(sourceCells.flatMap((cell) => citationsIn('README.md', cell).map((c) => c.key)))];
    expect(keys.length).toBeGreaterThanOrEqual(6);
    expect(keys.filter((k) => !REFERENCES.includes(k))).toEqual([]);
    expect(keys.filter((k) => !testText.includes(k))).toEqual([]);
  });
});
