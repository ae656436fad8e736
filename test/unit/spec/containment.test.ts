// The containment policy (server/src/spec/containment.ts) on a file system faked in memory, so
// races and odd file kinds that are hard to stage on a real disk can be checked: the decision is
// taken on the file that was opened, never on a name looked at earlier.

import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ContainedReader, isInside, looksGenerated, writeContained, type FileFacts, type FileKind, type FileSystem } from '../../../server/src/spec/containment';

interface FakeFile {
  kind: FileKind;
  text?: string;
  /** Where a link leads. */
  to?: string;
  ino: number;
}

function fakeFs(files: Record<string, Omit<FakeFile, 'ino'>>, onOpen?: (p: string) => void) {
  let ino = 1;
  const table = new Map<string, FakeFile>(Object.entries(files).map(([p, f]) => [p, { ...f, ino: ino++ }]));
  const enoent = () => Object.assign(new Error('ENOENT'), { code: 'ENOENT' });
  const facts = (f: FakeFile): FileFacts => ({ kind: f.kind, size: Buffer.byteLength(f.text ?? ''), dev: 1, ino: f.ino });
  const resolve = (p: string, hops = 0): string => {
    const f = table.get(p);
    if (f?.kind === 'symbolic link') return hops > 8 ? p : resolve(path.resolve(path.dirname(p), f.to!), hops + 1);
    return p;
  };
  const written: string[] = [];
  const fs: FileSystem = {
    realpath: (p) => {
      const r = resolve(p);
      if (!table.has(r) && ![...table.keys()].some((k) => k.startsWith(`${r}/`))) throw enoent();
      return r;
    },
    lstat: (p) => {
      const f = table.get(p);
      if (f) return facts(f);
      if ([...table.keys()].some((k) => k.startsWith(`${p}/`))) return { kind: 'directory', size: 0, dev: 1, ino: 0 };
      throw enoent();
    },
    readRegular: (p, max) => {
      onOpen?.(p);
      const f = table.get(p);
      if (!f) throw enoent();
      const ff = facts(f);
      return ff.kind === 'file' && ff.size <= max ? { facts: ff, bytes: Buffer.from(f.text ?? '') } : { facts: ff };
    },
    readEnds: (p, head, tail) => {
      const f = table.get(p)!;
      const b = Buffer.from(f.text ?? '');
      return { facts: facts(f), head: b.subarray(0, head), tail: b.subarray(Math.max(0, b.length - tail)) };
    },
    readdir: () => [],
    mkdirp: () => undefined,
    replace: (p, text) => {
      written.push(p);
      table.set(p, { kind: 'file', text, ino: ino++ });
    },
  };
  return { fs, table, written };
}

describe('ContainedReader', () => {
  it('reads a regular file inside the root and refuses one a link leads out to', () => {
    const { fs } = fakeFs({
      '/ws/a.clock.yaml': { kind: 'file', text: 'x: 1\n' },
      '/ws/out.clock.yaml': { kind: 'symbolic link', to: '/etc/hostname' },
      '/etc/hostname': { kind: 'file', text: 'box\n' },
    });
    const reader = new ContainedReader(fs, ['/ws']);
    expect(reader.read('/ws/a.clock.yaml')).toMatchObject({ text: 'x: 1\n' });
    expect(reader.read('/ws/out.clock.yaml')).toMatchObject({ refused: { code: 'outside-workspace' } });
    expect(reader.read('/ws/../etc/hostname')).toMatchObject({ refused: { code: 'outside-workspace' } });
  });

  it('judges the file it opened: a file swapped for a FIFO after the name was checked is refused', () => {
    const files = { '/ws/a.clock.yaml': { kind: 'file' as FileKind, text: 'x: 1\n' } };
    const { fs, table } = fakeFs(files, (p) => table.set(p, { kind: 'FIFO (named pipe)', ino: 99 }));
    expect(new ContainedReader(fs, ['/ws']).read('/ws/a.clock.yaml')).toMatchObject({ refused: { code: 'not-regular' } });
  });

  it('refuses a file above the limit with its size, without bytes', () => {
    const { fs } = fakeFs({ '/ws/big.wave.yaml': { kind: 'file', text: 'x'.repeat(100) } });
    expect(new ContainedReader(fs, ['/ws'], 99).read('/ws/big.wave.yaml')).toEqual({
      refused: { code: 'too-large', size: 100, reason: 'it is 100 bytes, more than waveplan reads from one file (a spec holds at most 256 KiB of text; a sample file at most 99 bytes)' },
    });
  });

  it('lets an unsaved buffer count where its name puts it, but not outside the root', () => {
    const { fs } = fakeFs({ '/ws/a.wave.yaml': { kind: 'file', text: '' } });
    const reader = new ContainedReader(fs, ['/ws']);
    expect(reader.mayReadBuffer('/ws/new.clock.yaml')).toBeNull();
    expect(reader.mayReadBuffer('/elsewhere/new.clock.yaml')).toMatchObject({ code: 'missing' });
  });
});

describe('isInside', () => {
  it('compares whole path components, never a prefix of a name', () => {
    expect(isInside('/ws/a', '/ws')).toBe(true);
    expect(isInside('/ws', '/ws')).toBe(true);
    expect(isInside('/wsx/a', '/ws')).toBe(false);
    expect(isInside('/ws/../a', '/ws')).toBe(false);
  });
});

describe('writeContained', () => {
  const policy = { inputs: [], force: false, anchor: '/ws' };

  it('writes nothing at all when one of several targets is refused', () => {
    const { fs, written } = fakeFs({ '/ws/out/b.h': { kind: 'file', text: 'hand-written\n' } });
    const refusals = writeContained(fs, [
      { file: '/ws/out/a.h', folder: '/ws/out', text: 'x' },
      { file: '/ws/out/b.h', folder: '/ws/out', text: 'y' },
    ], policy);
    expect(refusals).toEqual(['/ws/out/b.h exists and was not written by waveplan (it has no waveplan banner); move it away or pass --force to replace it']);
    expect(written).toEqual([]);
  });

  it('refuses a target outside its folder and one written twice', () => {
    const { fs } = fakeFs({});
    expect(writeContained(fs, [{ file: '/ws/a/../b.h', folder: '/ws/a', text: '' }], policy)[0]).toContain('outside the chosen folder');
    expect(writeContained(fs, [
      { file: '/ws/a/x.h', folder: '/ws/a', text: '' },
      { file: '/ws/a/x.h', folder: '/ws/a', text: '' },
    ], policy)).toEqual(['/ws/a/x.h would be written twice in one run']);
  });
});

describe('looksGenerated', () => {
  it('knows the banners of every writer and nothing else', () => {
    expect(looksGenerated('/*\n * a.h - generated by `waveplan export`; do not edit by hand.\n', '')).toBe(true);
    expect(looksGenerated('{\n  "generator": "waveplan export",', '')).toBe(true);
    expect(looksGenerated('x', 'x\nwaveplan check passed: 1 file, 1 output, 0 errors, 0 warnings\n')).toBe(true);
    expect(looksGenerated('/* a.h - my own */', '')).toBe(false);
    expect(looksGenerated('{"generator": "someone else"}', '')).toBe(false);
    expect(looksGenerated('', '')).toBe(true);
  });
});
