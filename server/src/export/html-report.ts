// The HTML plan report: one self-contained page (inline CSS, pictures as data URIs, a content
// policy that forbids any fetch) showing, per wave spec, the hardware, the memory budget, each
// output's plan with the checker's figures and pictures, and the findings.

import { toNumber } from '../../../shared-schema/src/rational';
import { sortedDiagnostics } from '../cli/checked';
import { formatBytes, formatHz, formatSeconds } from '../../../shared-schema/src/quantity-format';
import { formatCycles, formatDivider, formatPpm, formatSignedHz } from '../cli/units';
import type { Hardware } from '../planning/types';
import { jitterSvg, memorySvg, seamSvg, svgDataUri, waveformSvg } from '../render';
import { escapeXml as esc } from '../render/svg';
import { spectrumSvg } from '../render/spectrum';
import { floorOf, signalRows } from '../cli/signal-rows';
import { outputSignal } from '../signal/output-signal';
import { spectrumPicture } from '../signal/spectrum-picture';
import { dutyPhrase } from '../spec/planning-diagnostics';
import { clockProblem } from '../spec/analyze';
import type { OutputAnalysis } from '../spec/types';
import { REPORT_CSS } from './html-style';
import type { LoadedSpec } from './load';
import { spanOf } from './model';
import { clockTreeSection } from './clock-report';

const CAUTION =
  'Plans are arithmetic on the figures in the spec. Before connecting an amplifier, transducer or mains-powered ' +
  'equipment, or running a clock above its rating, check the parts’ datasheets, local codes and qualified practice.';

function picture(svg: string, caption: string, cls: string): string {
  return `<figure class="${cls}"><img alt="${esc(caption)}" src="${svgDataUri(svg)}"><figcaption>${esc(caption)}</figcaption></figure>`;
}

function hardwareList(hw: Hardware): string {
  const d = hw.divider;
  const items: Array<[string, string]> = [
    ['system clock', formatHz(hw.systemClockHz)],
    ['divider', `${d.integerMin}…${d.integerMax}${d.fractionBits > 0 ? ` + F/2^${d.fractionBits}` : ' (integer)'}`],
    ['DAC', `${hw.dac.bits}-bit, ${hw.dac.sampleBytes} B/sample, ${Number(hw.dac.fullScaleV.toPrecision(6))} V full scale, ≤ ${formatHz(hw.dac.maxSampleRateHz)}`],
    ['tables', `${hw.memory.tableLengthMin}…${hw.memory.tableLengthMax} samples${hw.memory.powerOfTwo ? ', power of two (DMA ring)' : ''}`],
    ['budget', formatBytes(hw.memory.budgetBytes)],
  ];
  return `<ul class="hardware">${items.map(([k, v]) => `<li><b>${esc(k)}</b>${esc(v)}</li>`).join('')}</ul>`;
}

function anchor(spec: number, o: OutputAnalysis): string {
  return `s${spec}-${o.name.replace(/[^A-Za-z0-9_-]/g, '_')}`;
}

function badge(verdict: string): string {
  return `<span class="badge ${esc(verdict)}">${esc(verdict)}</span>`;
}

/** The plans table's columns; each cell repeats its column's name (data-label) for the stacked narrow layout. */
const PLAN_COLUMNS = ['output', 'verdict', 'target', 'achieved', 'error', 'divider', 'f_s', 'N × M', 'TIE', 'seam', 'bytes'];

