// Language-server cost and memory, measured over stdio against the built bundle.
// Run: npm run bench:lsp   (EDITS=n sets the edits per size, FLAGS=0 skips the memory runs)
// Budgets (DEVELOPERS.md): per-edit server CPU within 1.5× from 50 to 500 outputs; edit → fresh
// diagnostics p95 ≤ 50 ms on a 200-output spec (debounce included); hover ≤ 10 ms; RSS ≤ 100 MiB
// after opening 100 such specs. The machine is shared and noisy: server CPU per operation (from
// process.cpuUsage() inside the server) is the steady figure; wall times are what a user waits.

import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { performance } from 'node:perf_hooks';
import { ensureBuilt, LspClient, uriOf, type LspDiagnostic } from '../test/support/lsp-client';
import { seededRandom as prng } from '../test/support/seeded';
import { SERVER_NODE_FLAGS } from '../client/src/server-flags';
import { BENCH_CLOCK, benchSpec, frequencyLine, outputName, quantile } from './lsp-specs';

const SIZES = [50, 200, 500];
const BUDGET_SIZE = 200;
const FILES = 100;
const EDITS = Number(process.env.EDITS ?? 40);
const WARMUP = 10;
/** Flag sets measured for memory and CPU; the first is the extension's own. */
const FLAG_SETS: string[][] = [[...SERVER_NODE_FLAGS], [], ['--optimize-for-size'], ['--max-semi-space-size=1'], ['--max-semi-space-size=1', '--optimize-for-size']].filter(
  (set, i, all) => all.findIndex((other) => other.join(' ') === set.join(' ')) === i,
);

interface Stats {
  rssBytes: number;
  heapUsedBytes: number;
  heapTotalBytes: number;
  cpuMicros: number;
}

const stats = (client: LspClient) => client.request<Stats>('waveplan/serverStats', {});

function peakRssMiB(pid: number): number {
  const status = fs.readFileSync(`/proc/${pid}/status`, 'utf8');
  return Number(/VmHWM:\s+(\d+) kB/.exec(status)?.[1] ?? NaN) / 1024;
}

interface OpenSpec {
  uri: string;
  lines: string[];
  outputs: number;
  version: number;
}

async function openSpec(client: LspClient, file: string, outputs: number): Promise<OpenSpec> {
  const text = fs.readFileSync(file, 'utf8');
  const uri = uriOf(file);
  client.open(uri, text, 1);
  await client.diagnosticsFor(uri, (p) => p.version === 1);
  return { uri, lines: text.split('\n'), outputs, version: 1 };
}

/**
 * One edit as an editor makes it: a typed change of one output's frequency, then what VS Code asks
 * after every edit (fresh diagnostics pushed, inlay hints of the screen, code lenses). The outline
 * is timed on its own (outlineCost): its answer lists every output, so it grows with the file by
 * nature. Returns the wall time to the version's diagnostics and the server CPU the cycle took.
 */
async function editCycle(client: LspClient, spec: OpenSpec, rand: () => number): Promise<{ diagnosticsMs: number; cpuMs: number }> {
  const output = Math.floor(rand() * spec.outputs);
  const key = spec.lines.findIndex((l) => l.startsWith(`  ${outputName(output)}:`));
  const line = key + 2;
  const old = spec.lines[line];
  const next = frequencyLine(rand);
  spec.lines[line] = next;
  const version = ++spec.version;
  const uri = spec.uri;
  const before = await stats(client);
  const mark = client.published.length;
  const t0 = performance.now();
  client.edit(uri, version, { start: { line, character: 0 }, end: { line, character: old.length } }, next);
  await client.diagnosticsFor(uri, (p) => p.version === version, mark);
  const diagnosticsMs = performance.now() - t0;
  const top = Math.max(0, key - 20);
  await Promise.all([
    client.request('textDocument/inlayHint', { textDocument: { uri }, range: { start: { line: top, character: 0 }, end: { line: top + 60, character: 0 } } }),
    client.request('textDocument/codeLens', { textDocument: { uri } }),
  ]);
  const after = await stats(client);
  return { diagnosticsMs, cpuMs: (after.cpuMicros - before.cpuMicros) / 1000 };
}

/** Server CPU of one outline request (the answer lists every output). */
async function outlineCost(client: LspClient, spec: OpenSpec): Promise<number> {
  const before = await stats(client);
  await client.request('textDocument/documentSymbol', { textDocument: { uri: spec.uri } });
  const after = await stats(client);
  return (after.cpuMicros - before.cpuMicros) / 1000;
}

