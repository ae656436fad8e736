// Reads the demo's own numbers so the suite follows the demo as it changes: the output with a
// hand-pinned plan, and the frequency that plan must give, computed here with fraction.js (a
// general-purpose exact-rational library, the oracle) from f_out = f_sys · M / (D · N)
// (docs/DESIGN.md "Quantities"; derived). The YAML is read with the `yaml` package.

import fs from 'node:fs';
import path from 'node:path';
import Fraction from 'fraction.js';
import { parse } from 'yaml';

const PREFIX = { GHz: '1000000000', MHz: '1000000', kHz: '1000', Hz: '1' };

/** "150 MHz" → an exact Fraction of hertz; decimal text is read as decimal, never via a float. */
export function hertz(text) {
  const m = /^\s*(\d+(?:\.\d+)?)\s*(GHz|MHz|kHz|Hz)\s*$/.exec(String(text));
  if (!m) throw new Error(`not a frequency: ${text}`);
  return new Fraction(m[1]).mul(new Fraction(PREFIX[m[2]]));
}

/** The first output with a pinned `plan:` and its exact achieved frequency. */
export function pinnedOutput(workspace, waveFile) {
  const wave = parse(fs.readFileSync(path.join(workspace, waveFile), 'utf8'));
  const clock = parse(fs.readFileSync(path.join(workspace, wave.clock), 'utf8'));
  const entry = Object.entries(wave.outputs ?? {}).find(([, o]) => o && typeof o === 'object' && o.plan);
  if (!entry) throw new Error(`${waveFile} pins no plan; the suite needs one pinned output`);
  const [name, output] = entry;
  const { divider, 'table-length': tableLength, cycles } = output.plan;
  const achieved = hertz(clock['system-clock']).mul(new Fraction(String(cycles))).div(new Fraction(String(divider)).mul(tableLength));
  return { name, divider, tableLength, cycles: String(cycles), achievedHz: achieved };
}

/** Reads "1 kHz" / "≈ 40.127 kHz" back to hertz (a Number; the annotation shows six significant digits). */
export function shownHertz(text) {
  const m = /(≈\s*)?(\d+(?:\.\d+)?)\s*(GHz|MHz|kHz|Hz)\b/.exec(text);
  if (!m) return undefined;
  return { approx: !!m[1], hz: hertz(`${m[2]} ${m[3]}`).valueOf() };
}
