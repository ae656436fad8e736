// The checker's view of the disk: finds spec files under the paths given, and reads each file at
// most once per run (a clock file shared by many wave specs, and also checked on its own, is read
// once) through the containment policy (spec/containment.ts): regular files inside the folders
// given, size checked first. `nodeFileSystem` is that policy's file system for every face.

import * as fs from 'node:fs';
import * as path from 'node:path';
import {
  ContainedReader,
  writeContained,
  type FileFacts,
  type FileKind,
  type FileSystem,
  type Refusal,
  type WritePolicy,
  type WriteTarget,
} from '../spec/containment';
import type { SpecHost } from '../spec/types';

export const SPEC_SUFFIXES = ['.wave.yaml', '.clock.yaml'] as const;

export class CliInputError extends Error {}

export const isSpecFile = (name: string): boolean => SPEC_SUFFIXES.some((s) => name.endsWith(s));

function kindOf(s: fs.Stats): FileKind {
  if (s.isFile()) return 'file';
  if (s.isDirectory()) return 'directory';
  if (s.isSymbolicLink()) return 'symbolic link';
  if (s.isFIFO()) return 'FIFO (named pipe)';
  if (s.isCharacterDevice()) return 'character device';
  if (s.isBlockDevice()) return 'block device';
  if (s.isSocket()) return 'socket';
  return 'special file';
}

const factsOf = (s: fs.Stats): FileFacts => ({ kind: kindOf(s), size: s.size, dev: s.dev, ino: s.ino });

// O_NOFOLLOW: a final link fails to open (ELOOP) instead of being followed; O_NONBLOCK: opening a
// FIFO returns at once instead of waiting for a writer. Neither changes reading a regular file.
const OPEN_FLAGS = fs.constants.O_RDONLY | (fs.constants.O_NOFOLLOW ?? 0) | (fs.constants.O_NONBLOCK ?? 0);

function readAt(fd: number, length: number, position: number): Uint8Array {
  const buffer = Buffer.alloc(length);
  let filled = 0;
  while (filled < length) {
    const n = fs.readSync(fd, buffer, filled, length - filled, position + filled);
    if (n === 0) break;
    filled += n;
  }
  return buffer.subarray(0, filled);
}

function withOpened<T>(file: string, body: (fd: number, facts: FileFacts) => T): T {
  const fd = fs.openSync(file, OPEN_FLAGS);
  try {
    return body(fd, factsOf(fs.fstatSync(fd)));
  } finally {
    fs.closeSync(fd);
  }
}

let replaceCounter = 0;

export const nodeFileSystem: FileSystem = {
  realpath: (p) => fs.realpathSync.native(p),
  lstat: (p) => factsOf(fs.lstatSync(p)),
  readRegular: (file, maxBytes) =>
    withOpened(file, (fd, facts) => {
      if (facts.kind !== 'file' || facts.size > maxBytes) return { facts };
      // One byte more than allowed tells a file that grew since fstat.
      const bytes = readAt(fd, Math.min(maxBytes, facts.size) + 1, 0);
      if (bytes.length > maxBytes) return { facts: { ...facts, size: bytes.length } };
      return { facts, bytes };
    }),
  readEnds: (file, head, tail) =>
    withOpened(file, (fd, facts) => {
      if (facts.kind !== 'file') return { facts, head: new Uint8Array(), tail: new Uint8Array() };
      return { facts, head: readAt(fd, Math.min(head, facts.size), 0), tail: readAt(fd, Math.min(tail, facts.size), Math.max(0, facts.size - tail)) };
    }),
  readdir: (p) => fs.readdirSync(p),
  mkdirp: (p) => void fs.mkdirSync(p, { recursive: true }),
  replace: (file, text) => {
    const temp = path.join(path.dirname(file), `.${path.basename(file)}.${process.pid}.${++replaceCounter}.tmp`);
    // 'wx': the temporary name must be new, so nothing planted there is written through.
    fs.writeFileSync(temp, text, { flag: 'wx' });
    try {
      fs.renameSync(temp, file);
    } catch (e) {
      fs.rmSync(temp, { force: true });
      throw e;
    }
  },
};

