import { createHash } from 'node:crypto';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { DEMO, FIXTURES, readTree, REPO, run, scratch } from './support';

// Golden files: regenerate with `UPDATE_GOLDEN=1 npx vitest run test/export` after a deliberate
// change, and review the diff like code.
const GOLDEN = path.join(REPO, 'test/export/golden');
const UPDATE = process.env.UPDATE_GOLDEN === '1';
const TONE_LAB = path.join(FIXTURES, 'tone-lab.wave.yaml');

async function exportTo(spec: string, extra: string[] = [], cwd = REPO): Promise<{ dir: string; code: number; stderr: string }> {
  const dir = scratch('export');
  const r = await run('export', [spec, '--c', path.join(dir, 'c'), '--json', path.join(dir, 'plans.json'), ...extra], cwd);
  return { dir, code: r.code, stderr: r.stderr };
}

function files(dir: string): Map<string, Buffer> {
  const out = readTree(path.join(dir, 'c'));
  out.set('plans.json', fs.readFileSync(path.join(dir, 'plans.json')));
  return out;
}

/** Files above this size are kept as their sha256 only: a table dump is not reviewed line by line. */
const GOLDEN_TEXT_LIMIT = 64 * 1024;

function goldenForm(got: Map<string, Buffer>): Map<string, string> {
  const out = new Map<string, string>();
  for (const [f, bytes] of got)
    if (bytes.length > GOLDEN_TEXT_LIMIT) out.set(`${f}.sha256`, `${createHash('sha256').update(bytes).digest('hex')}\n`);
    else out.set(f, bytes.toString('utf8'));
  return out;
}

function compareGolden(name: string, got: Map<string, Buffer>): void {
  const folder = path.join(GOLDEN, name);
  const want = goldenForm(got);
  if (UPDATE) {
    fs.rmSync(folder, { recursive: true, force: true });
    fs.mkdirSync(folder, { recursive: true });
    for (const [f, text] of want) fs.writeFileSync(path.join(folder, f), text);
  }
  expect(fs.existsSync(folder), `golden folder ${folder} missing: run with UPDATE_GOLDEN=1`).toBe(true);
  expect([...want.keys()].sort()).toEqual([...readTree(folder).keys()].sort());
  for (const [f, text] of want) expect(text, f).toBe(fs.readFileSync(path.join(folder, f), 'utf8'));
}

describe('golden export', () => {
  it('the tone-lab fixture (no errors) exports exit 0 and matches its golden files', async () => {
    const r = await exportTo(TONE_LAB);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    compareGolden('tone-lab', files(r.dir));
  });

  it('the demo (examples/) exports with --force and matches its golden files', async () => {
    const r = await exportTo(DEMO, ['--force']);
    expect([0, 1]).toContain(r.code);
    compareGolden('bench-rig', files(r.dir));
  });
});

describe('determinism', () => {
  it('two runs, and runs from two working folders, give the same bytes', async () => {
    const a = files((await exportTo(TONE_LAB)).dir);
    const b = files((await exportTo(TONE_LAB)).dir);
    const c = files((await exportTo(path.relative(FIXTURES, TONE_LAB), [], FIXTURES)).dir);
    for (const other of [b, c]) {
      expect([...other.keys()].sort()).toEqual([...a.keys()].sort());
      for (const [f, bytes] of a) expect(other.get(f)!.equals(bytes), f).toBe(true);
    }
  });

  it('generated files hold no absolute path, date or non-ASCII byte', async () => {
    const all = files((await exportTo(TONE_LAB)).dir);
    for (const [f, bytes] of all) {
      const text = bytes.toString('utf8');
      expect(text.includes(REPO), f).toBe(false);
      expect(text, f).not.toMatch(/\b20\d\d-\d\d-\d\d\b/);
      if (f.endsWith('.c') || f.endsWith('.h')) expect(/[^\x09\x0a\x20-\x7e]/.test(text), f).toBe(false);
    }
  });
});

