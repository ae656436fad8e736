// Work-done progress for an analysis that takes long enough to notice: the client shows it only
// after the work has run for SHOW_AFTER_MS (a quick edit opens no indicator), with the outputs
// planned so far; done() closes it whatever happened.

import type { WorkDoneProgressServerReporter } from 'vscode-languageserver/node';
import type { Progress } from '../spec/wave-fast';

export type ProgressFactory = () => Promise<WorkDoneProgressServerReporter>;

const SHOW_AFTER_MS = 300;

export class SlowProgress {
  private readonly started = performance.now();
  private reporter: Promise<WorkDoneProgressServerReporter | undefined> | undefined;
  private closed = false;

  constructor(
    private readonly factory: ProgressFactory | undefined,
    private readonly file: string,
  ) {}

  report(p: Progress): void {
    if (!this.factory || this.closed || performance.now() - this.started < SHOW_AFTER_MS) return;
    const message = p.total > 0 ? `${this.file}: ${p.planned} of ${p.total} outputs planned` : `${this.file}: reading`;
    const percentage = p.total > 0 ? Math.floor((100 * p.planned) / p.total) : 0;
    if (!this.reporter) {
      this.reporter = this.factory().then(
        (r) => {
          r.begin('waveplan: planning', percentage, message, false);
          if (this.closed) r.done();
          return r;
        },
        () => undefined,
      );
      return;
    }
    void this.reporter.then((r) => {
      if (!this.closed) r?.report(percentage, message);
    });
  }

  done(): void {
    if (this.closed) return;
    this.closed = true;
    void this.reporter?.then((r) => r?.done());
  }
}
