// Command-line words of `waveplan export` and `waveplan report`. Misuse is a UsageError; the
// commands turn it into a message, the usage text and exit code 2.

import { UsageError, parseWords } from '../cli/args';

export { UsageError };

export const EXPORT_USAGE = `usage: waveplan export <file.wave.yaml…> [--c <folder>] [--json <file>] [--root <folder>] [--force]

Writes the checked plans as firmware sources: per wave spec a C header and a C file holding each
output's sample table and divider register values (--c), and/or all plans as JSON (--json).
Only specs without errors are exported; --force exports anyway, marks every file as unchecked,
and still exits 1. A file is replaced only when waveplan wrote it (its banner says so), never
through a symbolic link and never over a spec or a file the specs read; --force also replaces
files waveplan did not write. Specs read files only inside --root (default: the folders of the
specs named). Exit codes: 0 written, 1 the specs have errors, 2 misuse, unreadable or refused files.
`;

export const REPORT_USAGE = `usage: waveplan report <file.wave.yaml…> --html <file> [--root <folder>] [--force]

Writes one self-contained HTML page (no network access needed) with each output's plan, its
pictures, the memory budget and the findings. The page is written even when the specs have
errors. An existing file is replaced only when waveplan wrote it (or with --force), never
through a symbolic link and never over a spec or a file the specs read. Specs read files only
inside --root (default: the folders of the specs named).
Exit codes: 0 no errors, 1 the specs have errors, 2 misuse, unreadable or refused files.
`;

export interface ExportOptions {
  specs: string[];
  cDir: string | null;
  json: string | null;
  root: string | null;
  force: boolean;
  help: boolean;
}

export interface ReportOptions {
  specs: string[];
  html: string | null;
  root: string | null;
  force: boolean;
  help: boolean;
}

export function parseExportArgs(argv: readonly string[]): ExportOptions {
  const p = parseWords(argv, ['--c', '--json', '--root'], ['--force', '--help']);
  const options: ExportOptions = {
    specs: p.positional,
    cDir: p.values.get('--c') ?? null,
    json: p.values.get('--json') ?? null,
    root: p.values.get('--root') ?? null,
    force: p.switches.has('--force'),
    help: p.switches.has('--help'),
  };
  if (options.help) return options;
  if (options.specs.length === 0) throw new UsageError('export needs at least one wave spec');
  if (options.cDir === null && options.json === null) throw new UsageError('export needs --c <folder>, --json <file> or both');
  return options;
}

export function parseReportArgs(argv: readonly string[]): ReportOptions {
  const p = parseWords(argv, ['--html', '--root'], ['--force', '--help']);
  const options: ReportOptions = {
    specs: p.positional,
    html: p.values.get('--html') ?? null,
    root: p.values.get('--root') ?? null,
    force: p.switches.has('--force'),
    help: p.switches.has('--help'),
  };
  if (options.help) return options;
  if (options.specs.length === 0) throw new UsageError('report needs at least one wave spec');
  if (options.html === null) throw new UsageError('report needs --html <file>');
  return options;
}