function walk(dir: string, found: string[]): void {
  let entries: fs.Dirent[];
  try {
    entries = fs.readdirSync(dir, { withFileTypes: true });
  } catch (e) {
    throw new CliInputError(`cannot read folder ${dir}: ${(e as NodeJS.ErrnoException).code ?? 'error'}`);
  }
  entries.sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
  for (const entry of entries) {
    if (entry.name.startsWith('.') || entry.name === 'node_modules') continue;
    const full = path.join(dir, entry.name);
    // Symbolic links are not followed: a link cycle would otherwise never end, and a link may
    // lead out of the folder. A spec reached through a link is checked when named itself.
    if (entry.isDirectory()) walk(full, found);
    else if (entry.isFile() && isSpecFile(entry.name)) found.push(full);
  }
}

/**
 * Absolute paths of the spec files named by `inputs` (files as given, folders searched
 * recursively), without duplicates, in the order given and sorted within each folder.
 */
export function collectSpecFiles(inputs: readonly string[], cwd: string): string[] {
  const seen = new Set<string>();
  const files: string[] = [];
  for (const input of inputs) {
    const abs = path.resolve(cwd, input);
    let stat: fs.Stats;
    try {
      stat = fs.statSync(abs);
    } catch {
      throw new CliInputError(`no such file or folder: ${input}`);
    }
    const found: string[] = [];
    if (stat.isDirectory()) walk(abs, found);
    else if (stat.isFile()) found.push(abs);
    else throw new CliInputError(`not a file or folder: ${input}`);
    for (const f of found) {
      if (!seen.has(f)) {
        seen.add(f);
        files.push(f);
      }
    }
  }
  return files;
}

/**
 * The workspace of a command-line run: `--root` when given, else every folder named and the
 * folder of every file named. Specs read nothing outside it.
 */
export function workspaceRoots(inputs: readonly string[], cwd: string, root: string | null): string[] {
  if (root !== null) return [path.resolve(cwd, root)];
  return inputs.map((input) => {
    const abs = path.resolve(cwd, input);
    try {
      return fs.statSync(abs).isDirectory() ? abs : path.dirname(abs);
    } catch {
      return path.dirname(abs);
    }
  });
}

type Read = { text: string; facts: FileFacts } | { refused: Refusal };

/** Reads files once each through the containment policy; a refusal is remembered too. */
export class DiskHost implements SpecHost {
  private readonly cache = new Map<string, Read>();
  private readonly reader: ContainedReader;
  /** Number of actual reads from the disk, for tests of the cache. */
  reads = 0;

  constructor(roots: readonly string[], files: FileSystem = nodeFileSystem) {
    this.reader = new ContainedReader(files, roots);
  }

  private load(file: string): Read {
    const key = path.resolve(file);
    let hit = this.cache.get(key);
    if (!hit) {
      this.reads++;
      const r = this.reader.read(key);
      hit = 'refused' in r ? r : { text: r.text, facts: r.facts };
      this.cache.set(key, hit);
    }
    return hit;
  }

  readFile(file: string): string | undefined {
    const r = this.load(file);
    return 'refused' in r ? undefined : r.text;
  }

  whyUnreadable(file: string): string | undefined {
    const r = this.load(file);
    return 'refused' in r ? r.refused.reason : undefined;
  }

  /** Why `file` was refused, with its code, or undefined when it was read. */
  refusal(file: string): Refusal | undefined {
    const r = this.load(file);
    return 'refused' in r ? r.refused : undefined;
  }

  /** Identities of every file read so far: the inputs a writer must never overwrite. */
  inputs(): FileFacts[] {
    return [...this.cache.values()].flatMap((r) => ('refused' in r ? [] : [r.facts]));
  }
}

/**
 * Writes every target, or none: each must pass the containment policy (no link, no input of the
 * run, no file waveplan did not write unless forced, nothing outside its folder). Throws
 * CliInputError naming every refusal.
 */
export function writeOutputs(targets: readonly WriteTarget[], policy: WritePolicy, files: FileSystem = nodeFileSystem): void {
  let refusals: string[];
  try {
    refusals = writeContained(files, targets, policy);
  } catch (e) {
    throw new CliInputError(`cannot write: ${(e as NodeJS.ErrnoException).code ?? String(e)}`);
  }
  if (refusals.length > 0) throw new CliInputError(`nothing written: ${refusals.join('; ')}`);
}
