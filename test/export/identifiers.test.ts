// C identifiers follow ISO C's identifier rules (C99 §6.4.2: a letter or underscore, then letters,
// digits, underscores) and avoid the reserved forms (C99 §7.1.3: leading underscore + capital or
// double underscore; C++17 [lex.name]: any double underscore) — from memory for the clause numbers.
import { describe, expect, it } from 'vitest';
import { outputIdentifiers, specPrefix } from '../../server/src/export/identifiers';

const at = (line: number) => ({ start: { line, character: 2 }, end: { line, character: 8 } });

describe('C identifiers of outputs', () => {
  it('prefix from the file name, - becomes _, case folds', () => {
    expect(specPrefix('/x/bench-rig.wave.yaml')).toBe('bench_rig');
    const r = outputIdentifiers('/x/bench-rig.wave.yaml', [{ name: 'Coil-Drive', nameRange: at(3) }]);
    expect(r.diagnostics).toEqual([]);
    expect(r.ids.get('Coil-Drive')).toEqual({ lower: 'bench_rig_coil_drive', upper: 'BENCH_RIG_COIL_DRIVE' });
  });

  it.each(['_hidden', 'trailing-', 'double--dash', 'a__b'])('"%s" is reported, not renamed', (name) => {
    const r = outputIdentifiers('/x/rig.wave.yaml', [{ name, nameRange: at(5) }]);
    expect(r.ids.size).toBe(0);
    expect(r.diagnostics).toHaveLength(1);
    expect(r.diagnostics[0]).toMatchObject({ code: 'c-identifier', severity: 'error', output: name, range: at(5) });
  });

  it('names that fold together collide on the later one', () => {
    const r = outputIdentifiers('/x/rig.wave.yaml', [
      { name: 'tone-a', nameRange: at(2) },
      { name: 'TONE_A', nameRange: at(4) },
    ]);
    expect(r.ids.has('tone-a')).toBe(true);
    expect(r.diagnostics).toHaveLength(1);
    expect(r.diagnostics[0]).toMatchObject({ code: 'c-identifier-collision', output: 'TONE_A', range: at(4) });
  });

  it('a file name that cannot be a C prefix is reported once', () => {
    const r = outputIdentifiers('/x/7-rig.wave.yaml', [{ name: 'a', nameRange: at(2) }]);
    expect(r.diagnostics.map((d) => d.code)).toEqual(['c-identifier']);
    expect(r.ids.size).toBe(0);
  });
});
