// Open buffers and one analysis per (document, version). The SpecHost handed to the spec layer
// prefers an open buffer over the disk, so an unsaved clock file is what its wave specs see.

import * as fs from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { TextDocuments } from 'vscode-languageserver/node';
import { TextDocument } from 'vscode-languageserver-textdocument';
import type { Analysis, SpecHost } from '../spec/types';

export type AnalyzeFn = (path: string, text: string, host: SpecHost) => Analysis;

/** Files larger than this are not read from disk; the spec layer then reports them unreadable. */
const MAX_DISK_BYTES = 16 * 1024 * 1024;

/**
 * Analyses kept in memory. One of a 200-output spec holds about 1 MB of plans, so a hundred open
 * files would not fit the 100 MiB budget; the least recently used are dropped and re-analysed
 * on demand (their published diagnostics stay in the editor meanwhile).
 */
const KEPT_ANALYSES = 8;

export function uriToPath(uri: string): string {
  if (!uri.startsWith('file:')) return uri;
  try {
    return fileURLToPath(uri);
  } catch {
    return uri;
  }
}

export function pathToUri(path: string): string {
  return path.startsWith('/') || /^[A-Za-z]:[\\/]/.test(path) ? pathToFileURL(path).href : path;
}

export function isSpecPath(path: string): boolean {
  return path.endsWith('.wave.yaml') || path.endsWith('.clock.yaml');
}

export function readDisk(path: string): string | undefined {
  try {
    const stat = fs.statSync(path);
    if (!stat.isFile() || stat.size > MAX_DISK_BYTES) return undefined;
    return fs.readFileSync(path, 'utf8');
  } catch {
    return undefined;
  }
}

interface CacheEntry {
  version: number;
  analysis: Analysis;
  /** Other files the analysis read (the clock file of a wave spec). */
  reads: Set<string>;
}

export class SpecDocuments {
  readonly documents = new TextDocuments(TextDocument);
  private readonly cache = new Map<string, CacheEntry>();
  /** Open documents by file-system path, so the host can find a buffer from a resolved path. */
  private readonly byPath = new Map<string, string>();

  constructor(private readonly analyze: AnalyzeFn) {
    this.documents.onDidOpen((e) => this.byPath.set(uriToPath(e.document.uri), e.document.uri));
    this.documents.onDidClose((e) => {
      this.byPath.delete(uriToPath(e.document.uri));
      this.cache.delete(e.document.uri);
    });
  }

  get(uri: string): TextDocument | undefined {
    return this.documents.get(uri);
  }

  isOpen(path: string): boolean {
    return this.byPath.has(path);
  }

  uriOfPath(path: string): string {
    return this.byPath.get(path) ?? pathToUri(path);
  }

  /** Reads through open buffers first; records every path read so dependents can be found. */
  private host(reads: Set<string>): SpecHost {
    return {
      readFile: (path: string) => {
        reads.add(path);
        const uri = this.byPath.get(path);
        const open = uri === undefined ? undefined : this.documents.get(uri);
        return open ? open.getText() : readDisk(path);
      },
    };
  }

  /** The analysis of an open document at its current version (computed once per version). */
  analysisOf(uri: string): Analysis | undefined {
    const doc = this.documents.get(uri);
    if (!doc) return undefined;
    const hit = this.cache.get(uri);
    if (hit && hit.version === doc.version) {
      // Map order is the recency order: move the entry to the end.
      this.cache.delete(uri);
      this.cache.set(uri, hit);
      return hit.analysis;
    }
    const reads = new Set<string>();
    const analysis = this.analyze(uriToPath(uri), doc.getText(), this.host(reads));
    this.cache.delete(uri);
    this.cache.set(uri, { version: doc.version, analysis, reads });
    if (this.cache.size > KEPT_ANALYSES) this.cache.delete(this.cache.keys().next().value!);
    return analysis;
  }

  /** The cached analysis only if it is of `version`; used to drop stale results. */
  cachedAt(uri: string, version: number): Analysis | undefined {
    const hit = this.cache.get(uri);
    return hit && hit.version === version ? hit.analysis : undefined;
  }

  /** Analysis of a file that is not open (disk text; other files still through open buffers). */
  analyzeClosed(path: string): Analysis | undefined {
    const text = readDisk(path);
    if (text === undefined) return undefined;
    return this.analyze(path, text, this.host(new Set()));
  }

  /** The analysis of an open document's text with a quick fix applied (its preview); never cached. */
  analyzeEdited(uri: string, text: string): Analysis | undefined {
    if (!this.documents.get(uri)) return undefined;
    return this.analyze(uriToPath(uri), text, this.host(new Set()));
  }

  /** Drops cached analyses that read `path`, so the next request re-analyses them. */
  invalidateReaders(path: string): string[] {
    const dropped: string[] = [];
    for (const [uri, entry] of this.cache) {
      if (entry.reads.has(path)) {
        this.cache.delete(uri);
        dropped.push(uri);
      }
    }
    return dropped;
  }

  invalidate(uri: string): void {
    this.cache.delete(uri);
  }

  invalidateAll(): void {
    this.cache.clear();
  }
}
