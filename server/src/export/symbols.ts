// Names a generated header puts into one firmware build: its macros (include guard included)
// and its tables' external symbols. Headers exported into one folder are built together, so no
// two of them may declare the same name — whether they come from this run or from an earlier
// export into that folder. The names are read from the headers' own text (the shape c-export.ts
// writes), so whatever else the export comes to declare is covered without a second list.

import * as path from 'node:path';
import type { FileSystem } from '../spec/containment';
import { looksGenerated } from '../spec/containment';

/** Defined by every header that needs it, behind #ifndef and identically: shared on purpose. */
const SHARED = new Set(['WAVEPLAN_ALIGN']);

export interface GeneratedHeader {
  /** The header's file name, e.g. `bench_rig.h`. */
  name: string;
  /** The spec it comes from, as its banner shows it. */
  spec: string;
  text: string;
}

/** Macro names and external symbols declared by a generated header. */
export function symbolsOf(text: string): string[] {
  const names = new Set<string>();
  for (const m of text.matchAll(/^#\s*define\s+([A-Za-z_]\w*)/gm)) if (!SHARED.has(m[1])) names.add(m[1]);
  for (const m of text.matchAll(/^extern\s+const\s+[\w\s]*?\b([A-Za-z_]\w*)\s*[[;]/gm)) names.add(m[1]);
  return [...names];
}

/** The spec a generated header names in its banner (`spec:   path`). */
export function specOfHeader(text: string): string {
  return /^ \* spec:\s+(.*)$/m.exec(text)?.[1] ?? '(unknown spec)';
}

/** One message per pair of headers that would both declare a name, naming both specs and headers. */
export function symbolClashes(headers: readonly GeneratedHeader[]): string[] {
  const owner = new Map<string, GeneratedHeader>();
  const clashes = new Map<string, { a: GeneratedHeader; b: GeneratedHeader; names: string[] }>();
  for (const h of headers) {
    for (const name of symbolsOf(h.text)) {
      const first = owner.get(name);
      if (!first) owner.set(name, h);
      else if (first.name !== h.name) {
        const key = `${first.name}\0${h.name}`;
        const clash = clashes.get(key) ?? { a: first, b: h, names: [] };
        clash.names.push(name);
        clashes.set(key, clash);
      }
    }
  }
  return [...clashes.values()].map(({ a, b, names }) => {
    const shown = names.slice(0, 3).join(', ') + (names.length > 3 ? ` and ${names.length - 3} more` : '');
    return `${a.spec} (${a.name}) and ${b.spec} (${b.name}) would both declare ${shown} in one build; rename an output or a spec so the names differ`;
  });
}

/**
 * Generated headers already in `folder` that this export does not replace, read without
 * following links; anything not written by waveplan is none of these.
 */
export function headersInFolder(fs: FileSystem, folder: string, replaced: ReadonlySet<string>): GeneratedHeader[] {
  let names: string[];
  try {
    names = fs.readdir(folder);
  } catch {
    return [];
  }
  const found: GeneratedHeader[] = [];
  for (const name of names.filter((n) => n.endsWith('.h') && !replaced.has(n)).sort()) {
    try {
      const { facts, bytes } = fs.readRegular(path.join(folder, name), 4 * 1024 * 1024);
      if (facts.kind !== 'file' || !bytes) continue;
      const text = new TextDecoder().decode(bytes);
      if (text !== '' && looksGenerated(text.slice(0, 4096), '')) found.push({ name, spec: specOfHeader(text), text });
    } catch {
      // A link, a vanished file or one we may not read: not a header of ours.
    }
  }
  return found;
}

/** Clashes of the headers about to be written into `folder` with each other and with the generated headers already there. */
export function folderClashes(fs: FileSystem, folder: string, headers: readonly GeneratedHeader[]): string[] {
  return symbolClashes([...headersInFolder(fs, folder, new Set(headers.map((h) => h.name))), ...headers]);
}
