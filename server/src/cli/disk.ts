// The checker's view of the disk: finds spec files under the paths given, and reads each file at
// most once per run (a clock file shared by many wave specs, and also checked on its own, is read
// once). Nothing here writes.

import * as fs from 'node:fs';
import * as path from 'node:path';
import type { SpecHost } from '../spec/types';

export const SPEC_SUFFIXES = ['.wave.yaml', '.clock.yaml'] as const;

/**
 * Bytes read from one file. The spec layer refuses files far smaller than this with a ranged
 * diagnostic; reading a little more than its limit (instead of the whole file) lets it say so
 * without the checker loading a multi-gigabyte file into memory.
 */
export const READ_LIMIT_BYTES = 16 * 1024 * 1024;

export class CliInputError extends Error {}

export const isSpecFile = (name: string): boolean => SPEC_SUFFIXES.some((s) => name.endsWith(s));

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
    // Symbolic links are not followed: a link cycle would otherwise never end.
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

function readCapped(file: string): string {
  const fd = fs.openSync(file, 'r');
  try {
    const size = fs.fstatSync(fd).size;
    const buffer = Buffer.alloc(Math.min(size, READ_LIMIT_BYTES));
    let filled = 0;
    while (filled < buffer.length) {
      const n = fs.readSync(fd, buffer, filled, buffer.length - filled, filled);
      if (n === 0) break;
      filled += n;
    }
    return buffer.subarray(0, filled).toString('utf8');
  } finally {
    fs.closeSync(fd);
  }
}

/** Reads files once each; `undefined` marks a file that could not be read (remembered too). */
export class DiskHost implements SpecHost {
  private readonly cache = new Map<string, string | undefined>();
  /** Number of actual reads from the disk, for tests of the cache. */
  reads = 0;

  readFile(file: string): string | undefined {
    const key = path.resolve(file);
    if (this.cache.has(key)) return this.cache.get(key);
    let text: string | undefined;
    try {
      this.reads++;
      text = readCapped(key);
    } catch {
      text = undefined;
    }
    this.cache.set(key, text);
    return text;
  }
}
