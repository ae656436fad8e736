// The status bar's summary: the all-clear mark only when no waveplan error is left in any file;
// a file that does not parse (yaml-syntax, an error) is counted, not summarised as good.
import { describe, expect, it } from 'vitest';
import { countStatus, statusText, type Finding } from '../../../client/src/status-summary';

const d = (code: string, error = true, source = 'waveplan'): Finding => ({ code, error, source });

describe('status bar summary', () => {
  it('is all clear only without any waveplan error', () => {
    expect(statusText(countStatus([[d('fractional-plan', false)], []])).level).toBe('ok');
    // Another tool's errors are not ours to count.
    expect(statusText(countStatus([[d('x', true, 'yaml')]])).level).toBe('ok');
  });

  it('never calls a file with a syntax error good', () => {
    const shown = statusText(countStatus([[d('yaml-syntax')], [d('fractional-plan', false)]]));
    expect(shown.level).toBe('error');
    expect(shown.text).toBe('$(error) waveplan: 1 file with errors');
  });

  it('counts outputs out of tolerance first, then the files with other errors', () => {
    const counts = countStatus([[d('out-of-tolerance'), d('out-of-tolerance'), d('unknown-key')], [d('clock-unreadable'), d('yaml-syntax')], [d('out-of-tolerance')]]);
    expect(counts).toStrictEqual({ outOfTolerance: 3, filesWithErrors: 2 });
    expect(statusText(counts).text).toBe('$(error) waveplan: 3 outputs out of tolerance · 2 files with errors');
    expect(statusText(countStatus([[d('out-of-tolerance')]])).text).toBe('$(warning) waveplan: 1 output out of tolerance');
  });
});
