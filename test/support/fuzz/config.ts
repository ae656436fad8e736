// The size of a fuzz run, from the environment. CI runs the defaults (about a minute on two
// cores); `npm run fuzz` sets FUZZ_RUN=long, and FUZZ_CASES / FUZZ_SEED / FUZZ_ONLY choose a run
// or replay one case of it.

import { MAX_FILE_CHARS } from '../../../server/src/spec/source';

export interface FuzzConfig {
  seed: number;
  /** Cases 0 … cases − 1: each a mutated file through the analysis and the checker. */
  cases: number;
  /** Of every this many cases, the first drives an editing session and the middle one a fixing session. */
  sessionEvery: number;
  /** Edits in one session. */
  edits: number;
  /** Cases with n % bigEvery === bigEvery / 2 are large files, sizes taken in turn from bigSizes. */
  bigEvery: number;
  /** UTF-16 code units of the large files: just under the spec layer's limit, and the large size. */
  bigSizes: number[];
  /** Run only this case (a replay), or every case when undefined. */
  only?: number;
  long: boolean;
}


function intFrom(name: string, fallback: number): number {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const value = Number(raw);
  if (!Number.isInteger(value) || value < 0) throw new Error(`${name} must be a whole number, got "${raw}"`);
  return value;
}

export function fuzzConfig(): FuzzConfig {
  const long = process.env.FUZZ_RUN === 'long';
  const bigMb = Number(process.env.FUZZ_BIG_MB ?? (long ? 10 : 2));
  const only = process.env.FUZZ_ONLY === undefined || process.env.FUZZ_ONLY === '' ? undefined : intFrom('FUZZ_ONLY', 0);
  return {
    seed: intFrom('FUZZ_SEED', 20261203),
    cases: intFrom('FUZZ_CASES', long ? 4000 : 1000),
    sessionEvery: intFrom('FUZZ_SESSION_EVERY', 10),
    edits: intFrom('FUZZ_EDITS', long ? 24 : 12),
    bigEvery: intFrom('FUZZ_BIG_EVERY', 200),
    bigSizes: [MAX_FILE_CHARS - 4096, Math.round(bigMb * 1e6)],
    only,
    long,
  };
}

/** The command that replays case `n` alone, whatever the mode it ran in. */
export function replayCommand(config: FuzzConfig, n: number): string {
  return `FUZZ_SEED=${config.seed} FUZZ_CASES=${config.cases} FUZZ_ONLY=${n} FUZZ_EDITS=${config.edits} FUZZ_BIG_MB=${config.bigSizes[1] / 1e6} npm run fuzz`;
}

/** True when case `n` is one to run in this configuration. */
export const runsCase = (config: FuzzConfig, n: number): boolean => config.only === undefined || config.only === n;

/** The server session case `n` drives, if any (see session.ts). */
export function sessionKind(config: FuzzConfig, n: number): 'edits' | 'fixes' | undefined {
  if (n % config.sessionEvery === 0) return 'edits';
  if (config.sessionEvery > 1 && n % config.sessionEvery === Math.floor(config.sessionEvery / 2)) return 'fixes';
  return undefined;
}
