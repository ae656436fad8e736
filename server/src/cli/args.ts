// Command-line words of `waveplan check`. Misuse is a UsageError: the entry prints the message
// and the usage on stderr and exits 2.

export class UsageError extends Error {}

export type ReportFormat = 'text' | 'json' | 'sarif';
export const REPORT_FORMATS: readonly ReportFormat[] = ['text', 'json', 'sarif'];

export interface CheckOptions {
  paths: string[];
  format: ReportFormat;
  /** Write the report here instead of stdout. */
  output: string | null;
  /** The workspace folder specs may read from; null: the folders named (and those of the files named). */
  root: string | null;
  /** Replace an --output file that waveplan did not write. */
  force: boolean;
  help: boolean;
}

export interface ParsedWords {
  positional: string[];
  values: Map<string, string>;
  switches: Set<string>;
}

/**
 * The words of any subcommand: positional arguments, `--flag value` / `--flag=value` for the value
 * flags, bare switches; `--` ends the flags and `-h` means `--help`.
 */
export function parseWords(argv: readonly string[], valueFlags: readonly string[], switchFlags: readonly string[]): ParsedWords {
  const parsed: ParsedWords = { positional: [], values: new Map(), switches: new Set() };
  let flagsDone = false;
  for (let i = 0; i < argv.length; i++) {
    const word = argv[i];
    if (flagsDone || !word.startsWith('-') || word === '-') {
      parsed.positional.push(word);
      continue;
    }
    if (word === '--') {
      flagsDone = true;
      continue;
    }
    const eq = word.indexOf('=');
    const flag = eq >= 0 ? word.slice(0, eq) : word;
    if (flag === '-h') {
      parsed.switches.add('--help');
    } else if (switchFlags.includes(flag)) {
      if (eq >= 0) throw new UsageError(`${flag} takes no value`);
      parsed.switches.add(flag);
    } else if (valueFlags.includes(flag)) {
      const value = eq >= 0 ? word.slice(eq + 1) : argv[++i];
      if (value === undefined || value === '') throw new UsageError(`${flag} needs a value`);
      if (parsed.values.has(flag)) throw new UsageError(`${flag} given twice`);
      parsed.values.set(flag, value);
    } else {
      throw new UsageError(`unknown option ${flag}`);
    }
  }
  return parsed;
}

export function parseCheckArgs(argv: readonly string[]): CheckOptions {
  const p = parseWords(argv, ['--format', '--output', '--root'], ['--force', '--help']);
  const format = p.values.get('--format') ?? 'text';
  if (!(REPORT_FORMATS as readonly string[]).includes(format)) {
    throw new UsageError(`--format must be one of ${REPORT_FORMATS.join(', ')} (got "${format}")`);
  }
  const options: CheckOptions = {
    paths: p.positional,
    format: format as ReportFormat,
    output: p.values.get('--output') ?? null,
    root: p.values.get('--root') ?? null,
    force: p.switches.has('--force'),
    help: p.switches.has('--help'),
  };
  if (!options.help && options.paths.length === 0) throw new UsageError('check needs at least one file or folder');
  return options;
}