describe('what the files say', () => {
  it('registers and constants of the fixture (f_out = f_sys·M/(D·N), docs/DESIGN.md; derived)', async () => {
    const { dir } = await exportTo(TONE_LAB);
    const h = fs.readFileSync(path.join(dir, 'c/tone_lab.h'), 'utf8');
    // 96 MHz / 8 = 12 MHz; 128 samples, 1 cycle → 93.75 kHz exactly (derived).
    expect(h).toMatch(/#define TONE_LAB_PILOT_DIVIDER_INT +8u /);
    expect(h).toMatch(/#define TONE_LAB_PILOT_DIVIDER_RAW +512u /); // 8·2^6 + 0
    expect(h).toMatch(/#define TONE_LAB_PILOT_SAMPLE_RATE_HZ +12000000\.0 /);
    expect(h).toMatch(/#define TONE_LAB_PILOT_FREQUENCY_HZ +93750\.0 /);
    expect(h).toMatch(/#define TONE_LAB_PILOT_TABLE_ALIGN +256u /); // 128 samples × 2 bytes, a DMA ring
    // The fractional plan: raw = I·2^k + F (docs/DESIGN.md, D = I + F/2^k).
    const plans = JSON.parse(fs.readFileSync(path.join(dir, 'plans.json'), 'utf8'));
    const odd = plans.specs[0].outputs.find((o: { name: string }) => o.name === 'odd-tone');
    const raw = odd.plan.dividerInteger * 2 ** odd.plan.fractionBits + odd.plan.dividerFraction;
    expect(odd.plan.dividerFraction).toBeGreaterThan(0);
    expect(h).toContain(`#define TONE_LAB_ODD_TONE_DIVIDER_RAW       ${raw}u`);
    expect(odd.table).toHaveLength(odd.plan.tableLength);
    expect(plans.specs[0].sampleType).toBe('uint16_t');
    expect(plans.specs[0].checked).toBe(true);
  });

  it('a spec with errors exports nothing and exits 1', async () => {
    const { dir, code, stderr } = await exportTo(path.join(FIXTURES, 'off-target.wave.yaml'));
    expect(code).toBe(1);
    expect(stderr).toMatch(/off-target\.wave\.yaml:\d+:\d+: error out-of-tolerance/);
    expect(stderr).toContain('nothing exported');
    expect(fs.existsSync(path.join(dir, 'c'))).toBe(false);
    expect(fs.existsSync(path.join(dir, 'plans.json'))).toBe(false);
  });

  it('--force exports anyway, says so loudly, refuses to compile silently, and still exits 1', async () => {
    const { dir, code, stderr } = await exportTo(path.join(FIXTURES, 'off-target.wave.yaml'), ['--force']);
    expect(code).toBe(1);
    expect(stderr).toContain('UNCHECKED');
    const h = fs.readFileSync(path.join(dir, 'c/off_target.h'), 'utf8');
    expect(h).toContain('UNCHECKED EXPORT: written with --force although the spec has 1 error');
    expect(h).toContain('#ifndef WAVEPLAN_ALLOW_UNCHECKED');
    expect(JSON.parse(fs.readFileSync(path.join(dir, 'plans.json'), 'utf8')).specs[0].checked).toBe(false);
  });

  it('colliding C identifiers are a finding on the name, not a silent rename', async () => {
    const { dir, code, stderr } = await exportTo(path.join(FIXTURES, 'clash.wave.yaml'));
    expect(code).toBe(1);
    expect(stderr).toMatch(/clash\.wave\.yaml:7:3: error c-identifier-collision Outputs "beep-a" and "beep_a" would both be exported as clash_beep_a/);
    expect(fs.existsSync(path.join(dir, 'c'))).toBe(false);
    // --force cannot make colliding names compile.
    const forced = await exportTo(path.join(FIXTURES, 'clash.wave.yaml'), ['--force']);
    expect(forced.code).toBe(1);
    expect(fs.existsSync(path.join(forced.dir, 'c'))).toBe(false);
  });

  it('JSON alone needs no C identifiers', async () => {
    const dir = scratch('json-only');
    const r = await run('export', [path.join(FIXTURES, 'clash.wave.yaml'), '--json', path.join(dir, 'p.json')]);
    expect(r.code).toBe(0);
    expect(JSON.parse(fs.readFileSync(path.join(dir, 'p.json'), 'utf8')).specs[0].outputs).toHaveLength(2);
  });
});

describe('broken input never crashes', () => {
  const broken: Array<[string, string]> = [
    ['YAML syntax error', 'clock: ./tone-lab.clock.yaml\noutputs: [\n  pilot: {\n'],
    ['missing clock file', 'clock: ./nowhere.clock.yaml\noutputs:\n  pilot: { shape: sine, frequency: 1 kHz }\n'],
    ['empty file', ''],
    ['absurd numbers', 'clock: ./tone-lab.clock.yaml\noutputs:\n  pilot: { shape: sine, frequency: 1e99 GHz, tolerance: -5 ppm }\n'],
  ];
  for (const [name, text] of broken)
    it(`${name}: export exits 1 with ranged findings, report still writes a page`, async () => {
      const dir = scratch('broken');
      fs.copyFileSync(path.join(FIXTURES, 'tone-lab.clock.yaml'), path.join(dir, 'tone-lab.clock.yaml'));
      const spec = path.join(dir, 'bad.wave.yaml');
      fs.writeFileSync(spec, text);
      const ex = await run('export', [spec, '--c', path.join(dir, 'c'), '--force'], dir);
      expect(ex.stderr).not.toMatch(/\n\s+at |internal error/);
      expect(ex.code).toBe(1);
      expect(ex.stderr).toMatch(/bad\.wave\.yaml:\d+:\d+: error /);
      const rep = await run('report', [spec, '--html', path.join(dir, 'r.html')], dir);
      expect(rep.stderr).toBe('');
      expect(rep.code).toBe(1);
      expect(fs.readFileSync(path.join(dir, 'r.html'), 'utf8')).toContain('<b>error</b>');
      expect(fs.readFileSync(spec, 'utf8')).toBe(text);
    });
});

describe('misuse gives exit 2 and one clear line', () => {
  const cases: Array<[string, string[], RegExp]> = [
    ['no spec', ['--c', 'x'], /export needs at least one wave spec/],
    ['no target', [TONE_LAB], /needs --c <folder>, --json <file> or both/],
    ['unknown flag', [TONE_LAB, '--c', 'x', '--zip'], /unknown option --zip/],
    ['missing value', [TONE_LAB, '--c'], /--c needs a value/],
    ['missing file', ['nowhere.wave.yaml', '--c', 'x'], /no such file or folder: nowhere\.wave\.yaml/],
    ['a clock file', [path.join(FIXTURES, 'tone-lab.clock.yaml'), '--c', 'x'], /is a clock file/],
  ];
  for (const [name, argv, message] of cases)
    it(name, async () => {
      const r = await run('export', argv, scratch('misuse'));
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(message);
      expect(r.stderr).not.toMatch(/\n\s+at /); // no stack trace
    });

  it('report without --html', async () => {
    const r = await run('report', [TONE_LAB]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/report needs --html <file>/);
  });

  it('the spec files are never modified', async () => {
    const before = fs.readFileSync(TONE_LAB);
    await exportTo(TONE_LAB);
    expect(fs.readFileSync(TONE_LAB).equals(before)).toBe(true);
  });
});