async function timed(n: number, client: LspClient, request: (i: number) => Promise<unknown>): Promise<{ ms: number[]; cpuMs: number }> {
  const ms: number[] = [];
  const before = await stats(client);
  for (let i = 0; i < n; i++) {
    const start = performance.now();
    await request(i);
    ms.push(performance.now() - start);
  }
  const after = await stats(client);
  return { ms, cpuMs: (after.cpuMicros - before.cpuMicros) / 1000 / n };
}

const num = (x: number, width = 8) => x.toFixed(1).padStart(width);

function writeSpecs(dir: string): { bySize: Map<number, string>; many: string[] } {
  fs.writeFileSync(path.join(dir, 'bench.clock.yaml'), BENCH_CLOCK);
  const bySize = new Map<number, string>();
  for (const size of SIZES) {
    const file = path.join(dir, `size-${size}.wave.yaml`);
    fs.writeFileSync(file, benchSpec(500 + size, size));
    bySize.set(size, file);
  }
  const many: string[] = [];
  for (let f = 0; f < FILES; f++) {
    const file = path.join(dir, `spec-${String(f).padStart(3, '0')}.wave.yaml`);
    fs.writeFileSync(file, benchSpec(1000 + f, BUDGET_SIZE));
    many.push(file);
  }
  return { bySize, many };
}

/** Edits round-robin over the three sizes in one server, so all of them see the same load. */
async function scaling(bySize: Map<number, string>): Promise<void> {
  const client = await LspClient.start({ nodeArgs: [...SERVER_NODE_FLAGS] });
  try {
    const specs = new Map<number, OpenSpec>();
    for (const size of SIZES) specs.set(size, await openSpec(client, bySize.get(size)!, size));
    const rand = prng(7);
    const results = new Map<number, { diagnosticsMs: number[]; cpuMs: number[]; outlineCpuMs: number[] }>(SIZES.map((s) => [s, { diagnosticsMs: [], cpuMs: [], outlineCpuMs: [] }]));
    for (let e = 0; e < WARMUP + EDITS; e++) {
      for (const size of SIZES) {
        const spec = specs.get(size)!;
        const r = await editCycle(client, spec, rand);
        const outline = await outlineCost(client, spec);
        if (e < WARMUP) continue;
        results.get(size)!.diagnosticsMs.push(r.diagnosticsMs);
        results.get(size)!.cpuMs.push(r.cpuMs);
        results.get(size)!.outlineCpuMs.push(outline);
      }
    }
    console.log(`\nper-edit cost by file size (${EDITS} edits each, round-robin; an edit = change, diagnostics, inlay hints of the screen, code lenses)`);
    console.log(`${'outputs'.padEnd(10)}${'edit → diagnostics p50'.padStart(24)}${'p95 ms'.padStart(9)}${'server CPU/edit p50'.padStart(21)}${'mean ms'.padStart(9)}${'× of 50'.padStart(9)}${'outline CPU p50'.padStart(17)}`);
    const base = quantile(results.get(SIZES[0])!.cpuMs, 0.5);
    for (const size of SIZES) {
      const r = results.get(size)!;
      const cpu50 = quantile(r.cpuMs, 0.5);
      const mean = r.cpuMs.reduce((a, b) => a + b, 0) / r.cpuMs.length;
      console.log(
        `${String(size).padEnd(10)}${num(quantile(r.diagnosticsMs, 0.5), 24)}${num(quantile(r.diagnosticsMs, 0.95), 9)}${num(cpu50, 21)}${num(mean, 9)}${(cpu50 / base).toFixed(2).padStart(9)}${num(quantile(r.outlineCpuMs, 0.5), 17)}`,
      );
    }

    // Requests at the budget size, on the spec edited above.
    const spec = specs.get(BUDGET_SIZE)!;
    const uri = spec.uri;
    const nameLines = spec.lines.map((l, i) => (/^ {2}out-\d{3}:/.test(l) ? i : -1)).filter((i) => i >= 0);
    const rows: [string, { ms: number[]; cpuMs: number }][] = [];
    const at = (i: number, dl: number, character: number) => ({ textDocument: { uri }, position: { line: nameLines[(i * 37) % nameLines.length] + dl, character } });
    rows.push(['hover on an output (card + pictures)', await timed(60, client, (i) => client.request('textDocument/hover', at(i, 0, 4)))]);
    rows.push(['hover on a quantity', await timed(60, client, (i) => client.request('textDocument/hover', at(i, 2, 17)))]);
    rows.push(['inlay hints, whole file', await timed(30, client, () => client.request('textDocument/inlayHint', { textDocument: { uri }, range: { start: { line: 0, character: 0 }, end: { line: spec.lines.length, character: 0 } } }))]);
    const latest = client.published.filter((p) => p.uri === uri).pop()!;
    const fixable = latest.diagnostics.filter((d: LspDiagnostic) => d.code === 'out-of-tolerance' || d.code === 'fractional-plan');
    rows.push([
      `code actions (${fixable.length} fixable findings)`,
      await timed(Math.max(30, fixable.length), client, (i) => {
        const d = fixable[i % fixable.length];
        return client.request('textDocument/codeAction', { textDocument: { uri }, range: d.range, context: { diagnostics: [d] } });
      }),
    ]);
    console.log(`\nrequests on the ${BUDGET_SIZE}-output spec`);
    console.log(`${'measure (wall clock at the client)'.padEnd(40)}${'n'.padStart(5)}${'p50 ms'.padStart(9)}${'p95 ms'.padStart(9)}${'max ms'.padStart(9)}${'server CPU ms/op'.padStart(18)}`);
    for (const [name, { ms, cpuMs }] of rows) {
      console.log(`${name.padEnd(40)}${String(ms.length).padStart(5)} ${num(quantile(ms, 0.5))} ${num(quantile(ms, 0.95))} ${num(Math.max(...ms))} ${num(cpuMs, 17)}`);
    }
  } finally {
    await client.stop();
  }
}

