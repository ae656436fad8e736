// Where waveplan may read and write. Spec files are untrusted (CI checks other people's pull
// requests), so a spec reads only regular files inside the workspace folders, after resolving
// symbolic links, with the size checked before reading; and a writer never writes through a link,
// over an input of the run, over a file it did not generate (unless forced), or outside the folder
// it was given. The policy is here, once; the file system is injected (`FileSystem`), so the same
// rules serve the checker, the exporters and the language server, and tests can fake any file.

import * as nodePath from 'node:path';
import { formatFileSize } from '../../../shared-schema/src/quantity-format';
import { MAX_FILE_TEXT } from './source';

export type FileKind = 'file' | 'directory' | 'symbolic link' | 'FIFO (named pipe)' | 'character device' | 'block device' | 'socket' | 'special file';

export interface FileFacts {
  kind: FileKind;
  size: number;
  /** Device and inode: the file's identity, whatever name (link, hard link, `..`) reaches it. */
  dev: number;
  ino: number;
}

/** What the policy needs of a file system; every call may throw an error with a `code` (ENOENT…). */
export interface FileSystem {
  realpath(path: string): string;
  /** Facts of the name itself (a link is a link). */
  lstat(path: string): FileFacts;
  /**
   * Opens `path` without following a final link and without waiting on a FIFO, and reads at most
   * `maxBytes` from it when the opened file is a regular file no larger than that; `bytes` is
   * missing otherwise. The facts are of the opened file, so nothing can be swapped in between.
   */
  readRegular(path: string, maxBytes: number): { facts: FileFacts; bytes?: Uint8Array };
  /** The first `head` and last `tail` bytes of a regular file, opened as readRegular opens it. */
  readEnds(path: string, head: number, tail: number): { facts: FileFacts; head: Uint8Array; tail: Uint8Array };
  /** Names in a folder. */
  readdir(path: string): string[];
  /** Creates the folder and its missing parents. */
  mkdirp(path: string): void;
  /** Writes a new file beside `path` and renames it onto `path`: an existing name is replaced, never written through. */
  replace(path: string, text: string): void;
}

/**
 * Bytes read from one spec at most. The spec layer refuses more than MAX_FILE_CHARS of text, but a
 * file up to 3 MiB is still read, so the checker states its size from the text as the editor does
 * (a byte order mark is not text); a larger file's size on disk is reported without reading it.
 */
export const MAX_SPEC_BYTES = 3 * 1024 * 1024;

export type RefusalCode = 'missing' | 'outside-workspace' | 'not-regular' | 'too-large' | 'unreadable';

export interface Refusal {
  code: RefusalCode;
  /** Completes "Cannot read X: …", e.g. "it is a FIFO (named pipe), not a regular file". */
  reason: string;
  /** Bytes on disk, for `too-large`. */
  size?: number;
}

export type ReadResult = { text: string; real: string; facts: FileFacts } | { refused: Refusal };

const errno = (e: unknown): string => String((e as { code?: unknown })?.code ?? 'error');

/** True when `path` is `folder` or lies below it (both absolute and normalised). */
export function isInside(path: string, folder: string): boolean {
  const rel = nodePath.relative(folder, path);
  return rel === '' || (!rel.startsWith('..') && !nodePath.isAbsolute(rel));
}

function realOrResolved(fs: FileSystem, path: string): string {
  try {
    return fs.realpath(path);
  } catch {
    return nodePath.resolve(path);
  }
}

function missingReason(code: string): Refusal {
  if (code === 'EACCES' || code === 'EPERM') return { code: 'unreadable', reason: 'permission denied' };
  if (code === 'ELOOP') return { code: 'unreadable', reason: 'its symbolic links loop' };
  if (code === 'ENAMETOOLONG') return { code: 'missing', reason: 'the path is too long' };
  return { code: 'missing', reason: 'no such file' };
}

/** Reads spec files for one run: only regular files, only inside `roots`, only up to the size limit. */
export class ContainedReader {
  private readonly roots: string[];

  constructor(
    private readonly fs: FileSystem,
    roots: readonly string[],
    private readonly maxBytes = MAX_SPEC_BYTES,
  ) {
    this.roots = [...new Set(roots.map((r) => realOrResolved(fs, r)))];
  }

  get folders(): readonly string[] {
    return this.roots;
  }

