// Open buffers and one analysis per document snapshot. Every change makes a new TextDocument
// (the library's default updates one in place), so a request that captured its document keeps
// the text, positions and analysis of the version it was asked about, and a client that sends a
// new text under an old version number still gets a new analysis: caches key on the snapshot,
// not on the version number. The SpecHost handed to the spec layer prefers an open buffer over
// the disk, so an unsaved clock file is what its wave specs see.

import { dirname } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { TextDocuments, type TextDocumentContentChangeEvent, type TextDocumentsConfiguration } from 'vscode-languageserver/node';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { nodeFileSystem } from '../cli/disk';
import { ContainedReader } from '../spec/containment';
import type { AnalysisRun } from '../spec/analyze';
import type { Analysis, SpecHost } from '../spec/types';
import type { Progress } from '../spec/wave-fast';
import { yieldToEvents } from './safe';

export type AnalyzeFn = (path: string, text: string, host: SpecHost) => Analysis;
export type AnalyzeInStepsFn = (path: string, text: string, host: SpecHost) => AnalysisRun;

/**
 * How long an analysis runs before it lets other messages in (a request, a newer edit, a
 * cancellation). One output's planning is never split, so a slice can run over by one plan.
 */
const SLICE_MS = 15;

/** An analysis being made in slices. */
interface Job {
  doc: TextDocument;
  run: AnalysisRun;
  done: Promise<Analysis | undefined>;
  /** Whether it let other messages in at least once (so requests may have seen it partial). */
  sliced: boolean;
  /** How far it has come, and who wants to know. */
  last?: Progress;
  progress?: (p: Progress) => void;
}

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

/**
 * The containment policy (spec/containment.ts) for the editor: specs read only inside the
 * workspace folders — with none open, inside the folder of the spec being analysed.
 */
export class WorkspaceReads {
  private folders: string[] = [];
  private readers = new Map<string, ContainedReader>();

  setFolders(folders: readonly string[]): void {
    this.folders = [...folders];
    this.readers.clear();
  }

  /** The reader for analyses of `spec`. */
  readerFor(spec: string): ContainedReader {
    const roots = this.folders.length > 0 ? this.folders : [dirname(spec)];
    const key = roots.join('\0');
    let reader = this.readers.get(key);
    if (!reader) {
      if (this.readers.size > 16) this.readers.clear();
      reader = new ContainedReader(nodeFileSystem, roots);
      this.readers.set(key, reader);
    }
    return reader;
  }
}

/** Documents that never change: an edit gives a new one (incremental changes applied to a copy). */
const SNAPSHOTS: TextDocumentsConfiguration<TextDocument> = {
  create: (uri, languageId, version, content) => TextDocument.create(uri, languageId, version, content),
  update: (doc: TextDocument, changes: TextDocumentContentChangeEvent[], version: number) =>
    TextDocument.update(TextDocument.create(doc.uri, doc.languageId, doc.version, doc.getText()), changes, version),
};

interface CacheEntry {
  doc: TextDocument;
  analysis: Analysis;
  /** Other files the analysis read (the clock file of a wave spec). */
  reads: Set<string>;
}

export class SpecDocuments {
  readonly documents = new TextDocuments(SNAPSHOTS);
  private readonly cache = new Map<string, CacheEntry>();
  /** Open documents by file-system path, so the host can find a buffer from a resolved path. */
  private readonly byPath = new Map<string, string>();
  /** Where analyses may read: set from the workspace folders by the server. */
  readonly workspace = new WorkspaceReads();

  private readonly jobs = new Map<string, Job>();

