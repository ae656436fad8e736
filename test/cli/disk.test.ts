// Finding spec files and reading each once (server/src/cli/disk.ts).

import * as fs from 'node:fs';
import * as path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { parseCheckArgs, UsageError } from '../../server/src/cli/args';
import { CliInputError, collectSpecFiles, DiskHost } from '../../server/src/cli/disk';
import { MAX_SPEC_BYTES } from '../../server/src/spec/containment';
import { scratchDir } from '../support/cli';

const root = scratchDir('disk');
afterAll(() => fs.rmSync(root, { recursive: true, force: true }));

function touch(rel: string, text = 'x: 1\n'): string {
  const file = path.join(root, rel);
  fs.mkdirSync(path.dirname(file), { recursive: true });
  fs.writeFileSync(file, text);
  return file;
}

describe('collectSpecFiles', () => {
  const a = touch('rig/a.wave.yaml');
  const b = touch('rig/sub/b.clock.yaml');
  touch('rig/notes.yaml');
  touch('rig/node_modules/pkg/c.wave.yaml');
  touch('rig/.cache/d.wave.yaml');
  const odd = touch('rig/odd-name.yml');

  it('searches folders recursively for *.wave.yaml and *.clock.yaml, skipping node_modules and dot-folders', () => {
    expect(collectSpecFiles(['rig'], root)).toEqual([a, b]);
  });
  it('takes a file named on the command line whatever its name, once even when named twice', () => {
    expect(collectSpecFiles([odd, 'rig', 'rig/a.wave.yaml'], root)).toEqual([odd, a, b]);
  });
  it('rejects a path that does not exist with a one-line message', () => {
    expect(() => collectSpecFiles(['rig/missing'], root)).toThrow(CliInputError);
    expect(() => collectSpecFiles(['rig/missing'], root)).toThrow('no such file or folder: rig/missing');
  });
});

describe('DiskHost', () => {
  it('reads a file once however often it is asked for', () => {
    const file = touch('once/board.clock.yaml', 'system-clock: 150 MHz\n');
    const host = new DiskHost([root]);
    expect(host.readFile(file)).toBe('system-clock: 150 MHz\n');
    expect(host.readFile(path.join(root, 'once', '..', 'once', 'board.clock.yaml'))).toBe('system-clock: 150 MHz\n');
    expect(host.reads).toBe(1);
  });
  it('remembers a missing file as unreadable', () => {
    const host = new DiskHost([root]);
    expect(host.readFile(path.join(root, 'nope.clock.yaml'))).toBeUndefined();
    expect(host.readFile(path.join(root, 'nope.clock.yaml'))).toBeUndefined();
    expect(host.reads).toBe(1);
  });
  it('refuses a file above its limit without reading it, and says how large it is', () => {
    const file = path.join(root, 'huge.wave.yaml');
    fs.writeFileSync(file, Buffer.alloc(MAX_SPEC_BYTES + 1000, 0x61));
    const host = new DiskHost([root]);
    expect(host.readFile(file)).toBeUndefined();
    expect(host.refusal(file)).toMatchObject({ code: 'too-large', size: MAX_SPEC_BYTES + 1000 });
  });
});

describe('parseCheckArgs', () => {
  it('accepts --flag value and --flag=value, and -- before paths that look like flags', () => {
    expect(parseCheckArgs(['a', '--format', 'json', '--output=r.json', '--', '-odd'])).toEqual({
      paths: ['a', '-odd'],
      format: 'json',
      output: 'r.json',
      root: null,
      force: false,
      help: false,
    });
  });
  it('rejects unknown flags, unknown formats and missing paths', () => {
    expect(() => parseCheckArgs(['a', '--fmt', 'json'])).toThrow(UsageError);
    expect(() => parseCheckArgs(['a', '--format', 'yaml'])).toThrow('--format must be one of text, json, sarif');
    expect(() => parseCheckArgs([])).toThrow('check needs at least one file or folder');
  });
});