  /** Where `path` leads and whether it may be read there, without opening it. */
  locate(path: string): { real: string } | { refused: Refusal } {
    const abs = nodePath.resolve(path);
    let real: string;
    try {
      real = this.fs.realpath(abs);
    } catch (e) {
      return { refused: missingReason(errno(e)) };
    }
    if (!this.roots.some((root) => isInside(real, root))) {
      const via = real === abs ? '' : ` (it resolves to ${real})`;
      const where = this.roots.length === 1 ? `the workspace folder ${this.roots[0]}` : `the workspace folders (${this.roots.join(', ')})`;
      return { refused: { code: 'outside-workspace', reason: `it lies outside ${where}${via}; waveplan reads only files inside the folders it checks` } };
    }
    return { real };
  }

  /**
   * Whether an editor buffer of `path` may be read: the same rule as the disk, except that a file
   * not saved yet counts where its name puts it.
   */
  mayReadBuffer(path: string): Refusal | null {
    const where = this.locate(path);
    if (!('refused' in where)) return null;
    if (where.refused.code === 'missing' && this.roots.some((root) => isInside(nodePath.resolve(path), root))) return null;
    return where.refused;
  }

  read(path: string): ReadResult {
    const where = this.locate(path);
    if ('refused' in where) return where;
    let opened: ReturnType<FileSystem['readRegular']>;
    try {
      opened = this.fs.readRegular(where.real, this.maxBytes);
    } catch (e) {
      // A socket cannot be opened at all (ENXIO): say what it is rather than "no such file".
      let kind: FileKind | undefined;
      try {
        kind = this.fs.lstat(where.real).kind;
      } catch {
        kind = undefined;
      }
      if (kind !== undefined && kind !== 'file') return { refused: { code: 'not-regular', reason: `it is a ${kind}, not a regular file` } };
      return { refused: missingReason(errno(e)) };
    }
    const { facts, bytes } = opened;
    if (facts.kind !== 'file') return { refused: { code: 'not-regular', reason: `it is a ${facts.kind}, not a regular file` } };
    if (facts.size > this.maxBytes || !bytes) {
      return { refused: { code: 'too-large', reason: `it is ${formatFileSize(facts.size)}, more than waveplan reads from one file (a spec holds at most ${MAX_FILE_TEXT} of text; a sample file at most ${formatFileSize(this.maxBytes)})`, size: facts.size } };
    }
    return { text: new TextDecoder('utf-8').decode(bytes), real: where.real, facts };
  }
}

