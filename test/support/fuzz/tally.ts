// What a fuzz run found and how long it took: failures (each naming its seed and case), the
// slowest request, and counts for the closing figures.

import * as fs from 'node:fs';
import { replayCommand, type FuzzConfig } from './config';

export interface Slowest {
  what: string;
  ms: number;
}

export class Tally {
  readonly failures: string[] = [];
  readonly counts: Record<string, number> = {};
  slowestRequest: Slowest = { what: 'none', ms: 0 };
  slowestAnalysis: Slowest = { what: 'none', ms: 0 };
  rss: { start?: number; end?: number } = {};
  /** The session after which the server's RSS rose most, and by how much (KiB). */
  rssRise: { n: number; kib: number; what: string } = { n: -1, kib: 0, what: '' };
  private lastRss: number | undefined;
  private readonly failedCases = new Set<number>();

  constructor(readonly config: FuzzConfig) {}

  count(what: string, n = 1): void {
    this.counts[what] = (this.counts[what] ?? 0) + n;
  }

  /** Records the problems of case `n` (nothing when there are none). */
  fail(n: number, where: string, problems: readonly string[]): void {
    if (problems.length === 0) return;
    this.failedCases.add(n);
    const shown = problems.slice(0, 8).map((p) => `  - ${p.length > 600 ? `${p.slice(0, 600)}…` : p}`);
    if (problems.length > 8) shown.push(`  - … and ${problems.length - 8} more`);
    this.failures.push(`seed ${this.config.seed} case ${n} (${where}):\n${shown.join('\n')}\n  replay: ${replayCommand(this.config, n)}`);
  }

  request(what: string, ms: number): void {
    this.count('requests');
    if (ms > this.slowestRequest.ms) this.slowestRequest = { what, ms };
  }

  /** The server's RSS after session `n` (KiB), to find the session that grew it most. */
  rssAfter(n: number, kib: number | undefined, what: string): void {
    if (kib === undefined) return;
    const before = this.lastRss ?? this.rss.start ?? kib;
    if (kib - before > this.rssRise.kib) this.rssRise = { n, kib: kib - before, what };
    this.lastRss = kib;
  }

  analysis(what: string, ms: number): void {
    if (ms > this.slowestAnalysis.ms) this.slowestAnalysis = { what, ms };
  }

  get failedCaseCount(): number {
    return this.failedCases.size;
  }

  summary(wallMs: number): string {
    const mib = (kb?: number) => (kb === undefined ? '?' : `${(kb / 1024).toFixed(1)} MiB`);
    const counts = Object.entries(this.counts)
      .sort(([a], [b]) => (a < b ? -1 : 1))
      .map(([k, v]) => `${k} ${v}`)
      .join(', ');
    return [
      `fuzz: seed ${this.config.seed}, ${this.counts.cases ?? 0} cases, ${this.failedCaseCount} failing cases (${this.failures.length} failures), wall ${(wallMs / 1000).toFixed(1)} s`,
      `fuzz: slowest request ${this.slowestRequest.what} ${this.slowestRequest.ms.toFixed(0)} ms; slowest checker file ${this.slowestAnalysis.what} ${this.slowestAnalysis.ms.toFixed(0)} ms`,
      `fuzz: server RSS ${mib(this.rss.start)} at start, ${mib(this.rss.end)} at end; largest rise ${mib(this.rssRise.kib)} in case ${this.rssRise.n} (${this.rssRise.what})`,
      `fuzz: ${counts}`,
    ].join('\n');
  }
}

/** Resident memory of a process in KiB, from /proc/<pid>/status (VmRSS). */
export function rssKib(pid: number | undefined): number | undefined {
  if (pid === undefined) return undefined;
  try {
    const status = fs.readFileSync(`/proc/${pid}/status`, 'utf8');
    const m = /^VmRSS:\s+(\d+) kB/m.exec(status);
    return m ? Number(m[1]) : undefined;
  } catch {
    return undefined;
  }
}
