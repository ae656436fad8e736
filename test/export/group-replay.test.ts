// Phase-locked groups replayed: the exported tables (or one table and a DMA start offset) are
// compiled with gcc and streamed on their shared sample clock (group-replay.c); the phase each
// member runs ahead of the group's first, measured from the stream by correlation with sin and
// cos at its frequency (the quadrature definition of phase, derived), must be the realised
// offset the export states, and the asked offset within the phase error it reports.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { compile, DEMO, FIXTURES, REPO, run, runBinary, scratch, STRICT } from './support';

interface Member {
  name: string;
  identifier: string;
  phase?: { group: string; rotation: number; offsetDeg: number; realisedDeg: number; errorDeg: number; errorS: number; sharesTableOf: string | null };
  plan: { achievedHz: number };
}

const exported = new Map<string, { dir: string; header: string; outputs: Member[] }>();

async function exportSpec(label: string, spec: string, extra: string[]): Promise<void> {
  const dir = scratch(`groups-${label}`);
  const r = await run('export', [spec, '--c', dir, '--json', path.join(dir, 'plans.json'), ...extra]);
  expect(r.code, r.stderr).toBeLessThan(2);
  const header = fs.readdirSync(dir).find((f) => f.endsWith('.h'))!;
  exported.set(label, { dir, header, outputs: JSON.parse(fs.readFileSync(path.join(dir, 'plans.json'), 'utf8')).specs[0].outputs });
}

function replay(label: string, a: string, b: string): { lead: number } {
  const { dir, header, outputs } = exported.get(label)!;
  const [ma, mb] = [a, b].map((n) => outputs.find((o) => o.name === n)!);
  const upper = header.slice(0, -2).toUpperCase();
  const start = mb!.phase?.sharesTableOf ? mb!.phase.rotation : 0;
  const bin = path.join(dir, `replay-${a}-${b}`);
  const built = compile(
    'gcc',
    [
      '-std=c99', ...STRICT, '-O2', '-D_DEFAULT_SOURCE', '-DWAVEPLAN_ALLOW_UNCHECKED', `-DWAVEPLAN_HEADER="${header}"`, `-DWAVEPLAN_CLOCK_HZ=${upper}_SYSTEM_CLOCK_HZ`,
      `-DA=${ma!.identifier}`, `-DAU=${ma!.identifier.toUpperCase()}`, `-DB=${mb!.identifier}`, `-DBU=${mb!.identifier.toUpperCase()}`, `-DB_START=${start}UL`,
      '-I', dir, path.join(REPO, 'test/export/group-replay.c'), path.join(dir, `${header.slice(0, -2)}.c`), '-lm', '-o', bin,
    ],
    dir,
  );
  expect(built.output).toBe('');
  return { lead: Number(/lead=([\d.]+)/.exec(runBinary(bin))![1]) };
}

beforeAll(async () => {
  await exportSpec('demo', DEMO, ['--force']);
  await exportSpec('phases', path.join(FIXTURES, 'phases.wave.yaml'), []);
}, 120_000);

describe('phase-locked groups replay with the offsets they state', () => {
  it('the demo quadrature pair: two tables, replayed 90.000° apart', () => {
    const { lead } = replay('demo', 'coil-excitation', 'quadrature-ref');
    console.log(`demo quadrature-ref leads coil-excitation by ${lead.toFixed(3)}°`);
    expect(lead.toFixed(3)).toBe('90.000');
  });

  it('a quadrature pair with tables of their own (table rotation): 90.000°', () => {
    expect(replay('phases', 'in-phase', 'quadrature').lead.toFixed(3)).toBe('90.000');
  });

  it('a three-phase set sharing one table through DMA start offsets: the realised 119.883° and 240.117° (1024 samples per cycle step 0.3516°, derived), within the reported error of 120° and 240°', () => {
    const { outputs } = exported.get('phases')!;
    for (const [member, asked] of [['phase-b', 120], ['phase-c', 240]] as const) {
      const m = outputs.find((o) => o.name === member)!;
      expect(m.phase!.sharesTableOf).toBe('phase-a');
      const { lead } = replay('phases', 'phase-a', member);
      expect(lead).toBeCloseTo(m.phase!.realisedDeg, 3);
      expect(Math.abs(lead - asked)).toBeLessThanOrEqual(Math.abs(m.phase!.errorDeg) + 1e-3);
      // The error in seconds is the error in cycles over the frequency (derived).
      expect(m.phase!.errorS).toBeCloseTo(m.phase!.errorDeg / 360 / m.plan.achievedHz, 12);
    }
    expect(outputs.find((o) => o.name === 'phase-b')!.phase!.rotation).toBe(341); // round(1024/3)
  });

  it('a fundamental and its third harmonic on one table length: the third leads by 180.000° at its own frequency', () => {
    expect(replay('phases', 'fundamental', 'third').lead.toFixed(3)).toBe('180.000');
  });
});
