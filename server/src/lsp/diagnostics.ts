// Debounced push diagnostics: the checker's codes, ranges and messages, with `source: "waveplan"`.
// A burst of edits is analysed once, at the newest version; a result for an older version is
// never published.

import {
  DiagnosticSeverity,
  type Connection,
  type Diagnostic,
} from 'vscode-languageserver/node';
import type { Analysis, Severity, SpecDiagnostic } from '../spec/types';
import { type SpecDocuments, uriToPath } from './documents';
import { type ProgressFactory, SlowProgress } from './progress';

export const SOURCE = 'waveplan';

/** What a quick fix needs besides the analysis: which output, and of which version. */
export interface DiagnosticData {
  output?: string;
  version?: number;
}

const SEVERITY: Record<Severity, DiagnosticSeverity> = {
  error: DiagnosticSeverity.Error,
  warning: DiagnosticSeverity.Warning,
  information: DiagnosticSeverity.Information,
};

export function toLspDiagnostic(d: SpecDiagnostic, version?: number): Diagnostic {
  const data: DiagnosticData = { output: d.output, version };
  return {
    range: d.range,
    severity: SEVERITY[d.severity] ?? DiagnosticSeverity.Error,
    code: d.code,
    source: SOURCE,
    message: d.message,
    data,
  };
}

export function toLspDiagnostics(analysis: Analysis, version?: number): Diagnostic[] {
  return analysis.diagnostics.map((d) => toLspDiagnostic(d, version));
}

export class DiagnosticsPublisher {
  private readonly timers = new Map<string, NodeJS.Timeout>();
  /** Called with every fresh analysis, so the dependency map follows the text. */
  onAnalysed: (analysis: Analysis) => void = () => {};
  /** Called when an analysis that requests may have seen partial is complete. */
  onSliced: () => void = () => {};
  /** Opens a progress indicator in the client (when it supports them). */
  progress: ProgressFactory | undefined;

  constructor(
    private readonly connection: Connection,
    private readonly docs: SpecDocuments,
    /** Coalesces a burst of keystrokes; small, because the budget is edit → diagnostics ≤ 50 ms. */
    private readonly delayMs = 10,
  ) {}

  /** Re-checks an open document after the debounce; a newer call for the same URI replaces it. */
  schedule(uri: string): void {
    const pending = this.timers.get(uri);
    if (pending) clearTimeout(pending);
    this.timers.set(
      uri,
      setTimeout(() => {
        this.timers.delete(uri);
        void this.publishOpen(uri).catch(() => undefined);
      }, this.delayMs),
    );
  }

  /**
   * Analyses the current version (in slices, so other requests are answered meanwhile) and
   * publishes it; a version replaced before its analysis is done is dropped, never shown.
   */
  async publishOpen(uri: string): Promise<Analysis | undefined> {
    const doc = this.docs.get(uri);
    if (!doc) return undefined;
    const version = doc.version;
    const progress = new SlowProgress(this.progress, uriToPath(uri).split(/[\\/]/).pop() ?? uri);
    try {
      const made = await this.docs.analysisInSlices(doc, (p) => progress.report(p));
      if (!made || this.docs.get(uri) !== doc) return undefined;
      this.onAnalysed(made.analysis);
      void this.connection.sendDiagnostics({ uri, version, diagnostics: toLspDiagnostics(made.analysis, version) });
      // Requests answered while it was being made saw it partial: let the editor ask again.
      if (made.sliced) this.onSliced();
      return made.analysis;
    } finally {
      progress.done();
    }
  }

  /** Checks a file that is not open (a wave spec whose clock changed) and publishes the result. */
  async publishClosed(path: string): Promise<Analysis | undefined> {
    if (this.docs.isOpen(path)) return undefined;
    const analysis = await this.docs.analyzeClosedInSlices(path);
    // Opened meanwhile: the buffer is what counts now.
    if (this.docs.isOpen(path)) return undefined;
    const uri = this.docs.uriOfPath(path);
    if (!analysis) {
      void this.connection.sendDiagnostics({ uri, diagnostics: [] });
      return undefined;
    }
    this.onAnalysed(analysis);
    void this.connection.sendDiagnostics({ uri, diagnostics: toLspDiagnostics(analysis) });
    return analysis;
  }

  clear(uri: string): void {
    const pending = this.timers.get(uri);
    if (pending) clearTimeout(pending);
    this.timers.delete(uri);
    void this.connection.sendDiagnostics({ uri, diagnostics: [] });
  }
}
