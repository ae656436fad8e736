// C identifiers for exported outputs. A spec's file name gives a prefix (bench-rig.wave.yaml →
// bench_rig) so two specs linked into one firmware never clash; each output name adds its own
// part: `-` becomes `_`, letters fold to lower case (arrays) or upper case (macros). Anything that
// would still not be a good C identifier, or that two outputs would share, is reported on the
// output's name — never silently renamed.

import * as path from 'node:path';
import type { Range, SpecDiagnostic } from '../spec/types';

export interface OutputIdentifiers {
  /** lower snake with the spec prefix: `bench_rig_coil_excitation`. */
  lower: string;
  /** upper snake with the spec prefix: `BENCH_RIG_COIL_EXCITATION`. */
  upper: string;
}

/** Codes of the export's own findings (the checker's catalogue lives in spec/codes.ts). */
export const EXPORT_CODES = {
  'c-identifier': 'The name does not give a usable C identifier.',
  'c-identifier-collision': 'Two names give the same C identifier.',
} as const;

const SNAKE = /^[a-z][a-z0-9]*(?:_[a-z0-9]+)*$/;

/**
 * The headers of the C standard library (ISO/IEC 9899:2024 §7.1.2, C89 to C23 — from memory for
 * the clause), which C++ also provides under these names. A generated `<prefix>.h` of one of these
 * names, in a folder given to the compiler with -I, would be found instead of the library's own
 * (angle-bracket includes search -I folders first) — our own `#include <stdint.h>` included.
 */
export const STANDARD_HEADERS: ReadonlySet<string> = new Set(
  ('assert complex ctype errno fenv float inttypes iso646 limits locale math setjmp signal stdalign stdarg stdatomic stdbit ' +
    'stdbool stdckdint stddef stdint stdio stdlib stdnoreturn string tgmath threads time uchar wchar wctype').split(' '),
);

export function snake(name: string): string {
  return name.replace(/-/g, '_').toLowerCase();
}

/** `bench-rig.wave.yaml` → `bench_rig`. */
export function specPrefix(file: string): string {
  return snake(path.basename(file).replace(/\.wave\.yaml$/, '').replace(/\.ya?ml$/, '').replace(/\./g, '_'));
}

function whyNotSnake(part: string): string | null {
  if (part === '') return 'it is empty';
  if (!/^[a-z0-9_]+$/.test(part)) return 'it holds characters other than letters, digits, - and _';
  if (/__/.test(part) || part.startsWith('_') || part.endsWith('_'))
    return 'it would give a double, leading or trailing underscore (reserved or confusing in C and C++)';
  return null;
}

export interface IdentifierResult {
  ids: Map<string, OutputIdentifiers>;
  diagnostics: SpecDiagnostic[];
}

const fileStart: Range = { start: { line: 0, character: 0 }, end: { line: 0, character: 0 } };

export function outputIdentifiers(
  file: string,
  outputs: ReadonlyArray<{ name: string; nameRange: Range }>,
): IdentifierResult {
  const diagnostics: SpecDiagnostic[] = [];
  const ids = new Map<string, OutputIdentifiers>();
  const prefix = specPrefix(file);
  if (!SNAKE.test(prefix)) {
    diagnostics.push({
      range: fileStart,
      severity: 'error',
      code: 'c-identifier',
      message: `The file name gives the C prefix "${prefix}", which is not a C identifier: rename the file to start with a letter and use only letters, digits and single - or _.`,
    });
    return { ids, diagnostics };
  }
  if (STANDARD_HEADERS.has(prefix)) {
    diagnostics.push({
      range: fileStart,
      severity: 'error',
      code: 'c-identifier',
      message: `The file name gives the header ${prefix}.h, which would shadow the C library's <${prefix}.h> wherever the generated folder is on the include path: rename the file, e.g. to ${prefix}-waves.wave.yaml.`,
    });
    return { ids, diagnostics };
  }
  const byLower = new Map<string, string>();
  for (const o of outputs) {
    const part = snake(o.name);
    const why = whyNotSnake(part);
    if (why) {
      diagnostics.push({
        range: o.nameRange,
        severity: 'error',
        code: 'c-identifier',
        output: o.name,
        message: `Output "${o.name}" cannot be exported as C because ${why}; rename it, e.g. "${part.replace(/_+/g, '_').replace(/^_|_$/g, '') || 'output'}".`,
      });
      continue;
    }
    const lower = `${prefix}_${part}`;
    const other = byLower.get(lower);
    if (other !== undefined) {
      diagnostics.push({
        range: o.nameRange,
        severity: 'error',
        code: 'c-identifier-collision',
        output: o.name,
        message: `Outputs "${other}" and "${o.name}" would both be exported as ${lower}; rename one of them.`,
      });
      continue;
    }
    byLower.set(lower, o.name);
    ids.set(o.name, { lower, upper: lower.toUpperCase() });
  }
  return { ids, diagnostics };
}