/** Whose file is it: a file waveplan wrote carries one of these marks at its start or end. */
const GENERATED_HEAD: readonly RegExp[] = [
  // C header and source of `waveplan export --c`.
  /^\/\*\n \* [^\n]* - generated by `waveplan export`; do not edit by hand\./,
  // JSON plans of `waveplan export --json`.
  /^\{\s*"generator": "waveplan export"/,
  // The HTML page of `waveplan report`.
  /^<!doctype html>\n<html[^>]*><head><meta charset="utf-8">\n<meta name="generator" content="waveplan report">/,
  // `waveplan check --format json` and `--format sarif`.
  /^\{\s*"tool": \{\s*"name": "waveplan"/,
  /^\{\s*"\$schema": "[^"]*sarif[^"]*",\s*"version": "2\.1\.0",\s*"runs": \[\s*\{\s*"tool": \{\s*"driver": \{\s*"name": "waveplan"/,
];
/** `waveplan check --format text` ends with its summary line. */
const GENERATED_TAIL = /\nwaveplan check (?:passed|FAILED): [^\n]*\n$/;

/** True when the text is (the start and end of) a file waveplan writes; an empty file counts too. */
export function looksGenerated(head: string, tail: string): boolean {
  if (head === '') return true;
  return GENERATED_HEAD.some((re) => re.test(head)) || GENERATED_TAIL.test(tail);
}

export interface WriteTarget {
  /** Absolute path of the file to write. */
  file: string;
  /** The folder the user chose for it (`--c` folder, or the folder of `--json`/`--output`/`--html`). */
  folder: string;
  text: string;
}

export interface WritePolicy {
  /** Files the run read (specs and clock files): never overwritten, whatever name reaches them. */
  inputs: readonly FileFacts[];
  /** Replace files that exist but were not written by waveplan. */
  force: boolean;
  /**
   * Folder from which down no component of a target's path may be a symbolic link (the working
   * folder or the workspace folder); folders above it are the machine's own business.
   */
  anchor: string;
  /** When set, every target must lie inside this folder (the editor: the spec's workspace folder). */
  confine?: string;
  /** How messages name a path (the checker: relative to its working folder). */
  show?: (abs: string) => string;
}

const SPEC_NAME = /\.(wave|clock)\.ya?ml$/i;
const HEAD_BYTES = 4096;
const TAIL_BYTES = 512;

/** Why `target` must not be written, or null when it may be. Reads at most the existing file's first and last few KiB. */
export function writeRefusal(fs: FileSystem, target: WriteTarget, policy: WritePolicy): string | null {
  const file = nodePath.resolve(target.file);
  const folder = nodePath.resolve(target.folder);
  const show = policy.show ?? ((p: string) => p);
  if (!isInside(file, folder) || file === folder) return `${show(file)} is outside the chosen folder ${show(folder)}`;
  if (policy.confine !== undefined && !isInside(folder, nodePath.resolve(policy.confine)))
    return `the folder ${show(folder)} is outside the workspace folder ${show(policy.confine)}; waveplan writes only inside it`;
  if (SPEC_NAME.test(file)) return `${show(file)} has the name of a spec file; waveplan never writes one`;

  // Every existing component from the anchor (or the chosen folder, when it lies elsewhere) down.
  const anchor = nodePath.resolve(policy.anchor);
  const top = isInside(folder, anchor) ? anchor : folder;
  const parts = nodePath.relative(top, file).split(nodePath.sep).filter((p) => p !== '');
  let at = top;
  for (let i = 0; i <= parts.length; i++) {
    if (i > 0) at = nodePath.join(at, parts[i - 1]);
    let facts: FileFacts;
    try {
      facts = fs.lstat(at);
    } catch (e) {
      if (errno(e) === 'ENOENT') break;
      return `cannot inspect ${show(at)} (${errno(e)})`;
    }
    if (facts.kind === 'symbolic link' && (i > 0 || top === folder)) return `${show(at)} is a symbolic link; waveplan never writes through links`;
    const last = i === parts.length;
    if (!last && facts.kind !== 'directory' && facts.kind !== 'symbolic link') return `${show(at)} is a ${facts.kind}, not a folder`;
    if (!last) continue;
    if (facts.kind !== 'file') return `${show(file)} is a ${facts.kind}; waveplan writes only regular files`;
    if (policy.inputs.some((f) => f.dev === facts.dev && f.ino === facts.ino)) return `${show(file)} is a file this run reads; waveplan never overwrites its inputs`;
    if (policy.force) return null;
    let head = '';
    let tail = '';
    try {
      const ends = fs.readEnds(file, HEAD_BYTES, TAIL_BYTES);
      if (ends.facts.kind !== 'file') return `${show(file)} is a ${ends.facts.kind}; waveplan writes only regular files`;
      head = new TextDecoder().decode(ends.head);
      tail = new TextDecoder().decode(ends.tail);
    } catch (e) {
      return `cannot read ${show(file)} to see whether waveplan wrote it (${errno(e)})`;
    }
    if (!looksGenerated(head, tail)) return `${show(file)} exists and was not written by waveplan (it has no waveplan banner); move it away or pass --force to replace it`;
  }
  return null;
}

/**
 * Checks every target first and writes only when all may be written, so a refused run changes
 * nothing. Returns the refusals (empty when everything was written).
 */
export function writeContained(fs: FileSystem, targets: readonly WriteTarget[], policy: WritePolicy): string[] {
  const refusals = targets.map((t) => writeRefusal(fs, t, policy)).filter((r): r is string => r !== null);
  const names = new Set<string>();
  for (const t of targets) {
    const file = nodePath.resolve(t.file);
    if (names.has(file)) refusals.push(`${(policy.show ?? String)(file)} would be written twice in one run`);
    names.add(file);
  }
  if (refusals.length > 0) return [...new Set(refusals)];
  for (const t of targets) {
    fs.mkdirp(nodePath.dirname(nodePath.resolve(t.file)));
    fs.replace(nodePath.resolve(t.file), t.text);
  }
  return [];
}
