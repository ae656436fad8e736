// Fixed formatting of C literals and comments, so an export is byte-identical on every machine.

/** A C double literal that reads back as exactly this double (ECMAScript's shortest round trip). */
export function cDouble(x: number): string {
  if (!Number.isFinite(x)) return '0.0';
  const s = String(x);
  return /[.eE]/.test(s) ? s : `${s}.0`;
}

/** An unsigned C literal; 64-bit values get the ULL suffix. */
export function cUnsigned(x: number | bigint): string {
  const v = BigInt(x);
  if (v < 0n) throw new RangeError(`negative value ${v} where an unsigned C literal belongs`);
  return v > 0xffffffffn ? `${v}ULL` : `${v}u`;
}

const ASCII: Record<string, string> = { 'µ': 'u', '÷': '/', '≈': '~', '±': '+/-', '·': '*', '—': '-', '–': '-', '×': 'x', '→': '->', '≤': '<=', '≥': '>=' };

/**
 * Text safe inside a C block comment, in this order, so no later step can undo an earlier one:
 * 1. ASCII only — some embedded toolchains still reject UTF-8 in sources: the few signs our
 *    messages use become their ASCII spelling (÷ → /, · → *), anything else, and every control
 *    character (newline, carriage return, tab, NUL), becomes '?';
 * 2. no backslash, which could splice lines, and no `??` pair, which ISO C (-std=c99) reads as
 *    the start of a trigraph (`??/` is a backslash; -Wall warns on every one);
 * 3. no comment delimiter: slash-star and star-slash are split by a space, until none is left.
 * Spec text (output names, file names, messages quoting keys) reaches generated code only this way.
 */
export function commentSafe(text: string): string {
  let out = text
    .replace(/[^\x20-\x7e]/gu, (c) => ASCII[c] ?? '?')
    .replace(/\\/g, '/')
    .replace(/\?(?=\?)/g, '? ');
  for (let before = ''; before !== out; ) {
    before = out;
    out = out.replace(/\*\//g, '* /').replace(/\/\*/g, '/ *');
  }
  return out;
}

/** A one-line C comment around `text`. */
export const lineComment = (text: string): string => `/* ${commentSafe(text)} */`;

export function block(lines: readonly string[]): string {
  return ['/*', ...lines.map((l) => (l === '' ? ' *' : ` * ${commentSafe(l)}`)), ' */'].join('\n');
}

/** `#define NAME value` with the values aligned in a column, plus an optional trailing comment. */
export function defines(rows: ReadonlyArray<[string, string, string?]>): string {
  const width = Math.max(...rows.map(([n]) => n.length));
  const valueWidth = Math.max(...rows.map(([, v]) => v.length));
  return rows
    .map(([n, v, c]) => (c ? `#define ${n.padEnd(width)} ${v.padEnd(valueWidth)} ${lineComment(c)}` : `#define ${n.padEnd(width)} ${v}`))
    .join('\n');
}

/** Table values, a fixed number per line, right-aligned to the widest code. */
export function arrayBody(values: ArrayLike<number>, perLine: number): string {
  let width = 1;
  for (let i = 0; i < values.length; i++) width = Math.max(width, String(values[i]).length + 1);
  const lines: string[] = [];
  for (let i = 0; i < values.length; i += perLine) {
    let line = ' ';
    for (let j = i; j < Math.min(values.length, i + perLine); j++) line += ` ${`${values[j]}u`.padStart(width)},`;
    lines.push(line);
  }
  return lines.join('\n');
}

/** A counter stage's part of the divider, as the plan reports it. */
interface StageValue {
  name: string;
  value: number;
  register: number;
}

/** "prescaler 12 (register 11) x period 1000 (register 999)". */
export function stagesComment(stages: readonly StageValue[]): string {
  return stages.map((st) => `${st.name} ${st.value} (register ${st.register})`).join(' x ');
}

/**
 * Per stage the value it divides by and what its register holds: `<OUTPUT>_STAGE_<NAME>_VALUE`
 * and `…_REGISTER` (names are letters, digits and _, distinct ignoring case, so macros never clash).
 */
export function stageRows(upper: string, stages: readonly StageValue[] | undefined): Array<[string, string, string?]> {
  if (stages === undefined) return [];
  return stages.flatMap((st): Array<[string, string, string?]> => [
    [`${upper}_STAGE_${st.name.toUpperCase()}_VALUE`, cUnsigned(st.value), `${st.name}: the stage divides by this`],
    [`${upper}_STAGE_${st.name.toUpperCase()}_REGISTER`, cUnsigned(st.register), `${st.name}: write this to its register`],
  ]);
}