  constructor(
    private readonly analyze: AnalyzeFn,
    private readonly analyzeSteps?: AnalyzeInStepsFn,
  ) {
    this.documents.onDidOpen((e) => this.byPath.set(uriToPath(e.document.uri), e.document.uri));
    this.documents.onDidClose((e) => {
      this.byPath.delete(uriToPath(e.document.uri));
      this.cache.delete(e.document.uri);
      this.jobs.delete(e.document.uri);
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
  private host(reads: Set<string>, spec: string): SpecHost {
    const inner = this.hostFor(spec);
    return {
      readFile: (path: string) => {
        reads.add(path);
        return inner.readFile(path);
      },
      whyUnreadable: inner.whyUnreadable,
    };
  }

  /**
   * How an analysis of `spec` reads other files: open buffers first, then the disk, both only
   * where the workspace policy allows (a refusal says why).
   */
  hostFor(spec: string): SpecHost {
    const reader = this.workspace.readerFor(spec);
    const why = new Map<string, string>();
    return {
      readFile: (path: string) => {
        const uri = this.byPath.get(path);
        const open = uri === undefined ? undefined : this.documents.get(uri);
        if (open) {
          const refused = reader.mayReadBuffer(path);
          if (refused) why.set(path, refused.reason);
          return refused ? undefined : open.getText();
        }
        const read = reader.read(path);
        if ('refused' in read) {
          why.set(path, read.refused.reason);
          return undefined;
        }
        return read.text;
      },
      whyUnreadable: (path: string) => why.get(path),
    };
  }

  /**
   * The analysis of an open document's snapshot (computed once per snapshot). A snapshot older
   * than the open one (a request that waited) is analysed without displacing the newest.
   */
  analysisOf(doc: TextDocument): Analysis {
    const hit = this.cached(doc);
    if (hit) return hit;
    // Being made in slices: a request meanwhile answers from what it holds so far (every
    // finding before planning, the outputs planned), never from another version's analysis.
    const job = this.jobs.get(doc.uri);
    if (job?.doc === doc) return job.run.analysis;
    if (this.analyzeSteps) return this.start(doc).run.analysis;
    const reads = new Set<string>();
    const analysis = this.analyze(uriToPath(doc.uri), doc.getText(), this.host(reads, uriToPath(doc.uri)));
    this.keep(doc, analysis, reads);
    return analysis;
  }

  /** True while the snapshot's analysis is being made in slices (analysisOf then gives it partial). */
  isPartial(doc: TextDocument): boolean {
    return this.jobs.get(doc.uri)?.doc === doc;
  }

  private cached(doc: TextDocument): Analysis | undefined {
    const hit = this.cache.get(doc.uri);
    if (!hit || hit.doc !== doc) return undefined;
    // Map order is the recency order: move the entry to the end.
    this.cache.delete(doc.uri);
    this.cache.set(doc.uri, hit);
    return hit.analysis;
  }

  private keep(doc: TextDocument, analysis: Analysis, reads: Set<string>): void {
    if (this.documents.get(doc.uri) !== doc) return;
    this.cache.delete(doc.uri);
    this.cache.set(doc.uri, { doc, analysis, reads });
    if (this.cache.size > KEPT_ANALYSES) this.cache.delete(this.cache.keys().next().value!);
  }

  /**
   * The analysis of the snapshot, made in slices of SLICE_MS with other messages let in between,
   * so the server answers while a large file is planned. Undefined when the snapshot stopped being
   * the open one before the analysis was done: the newest text is planned first, and the outputs
   * planned meanwhile stay in the spec layer's memo for it. `sliced` tells the caller whether
   * requests may have seen the analysis partial.
   */
  async analysisInSlices(doc: TextDocument, progress?: (p: Progress) => void): Promise<{ analysis: Analysis; sliced: boolean } | undefined> {
    const hit = this.cached(doc);
    if (hit) return { analysis: hit, sliced: false };
    if (!this.analyzeSteps) return { analysis: this.analysisOf(doc), sliced: false };
    const running = this.jobs.get(doc.uri);
    const job = running?.doc === doc ? running : this.start(doc);
    job.progress = progress;
    const analysis = await job.done;
    return analysis && { analysis, sliced: job.sliced };
  }

  /**
   * Starts the snapshot's analysis: its first slice now (a small file is done in it), the rest
   * after other messages. A snapshot older than the open one is analysed but never kept.
   */
  private start(doc: TextDocument): Job {
    const uri = doc.uri;
    const reads = new Set<string>();
    const run = this.analyzeSteps!(uriToPath(uri), doc.getText(), this.host(reads, uriToPath(uri)));
    const job: Job = { doc, run, sliced: false, done: Promise.resolve(undefined) };
    const finished = this.slice(job);
    if (finished) {
      this.keep(doc, finished, reads);
      job.done = Promise.resolve(finished);
      return job;
    }
    this.jobs.set(uri, job);
    job.done = this.rest(job, reads).finally(() => {
      if (this.jobs.get(uri) === job) this.jobs.delete(uri);
    });
    return job;
  }

  /** Runs the analysis for SLICE_MS; its result when it is done within them. */
  private slice(job: Job): Analysis | undefined {
    const start = performance.now();
    for (;;) {
      const step = job.run.steps.next();
      if (step.done) return step.value;
      job.last = step.value;
      if (performance.now() - start >= SLICE_MS) return undefined;
    }
  }

  private async rest(job: Job, reads: Set<string>): Promise<Analysis | undefined> {
    const uri = job.doc.uri;
    for (;;) {
      if (job.last) job.progress?.(job.last);
      job.sliced = true;
      await yieldToEvents();
      // A newer text, a close or a changed clock file: this analysis is no longer wanted.
      if (this.documents.get(uri) !== job.doc || this.jobs.get(uri) !== job) return undefined;
      const finished = this.slice(job);
      if (finished) {
        this.keep(job.doc, finished, reads);
        return finished;
      }
    }
  }

  /** Analysis of a file that is not open (disk text; other files still through open buffers). */
  analyzeClosed(path: string): Analysis | undefined {
    const host = this.hostFor(path);
    const text = host.readFile(path);
    if (text === undefined) return undefined;
    return this.analyze(path, text, this.host(new Set(), path));
  }

  /** The same, made in slices with other messages let in between (a closed file is never stale). */
  async analyzeClosedInSlices(path: string): Promise<Analysis | undefined> {
    const text = this.hostFor(path).readFile(path);
    if (text === undefined) return undefined;
    if (!this.analyzeSteps) return this.analyze(path, text, this.host(new Set(), path));
    const { steps } = this.analyzeSteps(path, text, this.host(new Set(), path));
    let sliceStart = performance.now();
    for (;;) {
      const step = steps.next();
      if (step.done) return step.value;
      if (performance.now() - sliceStart < SLICE_MS) continue;
      await yieldToEvents();
      sliceStart = performance.now();
    }
  }

  /** The analysis of an open document's text with a quick fix applied (its preview); never cached. */
  analyzeEdited(uri: string, text: string): Analysis | undefined {
    if (!this.documents.get(uri)) return undefined;
    return this.analyze(uriToPath(uri), text, this.host(new Set(), uriToPath(uri)));
  }

  /** Drops cached analyses that read `path`, so the next request re-analyses them. */
  invalidateReaders(path: string): string[] {
    const dropped: string[] = [];
    // An analysis being made may have read the old text already: start it again.
    for (const uri of this.jobs.keys()) dropped.push(uri);
    this.jobs.clear();
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
    this.jobs.delete(uri);
  }

  invalidateAll(): void {
    this.cache.clear();
    this.jobs.clear();
  }
}
