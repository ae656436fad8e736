// Which wave specs read which clock file. A clock file edited in the editor, changed on disk,
// opened or closed re-checks every wave spec that references it, open or not; open buffers
// win over the disk (the SpecHost in documents.ts).

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

  record(analysis: Analysis): void {
    if (analysis.kind === 'wave') this.recordClock(analysis.path, analysis.clockPath);
  }

  /** The clock file a wave spec reads (from clockReference when the spec was not analysed). */
  recordClock(wave: string, clock: string | null): void {
    if (clock) this.clockOf.set(wave, clock);
    else this.clockOf.delete(wave);
  }

  forget(path: string): void {
    this.clockOf.delete(path);
  }

  dependents(clockPath: string): string[] {
    const out: string[] = [];
    for (const [wave, clock] of this.clockOf) if (clock === clockPath) out.push(wave);
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