/** Opens every file in a fresh server started with `nodeArgs`, then edits one; memory and CPU of both. */
async function memoryAndCpu(files: string[], nodeArgs: string[]): Promise<void> {
  const client = await LspClient.start({ nodeArgs });
  const pid = client.process.pid!;
  try {
    const start = performance.now();
    const cpuStart = (await stats(client)).cpuMicros;
    let last: OpenSpec | undefined;
    for (const file of files) last = await openSpec(client, file, BUDGET_SIZE);
    const openS = (performance.now() - start) / 1000;
    const opened = await stats(client);
    const openCpuS = (opened.cpuMicros - cpuStart) / 1e6;
    const rand = prng(11);
    const cpu: number[] = [];
    for (let e = 0; e < WARMUP + EDITS; e++) {
      const r = await editCycle(client, last!, rand);
      if (e >= WARMUP) cpu.push(r.cpuMs);
    }
    const edited = await stats(client);
    // V8 gives pages back once allocation calms down; an editor session spends most time idle.
    await new Promise((resolve) => setTimeout(resolve, 10_000));
    const idle = await stats(client);
    const mib = (b: number) => (b / 2 ** 20).toFixed(1).padStart(7);
    const flags = (nodeArgs.length ? nodeArgs.join(' ') : '(node defaults)').padEnd(44);
    console.log(
      `${flags}${mib(opened.rssBytes)}${peakRssMiB(pid).toFixed(1).padStart(7)}${mib(edited.rssBytes)}${mib(idle.rssBytes)}${mib(opened.heapUsedBytes)}` +
        `${openS.toFixed(1).padStart(8)}${openCpuS.toFixed(1).padStart(8)}${num(quantile(cpu, 0.5), 9)}`,
    );
  } finally {
    await client.stop();
  }
}

async function main(): Promise<void> {
  ensureBuilt();
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'waveplan-bench-'));
  try {
    const { bySize, many } = writeSpecs(dir);
    console.log(`waveplan language server — ${os.cpus().length} CPUs, node ${process.version}, load ${os.loadavg()[0].toFixed(1)}`);
    await scaling(bySize);
    if (process.env.FLAGS !== '0') {
      console.log(`\nserver flags: ${FILES} specs of ${BUDGET_SIZE} outputs opened one after another, then ${EDITS} edit cycles on the last (MiB, s, ms)`);
      console.log(`${'flags'.padEnd(44)}${'RSS'.padStart(7)}${'peak'.padStart(7)}${'edited'.padStart(7)}${'idle'.padStart(7)}${'heap'.padStart(7)}${'open s'.padStart(8)}${'CPU s'.padStart(8)}${'CPU/edit'.padStart(9)}`);
      for (const flags of FLAG_SETS) await memoryAndCpu(many, flags);
    }
    const load = os.loadavg()[0];
    console.log(`\nload average at the end: ${load.toFixed(1)} on ${os.cpus().length} CPUs${load > os.cpus().length ? ' — contended: wall-clock figures are inflated; CPU ms/op is the steadier figure' : ''}`);
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((error) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