function planRow(i: number, o: OutputAnalysis): string {
  const p = o.planning.plan;
  const cells = p
    ? [
        formatHz(o.targetHz),
        formatHz(p.achievedHz),
        `${formatSignedHz(p.errorHz)} (${formatPpm(p.errorPpm)})`,
        formatDivider(p),
        formatHz(p.sampleRateHz),
        `${p.tableLength} × ${formatCycles(p.cycles)}`,
        p.jitterFree ? '—' : `${formatSeconds(p.jitter.tieRmsS)} rms`,
        p.seam.ok ? 'ok' : `${Number(p.seam.jumpLsb.toPrecision(4))} LSB`,
        formatBytes(p.tableBytes),
      ]
    : [formatHz(o.targetHz), '—', '—', '—', '—', '—', '—', '—', '—'];
  const tds = [`<a href="#${anchor(i, o)}">${esc(o.name)}</a>`, badge(o.planning.verdict), ...cells.map(esc)];
  return `<tr>${tds.map((td, k) => `<td data-label="${esc(PLAN_COLUMNS[k]!)}">${td}</td>`).join('')}</tr>`;
}

function outputArticle(i: number, o: OutputAnalysis, hw: Hardware | null): string {
  const p = o.planning.plan;
  const w = o.request.waveform;
  const head = `<h4>${esc(o.name)} ${badge(o.planning.verdict)}</h4>`;
  if (!p || !hw) return `<article class="output" id="${anchor(i, o)}">${head}<p class="none">No plan: see the findings.</p></article>`;
  const span = spanOf(o);
  const figures: Array<[string, string]> = [
    ['shape', `${w.shape}${dutyPhrase(p) ? `, ${dutyPhrase(p)}` : ''}, ${Number(w.amplitudeVpp.toPrecision(6))} Vpp around ${Number(w.offsetV.toPrecision(6))} V`],
    ['target', `${formatHz(o.targetHz)} ± ${formatHz(o.request.toleranceHz)}`],
    ['achieved', formatHz(p.achievedHz)],
    ['error', `${formatSignedHz(p.errorHz)} (${formatPpm(p.errorPpm)})`],
    ['divider', `${formatDivider(p)} → f_s ${formatHz(p.sampleRateHz)}`],
    ['table', `N = ${p.tableLength}, M = ${formatCycles(p.cycles)}, S = ${Number((p.tableLength / toNumber(p.cycles)).toPrecision(6))}, ${span} span`],
    [
      'jitter',
      p.jitterFree
        ? 'none (integer divider)'
        : `period ${formatSeconds(p.jitter.samplePeriodJitterPkPkS)} pk-pk / ${formatSeconds(p.jitter.samplePeriodJitterRmsS)} rms; TIE ${formatSeconds(p.jitter.tiePkPkS)} pk-pk / ${formatSeconds(p.jitter.tieRmsS)} rms; pattern ${p.jitter.patternLength}`,
    ],
    ['seam', p.seam.ok ? `ok (${Number(p.seam.jumpLsb.toPrecision(4))} LSB)` : `broken: ${Number(p.seam.jumpLsb.toPrecision(4))} LSB jump (${p.seam.cause ?? 'unknown'})`],
    ['memory', formatBytes(p.tableBytes)],
  ];
  const alt = o.planning.nearestJitterFree;
  if (alt && !p.jitterFree) figures.push(['nearest jitter-free', `${formatDivider(alt)}, ${alt.tableLength} × ${formatCycles(alt.cycles)} → ${formatHz(alt.achievedHz)} (${formatPpm(alt.errorPpm)})`]);
  // The signal figures of what the plan emits (computed here, on first use).
  for (const [k, v] of signalRows(hw, o.request, p, floorOf(o, hw))) figures.push([k, v]);
  const dl = `<dl class="figures">${figures.map(([k, v]) => `<dt>${esc(k)}</dt><dd>${esc(v)}</dd>`).join('')}</dl>`;
  const jitter = jitterSvg(p);
  const signal = outputSignal(hw, o.request, p);
  const pics =
    picture(waveformSvg(p, w, hw.dac, span), `${o.name}: output samples and the ideal signal`, 'waveform') +
    picture(seamSvg(p, w, hw.dac, span), `${o.name}: table wrap`, 'seam') +
    (jitter ? picture(jitter, `${o.name}: divider pattern and TIE`, 'jitter') : '') +
    (signal ? picture(spectrumSvg(spectrumPicture(signal, floorOf(o, hw).sfdrDb)), `${o.name}: spectrum, spurs, images and the quality floor`, 'spectrum') : '');
  return `<article class="output" id="${anchor(i, o)}">${head}${dl}<div class="pictures">${pics}</div></article>`;
}

