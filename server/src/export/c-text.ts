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
 * Text safe inside a C block comment: no comment delimiters, and ASCII only — some embedded
 * toolchains still reject UTF-8 in sources; anything unmapped becomes '?'.
 */
export function commentSafe(text: string): string {
  return text
    .replace(/\*\//g, '* /')
    .replace(/\/\*/g, '/ *')
    .replace(/[^\x20-\x7e]/g, (c) => ASCII[c] ?? '?');
}

export function block(lines: readonly string[]): string {
  return ['/*', ...lines.map((l) => (l === '' ? ' *' : ` * ${commentSafe(l)}`)), ' */'].join('\n');
}

/** `#define NAME value` with the values aligned in a column, plus an optional trailing comment. */
export function defines(rows: ReadonlyArray<[string, string, string?]>): string {
  const width = Math.max(...rows.map(([n]) => n.length));
  const valueWidth = Math.max(...rows.map(([, v]) => v.length));
  return rows
    .map(([n, v, c]) => (c ? `#define ${n.padEnd(width)} ${v.padEnd(valueWidth)} /* ${commentSafe(c)} */` : `#define ${n.padEnd(width)} ${v}`))
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
