// Debounced push diagnostics: the checker's codes, ranges and messages, with `source: "waveplan"`.
// A burst of edits is analysed once, at the newest version; a result for an older version is
// never published.

import {
  DiagnosticSeverity,
  type Connection,
  type Diagnostic,
} from 'vscode-languageserver/node';
import type { Analysis, Severity, SpecDiagnostic } from '../spec/types';
import type { SpecDocuments } from './documents';

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
        this.publishOpen(uri);
      }, this.delayMs),
    );
  }

  /** Analyses the current version now and publishes it. */
  publishOpen(uri: string): void {
    const doc = this.docs.get(uri);
    if (!doc) return;
    const version = doc.version;
    const analysis = this.docs.analysisOf(doc);
    // The analysis is synchronous, but guard anyway: only the newest text may be shown.
    if (this.docs.get(uri) !== doc) return;
    this.onAnalysed(analysis);
    void this.connection.sendDiagnostics({ uri, version, diagnostics: toLspDiagnostics(analysis, version) });
  }

  /** Checks a file that is not open (a wave spec whose clock changed) and publishes the result. */
  publishClosed(path: string): Analysis | undefined {
    if (this.docs.isOpen(path)) return undefined;
    const analysis = this.docs.analyzeClosed(path);
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
