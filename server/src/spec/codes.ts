// The catalogue of diagnostic codes. Quick fixes, the checker, the SARIF rules and the docs all key
// on these codes; a code once published keeps its meaning.

import type { Severity } from './types';

export interface CodeInfo {
  severity: Severity;
  /** A few words, e.g. for a SARIF rule's shortDescription. */
  title: string;
  /** What it means and what to do, for docs and a SARIF rule's help text. */
  help: string;
}

export const CODES = {
  'file-too-large': {
    severity: 'error',
    title: 'File too large',
    help: 'The file is larger than waveplan reads (256 KiB of text); a spec is a few kilobytes. Check that the right file is named, or split it.',
  },
  'too-complex': {
    severity: 'error',
    title: 'YAML too deeply nested or too many aliases',
    help: 'The YAML nests deeper than a spec ever needs or expands too many aliases; waveplan stops reading it rather than run out of memory. Write the keys out plainly.',
  },
  'yaml-syntax': {
    severity: 'error',
    title: 'YAML syntax error',
    help: 'The text is not valid YAML (for example a bad indent, an unclosed quote or bracket, a tab used for indentation). Fix the syntax at the marked place; nothing else is checked until it parses.',
  },
  'unknown-key': {
    severity: 'error',
    title: 'Unknown key',
    help: 'The key is not part of the file format. It is often a misspelling; the message suggests the nearest known key. The file reference lists every key.',
  },
  'duplicate-key': {
    severity: 'error',
    title: 'Duplicate key',
    help: 'A key appears twice in the same mapping. Only the first is read; remove or rename the other.',
  },
  'duplicate-output': {
    severity: 'error',
    title: 'Duplicate output name',
    help: 'Two outputs share a name. Only the first is planned; rename the other so that each output (and its exported table) has its own name.',
  },
  'bad-name': {
    severity: 'error',
    title: 'Name not allowed',
    help: 'Output names become identifiers in exported tables: start with a letter or _, then letters, digits, _ or -, at most 64 characters. Divider stage names become parts of exported names too: a letter, then letters and digits joined by single _, at most 32.',
  },
  'missing-key': {
    severity: 'error',
    title: 'Missing key',
    help: 'A required key is absent. The message names it and gives an example value.',
  },
  'wrong-type': {
    severity: 'error',
    title: 'Wrong kind of value',
    help: 'The value has the wrong type: text where a number belongs, a list where a mapping belongs, an empty value. The message says what belongs there.',
  },
  'bad-choice': {
    severity: 'error',
    title: 'Value not one of the choices',
    help: 'The key takes one of a fixed set of words (for example shape: sine, square, triangle or sawtooth). The message lists them.',
  },
  'bad-unit': {
    severity: 'error',
    title: 'Unknown or wrong unit',
    help: 'The unit is unknown, belongs to another quantity, or is missing where it is required. Units are case-sensitive: MHz is megahertz, mHz millihertz.',
  },
  'bad-quantity': {
    severity: 'error',
    title: 'Not a quantity',
    help: 'The value is not a number with an optional unit (such as 125 MHz, 50 ppm, 64 KiB, 2 Vpp), or it is not a whole number where one is needed.',
  },
  'out-of-range': {
    severity: 'error',
    title: 'Value out of range',
    help: 'The value is outside what the key allows (for example a negative frequency, a minimum above its maximum, or a DAC wider than its sample bytes).',
  },
  'divider-form': {
    severity: 'error',
    title: 'Divider described two ways, or stages it cannot use',
    help: 'A divider is either an integer range with fraction bits (`integer`, `fraction-bits`) or counter stages whose product is D (`stages`, one or two of them, whole numbers only). Keep the one form that describes how the divider is built.',
  },
  'unused-key': {
    severity: 'warning',
    title: 'Key has no effect',
    help: 'The key is valid but does nothing here (for example duty on a sine). Remove it, or change the shape it applies to.',
  },
  'bad-harmonics': {
    severity: 'error',
    title: 'Harmonics list defines no waveform',
    help: 'A `harmonics:` list names one order twice (which amplitude and phase would it have?) or gives every harmonic an amplitude of 0 (nothing to scale to the amplitude), so it defines no waveform and the output is not planned. Give each order once, and at least one a positive amplitude.',
  },
  'clock-unreadable': {
    severity: 'error',
    title: 'Clock file cannot be read',
    help: 'The clock file named by `clock:` cannot be read: it does not exist, it is not a regular file (a folder, a FIFO, a device), it is too large, or it lies outside the workspace folder (after resolving symbolic links; specs read nothing outside the folders being checked). The path is relative to the wave file.',
  },
  'clock-invalid': {
    severity: 'error',
    title: 'Clock file has errors',
    help: 'The clock file named by `clock:` has errors of its own, so the outputs cannot be planned. Open it and fix them.',
  },
  'sample-file-unreadable': {
    severity: 'error',
    title: 'Sample file cannot be read',
    help: 'The file named by an output\'s `sample-file:` cannot be read: it does not exist, it is not a regular file (a folder, a FIFO, a device), it is larger than waveplan reads from one file (3 MiB), or it lies outside the workspace folder (after resolving symbolic links; specs read nothing outside the folders being checked). The path is relative to the wave file.',
  },
  'sample-file-invalid': {
    severity: 'error',
    title: 'Sample file does not hold one cycle',
    help: 'The file named by `sample-file:` is read as one cycle of the waveform: one value a line, or comma-, semicolon- or tab-separated columns of which the last is the value; blank lines and lines starting with # are skipped, and a first line that is not a number is a header. The message names the line that is not a number, or says that the file holds fewer than 2 or more than 1 048 576 values.',
  },
  overclock: {
    severity: 'warning',
    title: 'System clock above its rating',
    help: "The system clock is above the rated-system-clock. Running a part beyond its datasheet rating can make it misbehave or fail; waveplan plans it anyway. Defer to the datasheet and qualified practice before running hardware this way.",
  },
  'clock-unreachable': {
    severity: 'warning',
    title: 'System clock the clock tree cannot make',
    help: 'The `system-clock` in use is not one the PLL can make from its crystal within its ranges (or not one of `system-clock-candidates`). The outputs are still planned on it; the message names the nearest clock the tree makes.',
  },
  'peripheral-clock': {
    severity: 'warning',
    title: 'Peripheral clock out of tolerance',
    help: "A peripheral listed under `peripheral-clocks` cannot get its frequency within its tolerance from the system clock (or the VCO) in use, the clock's own tolerance counted in. Pick another system clock (the hover on `system-clock` ranks them) or another divider range.",
  },
  'clock-accuracy': {
    severity: 'error',
    title: "The system clock's own error exceeds the output's tolerance",
    help: "The system clock's tolerance (`system-clock-tolerance`, the crystal's) alone is more than this output's tolerance allows, so no divider or table can meet it. Use a more accurate clock source (a tighter crystal, a TCXO) or widen the output's tolerance.",
  },
  group: {
    severity: 'error',
    title: 'Group cannot be planned as written',
    help: 'A group under `groups:` names an output that does not exist, an output already in another group, an output with a pinned plan, a phase offset for an output outside the group or without `lock: phase`, or members that cannot share one table through `start-offset` (their waveforms or frequencies differ). The message says which.',
  },
  'phase-offset': {
    severity: 'warning',
    title: 'Phase offset not realised exactly',
    help: 'In a phase-locked group a member\'s offset is a whole number of samples of its table, so with M cycles in N samples the reachable offsets are steps of gcd(M, N)/N of a cycle. The message gives the nearest one and the error left, in degrees and seconds; a table length that divides by the offset\'s share of a cycle removes it.',
  },
  clipping: {
    severity: 'error',
    title: 'Output clips',
    help: "offset ± amplitude/2 leaves the DAC's range of 0 V to full scale, so the waveform's peaks would be cut flat. Lower the amplitude or move the offset.",
  },
  nyquist: {
    severity: 'error',
    title: 'Samples per cycle at or below Nyquist',
    help: 'A sine needs more than 2 samples per cycle (Nyquist); at 2 or fewer it aliases. Raise min-samples-per-cycle or the table length, or lower the frequency.',
  },
  'samples-per-cycle': {
    severity: 'warning',
    title: 'Samples per cycle',
    help: 'The plan holds a non-whole number of samples per cycle for a square, triangle or sawtooth (edges and corners wander from cycle to cycle), or fewer samples per cycle than min-samples-per-cycle.',
  },
  'out-of-tolerance': {
    severity: 'error',
    title: 'Frequency out of tolerance',
    help: 'No plan the hardware and the jitter policy allow meets the frequency within its tolerance. The message names the best achieved frequency, its error and the nearest jitter-free alternative; widen the tolerance, allow jitter, or change the clock.',
  },
  'fractional-plan': {
    severity: 'warning',
    title: 'Fractional divider chosen',
    help: 'Only a fractional divider meets the tolerance. Its sample periods alternate between I and I+1 system clocks, which adds divider jitter; the message names its RMS and peak-to-peak time-interval error.',
  },
  'duty-missed': {
    severity: 'warning',
    title: 'Square-wave duty not held',
    help: 'With a whole number S of samples per cycle a square is high for a whole number of samples, so its duty is a multiple of 1/S. No plan within the frequency tolerance holds the asked duty within duty-tolerance; the message names the duty the plan gives, the nearest duty within the tolerance and the nearest plan that holds the duty exactly. Widen duty-tolerance or the frequency tolerance, pin a plan, or accept the duty.',
  },
  'search-limit': {
    severity: 'warning',
    title: 'Plan search stopped at its work limit',
    help: "The divider and table-length ranges of this clock file span a domain so large that the plan search stopped at its work limit, counted in steps (each output of a file has an even share of one budget for the file, so a file plans in seconds whatever its clock); the plan shown is the best found, not proven the nearest. An exact plan is always proven. Narrow divider.integer or memory.table-length (or use fewer fraction bits), or plan fewer outputs in one file, to get a proven optimum in milliseconds.",
  },
  'no-plan': {
    severity: 'error',
    title: 'No plan possible',
    help: 'The hardware admits no plan at all for this output (for example every table long enough is over the memory budget, or every divider is too fast for the DAC).',
  },
  'pinned-plan': {
    severity: 'error',
    title: 'Pinned plan not possible',
    help: "A plan written in the spec cannot run on the hardware: the divider is not I + F/2^k, it is outside the divider's range, it is fractional while jitter is forbidden, the sample rate is above the DAC's maximum, or the table length is out of range.",
  },
  'seam-glitch': {
    severity: 'warning',
    title: 'Glitch at the table wrap',
    help: 'The step from the last table sample to the first differs from the waveform’s own step (the table holds a non-whole number of cycles, or spans N − 1 intervals so a sample repeats). The message gives the jump in LSB; a jump under 1 LSB is only noted (information).',
  },
  'table-over-budget': {
    severity: 'error',
    title: 'Table larger than the memory budget',
    help: "One output's table alone is larger than the memory budget of the clock file. Shorten the table (fewer cycles) or raise the budget.",
  },
  'fitted-to-budget': {
    severity: 'information',
    title: 'Table shrunk to fit the memory budget',
    help: "The outputs' own plans together took more than the memory budget, so this output takes a smaller plan within its tolerance: the board's plans are chosen for the largest smallest share of each output's own samples per cycle, then the smallest worst error against the tolerances, then the fewest bytes. The message names the samples per cycle and bytes it gave up; pin a plan or raise the budget to choose otherwise.",
  },
  'over-budget': {
    severity: 'error',
    title: 'Tables over the memory budget',
    help: "All tables together need more RAM than the memory budget of the clock file, even with every output shrunk as far as its tolerance allows (pinned plans and plans outside their tolerance keep their size). The message names the outputs that take the most and the least total that would fit. Raise the budget, widen tolerances, or drop an output.",
  },
  'too-many-outputs': {
    severity: 'error',
    title: 'Too many outputs',
    help: 'The file lists more outputs than waveplan plans in one file (500); the rest are not planned. Split the file.',
  },
  'signal-quality': {
    severity: 'warning',
    title: 'Signal below its quality floor',
    help: "The output's SNR or SFDR, estimated from the plan (divider jitter, the table, quantisation at this amplitude), is below min-snr / min-sfdr (by default one bit below the ideal quantiser of the DAC, 6.02·(bits − 1) + 1.76 dB). The message names the cause and a plan or change that meets the floor; the hover and the report show the exact spectrum.",
  },
  'chain-clipping': {
    severity: 'warning',
    title: 'Amplifier output clips',
    help: "After the analog chain's gain the output swings past the amplifier's output-swing, so its peaks are cut flat. Lower the amplitude or the gain.",
  },
  'slew-rate': {
    severity: 'warning',
    title: 'Amplifier slew rate too low',
    help: 'The output needs a faster slew rate than the amplifier has (a sine needs 2π·f·V_peak; a table step needs the step per sample period), so it distorts. Lower the amplitude or frequency, or use a faster amplifier.',
  },
  'amplifier-bandwidth': {
    severity: 'warning',
    title: 'Amplifier bandwidth too low',
    help: "The amplifier's closed-loop bandwidth (gain-bandwidth / gain) takes more than 0.1 dB off the fundamental, and with it the shape's harmonics. Use a lower gain or a wider amplifier.",
  },
  'coupling-corner': {
    severity: 'warning',
    title: 'AC coupling too close to the output frequency',
    help: "The coupling's high-pass corner 1/(2πRC) takes more than 0.1 dB off the fundamental. Use a larger coupling capacitor (or a larger load resistance).",
  },
  'square-tilt': {
    severity: 'information',
    title: 'Square-wave tilt through the AC coupling',
    help: 'A square wave through a coupling capacitor droops along each flat top: 1 − exp(−t/RC) exactly for a level held t, π·f_c/f by the textbook approximation. Both are given; a larger capacitor lowers it.',
  },
  'chain-caution': {
    severity: 'warning',
    title: 'Caution: the chain drives a load that can hurt',
    help: 'The analog chain drives a transducer, a power stage or mains-powered equipment. waveplan checks signals, not hardware: follow the datasheets, local codes and qualified practice before running it.',
  },
  'internal-error': {
    severity: 'error',
    title: 'waveplan failed on this input',
    help: 'waveplan hit an unexpected condition while checking this part of the file. The rest of the file was checked; please report the input that caused it.',
  },
} as const satisfies Record<string, CodeInfo>;

export type Code = keyof typeof CODES;

export const codeInfo = (code: Code): CodeInfo => CODES[code];
export const ALL_CODES = Object.keys(CODES) as Code[];