function findings(spec: LoadedSpec): string {
  const ds = sortedDiagnostics(spec.analysis.diagnostics);
  if (ds.length === 0) return '<p class="none">No findings.</p>';
  const items = ds.map(
    (d) =>
      `<li class="${d.severity}"><code>${esc(`${spec.path}:${d.range.start.line + 1}:${d.range.start.character + 1}`)}</code> <b>${esc(d.severity)}</b> <code>${esc(d.code)}</code> ${esc(d.message)}</li>`,
  );
  return `<ul class="findings">${items.join('')}</ul>`;
}

function specSection(i: number, spec: LoadedSpec): string {
  const a = spec.analysis;
  const hw = a.hardware;
  const parts = [
    `<section class="spec"><h2>${esc(spec.path)}</h2>`,
    `<p class="meta">clock ${esc(spec.clockPath ?? '(unresolved)')} · sha256 ${spec.contentHash}</p>`,
    hw ? hardwareList(hw) : '<p class="none">The clock file could not be read; see the findings.</p>',
    clockTreeSection(a),
  ];
  if (a.memory) {
    const segments = a.outputs.filter((o) => o.planning.plan).map((o) => ({ name: o.name, bytes: o.planning.plan!.tableBytes }));
    parts.push('<h3>Memory</h3>', `<div class="pictures">${picture(memorySvg(segments, a.memory.budgetBytes), 'table memory against the budget', 'memory')}</div>`);
  }
  parts.push(
    '<h3>Plans</h3>',
    a.outputs.length === 0
      ? `<p class="none">${esc(clockProblem(a) ? `No outputs planned: ${clockProblem(a)}.` : 'No outputs.')}</p>`
      : `<div class="scroll"><table class="plans"><thead><tr>${PLAN_COLUMNS.map((h) => `<th>${h}</th>`).join('')}</tr></thead><tbody>${a.outputs.map((o) => planRow(i, o)).join('')}</tbody></table></div>`,
    '<h3>Findings</h3>',
    findings(spec),
    ...a.outputs.map((o) => outputArticle(i, o, hw)),
    '</section>',
  );
  return parts.join('\n');
}

export function reportHtml(specs: readonly LoadedSpec[]): string {
  const all = specs.flatMap((s) => s.analysis.diagnostics);
  const count = (sev: string) => all.filter((d) => d.severity === sev).length;
  const outputs = specs.reduce((n, s) => n + s.analysis.outputs.length, 0);
  const summary = `${specs.length} spec${specs.length === 1 ? '' : 's'}, ${outputs} output${outputs === 1 ? '' : 's'}, ${count('error')} error(s), ${count('warning')} warning(s)`;
  return [
    '<!doctype html>',
    '<html lang="en"><head><meta charset="utf-8">',
    // The writers recognise their own page by this line (spec/containment.ts) and replace only it.
    '<meta name="generator" content="waveplan report">',
    `<meta http-equiv="Content-Security-Policy" content="default-src 'none'; img-src data:; style-src 'unsafe-inline'">`,
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    `<title>waveplan report — ${esc(specs.map((s) => s.path).join(', '))}</title>`,
    `<style>${REPORT_CSS}</style></head><body>`,
    `<header class="page"><h1>waveplan <span>plan report</span></h1><p>${esc(summary)}</p></header>`,
    '<main>',
    ...specs.map((s, i) => specSection(i, s)),
    '</main>',
    `<footer class="page">${esc(CAUTION)}</footer>`,
    '</body></html>',
    '',
  ].join('\n');
}
