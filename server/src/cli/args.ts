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
  help: boolean;
}

/** Flags that take a value, accepted as `--flag value` or `--flag=value`. */
const VALUE_FLAGS = new Set(['--format', '--output']);

export function parseCheckArgs(argv: readonly string[]): CheckOptions {
  const options: CheckOptions = { paths: [], format: 'text', output: null, help: false };
  let flagsDone = false;
  for (let i = 0; i < argv.length; i++) {
    const word = argv[i];
    if (flagsDone || !word.startsWith('-') || word === '-') {
      options.paths.push(word);
      continue;
    }
    if (word === '--') {
      flagsDone = true;
      continue;
    }
    if (word === '--help' || word === '-h') {
      options.help = true;
      continue;
    }
    const eq = word.indexOf('=');
    const flag = eq >= 0 ? word.slice(0, eq) : word;
    if (!VALUE_FLAGS.has(flag)) throw new UsageError(`unknown option ${flag}`);
    let value: string | undefined;
    if (eq >= 0) value = word.slice(eq + 1);
    else value = argv[++i];
    if (value === undefined || value === '') throw new UsageError(`${flag} needs a value`);
    if (flag === '--format') {
      if (!(REPORT_FORMATS as readonly string[]).includes(value)) {
        throw new UsageError(`--format must be one of ${REPORT_FORMATS.join(', ')} (got "${value}")`);
      }
      options.format = value as ReportFormat;
    } else {
      options.output = value;
    }
  }
  if (!options.help && options.paths.length === 0) throw new UsageError('check needs at least one file or folder');
  return options;
}
