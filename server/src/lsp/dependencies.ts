// Which wave specs read which clock file and which sample files. A clock file edited in the
// editor, changed on disk, opened or closed re-checks every wave spec that references it, open or
// not; open buffers win over the disk (the SpecHost in documents.ts). A sample file is known from
// the analyses that read it, and changes only on disk.

import * as fs from 'node:fs';
import * as nodePath from 'node:path';
import type { Analysis } from '../spec/types';
import type { DiagnosticsPublisher } from './diagnostics';
import { isSpecPath, type SpecDocuments } from './documents';
import { yieldToEvents } from './safe';

/** Bounds the workspace walk: a folder of specs is small, a home directory is not. */
const MAX_SPEC_FILES = 5000;
const MAX_DEPTH = 16;

export class Dependencies {
  /** wave spec path → the clock path its `clock:` resolved to. */
  private readonly clockOf = new Map<string, string>();

  constructor(
    private readonly docs: SpecDocuments,
    private readonly publisher: DiagnosticsPublisher,
  ) {}

  /** wave spec path → the sample files its outputs' `sample-file:` values resolved to. */
  private readonly samplesOf = new Map<string, string[]>();

  record(analysis: Analysis): void {
    if (analysis.kind !== 'wave') return;
    this.recordClock(analysis.path, analysis.clockPath);
    this.recordSamples(analysis.path, (analysis.sampleFiles ?? []).map((f) => f.path));
  }

  /** The sample files a wave spec reads (from sampleReferences when the spec was not analysed). */
  recordSamples(wave: string, samples: string[]): void {
    if (samples.length > 0) this.samplesOf.set(wave, samples);
    else this.samplesOf.delete(wave);
  }

  /** True when an analysed wave spec reads `path` as a sample file. */
  isSampleFile(path: string): boolean {
    for (const files of this.samplesOf.values()) if (files.includes(path)) return true;
    return false;
  }

  /** Every sample file an analysed wave spec reads. */
  sampleFiles(): Set<string> {
    return new Set([...this.samplesOf.values()].flat());
  }

  /** The clock file a wave spec reads (from clockReference when the spec was not analysed). */
  recordClock(wave: string, clock: string | null): void {
    if (clock) this.clockOf.set(wave, clock);
    else this.clockOf.delete(wave);
  }

  forget(path: string): void {
    this.clockOf.delete(path);
    this.samplesOf.delete(path);
  }

  /** The wave specs that read `path`, as their clock file or as a sample file. */
  dependents(path: string): string[] {
    const out: string[] = [];
    for (const [wave, clock] of this.clockOf) if (clock === path) out.push(wave);
    for (const [wave, files] of this.samplesOf) if (files.includes(path) && !out.includes(wave)) out.push(wave);
    return out;
  }

  /** Re-checks everything that reads `path` (open: re-scheduled; closed: analysed from disk). */
  async recheckReaders(path: string): Promise<void> {
    const dropped = new Set(this.docs.invalidateReaders(path));
    for (const uri of dropped) this.publisher.schedule(uri);
    for (const wave of this.dependents(path)) {
      if (this.docs.isOpen(wave)) {
        const uri = this.docs.uriOfPath(wave);
        if (!dropped.has(uri)) {
          this.docs.invalidate(uri);
          this.publisher.schedule(uri);
        }
      } else {
        // Long chains of closed files: let edits and cancellations in between them.
        await yieldToEvents();
        await this.publisher.publishClosed(wave);
      }
    }
  }
}

/** Every `*.wave.yaml` / `*.clock.yaml` under the folders (skips dot folders and node_modules). */
export function findSpecFiles(folders: string[]): string[] {
  const found: string[] = [];
  const walk = (dir: string, depth: number): void => {
    if (depth > MAX_DEPTH || found.length >= MAX_SPEC_FILES) return;
    let entries: fs.Dirent[];
    try {
      entries = fs.readdirSync(dir, { withFileTypes: true });
    } catch {
      return;
    }
    entries.sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
    for (const entry of entries) {
      if (found.length >= MAX_SPEC_FILES) return;
      const full = nodePath.join(dir, entry.name);
      if (entry.isDirectory()) {
        if (!entry.name.startsWith('.') && entry.name !== 'node_modules') walk(full, depth + 1);
      } else if (entry.isFile() && isSpecPath(entry.name)) {
        found.push(full);
      }
    }
  };
  for (const folder of folders) walk(folder, 0);
  return found;
}
