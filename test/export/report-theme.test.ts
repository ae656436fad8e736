// The report page under every host it meets (test/export/themes.ts): a browser with a light or a
// dark preference, and the editor's webview under a light, dark, high contrast and high contrast
// light theme. In real Chromium (as in report.test.ts), for the demo and a wide board: the page
// takes the host's colours, every piece of text — body text, table cells, badges, links, headings,
// captions — has a WCAG 2.1 contrast ratio of at least 4.5:1 against what it is drawn on (SC 1.4.3),
// and under high contrast every badge, card, table rule and picture has a visible edge (3:1, WCAG
// 2.1 SC 1.4.11), so nothing is told by colour alone.
import * as fs from 'node:fs';
import * as path from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Verdict } from '../../server/src/planning/types';
import { contrast, effectiveBackground, luminance, parseColour } from './contrast';
import { read, type Reading, type TextSample } from './page-readings';
import { DEMO, FIXTURES, launchChromium, run, scratch } from './support';
import { HOSTS } from './themes';

const REPORTS = { demo: DEMO, 'wide board': path.join(FIXTURES, 'wide-board.wave.yaml') };
const VERDICTS: Record<Verdict, true> = { exact: true, 'within-tolerance': true, fractional: true, 'out-of-tolerance': true, pinned: true, 'no-plan': true };
let browser: Browser;
const files: Record<string, string> = {};

beforeAll(async () => {
  const dir = scratch('report-theme');
  for (const [name, spec] of Object.entries(REPORTS)) {
    files[name] = path.join(dir, `${name.replace(/ /g, '-')}.html`);
    await run('report', [spec, '--html', files[name]!]);
    if (!fs.existsSync(files[name]!)) throw new Error(`no report written for ${spec}`);
  }
  browser = await launchChromium();
}, 60_000);

afterAll(async () => {
  await browser?.close();
});

function ratioOf(s: TextSample): number {
  return contrast(parseColour(s.colour), effectiveBackground(s.backgrounds));
}

const hexToRgb = (hex: string) => {
  const n = parseInt(hex.slice(1), 16);
  return { r: n >> 16, g: (n >> 8) & 255, b: n & 255, a: 1 };
};

describe('the contrast arithmetic (WCAG 2.1)', () => {
  it('black on white is 21:1 and white on white 1:1 (derived: (1 + 0.05)/(0 + 0.05))', () => {
    expect(contrast(hexToRgb('#000000'), hexToRgb('#ffffff'))).toBeCloseTo(21, 10);
    expect(contrast(hexToRgb('#ffffff'), hexToRgb('#ffffff'))).toBe(1);
  });
  it('#767676 is the lightest grey that passes 4.5:1 on white, #777777 fails (common practice)', () => {
    expect(contrast(hexToRgb('#767676'), hexToRgb('#ffffff'))).toBeGreaterThanOrEqual(4.5);
    expect(contrast(hexToRgb('#777777'), hexToRgb('#ffffff'))).toBeLessThan(4.5);
  });
  it('a translucent colour is composited first: white at 50 % on black is #808080 (derived)', () => {
    const half = effectiveBackground(['rgba(255, 255, 255, 0.5)', 'rgb(0, 0, 0)']);
    expect(half.r).toBeCloseTo(127.5, 10);
    expect(luminance(half)).toBeCloseTo(((127.5 / 255 + 0.055) / 1.055) ** 2.4, 12);
  });
});

const WIDE = 1280;
const NARROW = 450;

describe.each(HOSTS)('the report, $name', (host) => {
  const readings: Record<string, Record<number, Reading>> = {};
  beforeAll(async () => {
    for (const [report, file] of Object.entries(files)) readings[report] = { [WIDE]: await read(browser, host, file, WIDE), [NARROW]: await read(browser, host, file, NARROW) };
  }, 60_000);
  const each = Object.keys(REPORTS).flatMap((report) => [WIDE, NARROW].map((width) => ({ report, width })));

  it.each(each)('$report at $width px: takes the host’s background', ({ report, width }) => {
    const bg = parseColour(readings[report]![width]!.background);
    if (host.vars) expect(bg).toEqual(hexToRgb(host.vars['--vscode-editor-background']!));
    if (host.dark) expect(luminance(bg)).toBeLessThan(0.2);
    else expect(luminance(bg)).toBeGreaterThan(0.6);
  });

  it.each(each)('$report at $width px: every text has a contrast of at least 4.5:1 (WCAG 2.1 SC 1.4.3)', ({ report, width }) => {
    const samples = readings[report]![width]!.texts;
    expect([...new Set(samples.map((s) => s.kind))].sort()).toEqual(['badge', 'heading', 'link', 'table cell', 'text']);
    const failing = samples.map((s) => ({ what: `${s.kind}: ${s.what}`, ratio: ratioOf(s) })).filter((s) => !(s.ratio >= 4.5));
    expect(failing).toEqual([]);
  });

  it('shows a badge of every verdict across the two reports; the lowest ratios, for the record', () => {
    const seen = new Set(Object.values(readings).flatMap((r) => r[WIDE]!.badges.map((c) => c.replace('badge ', ''))));
    expect([...seen].sort()).toEqual(Object.keys(VERDICTS).sort());
    const lowest: Record<string, { ratio: number; what: string }> = {};
    for (const s of Object.values(readings).flatMap((r) => [...r[WIDE]!.texts, ...r[NARROW]!.texts])) {
      const ratio = ratioOf(s);
      if (!lowest[s.kind] || ratio < lowest[s.kind]!.ratio) lowest[s.kind] = { ratio, what: s.what };
    }
    console.log(`${host.name}: ${Object.entries(lowest).map(([k, v]) => `${k} ${v.ratio.toFixed(2)}:1 (${v.what})`).join('; ')}`);
    expect(Object.keys(lowest).sort()).toEqual(['badge', 'heading', 'link', 'table cell', 'text']);
  });

  it('draws its pictures as framed light cards: each SVG brings its own light ground, the page an edge around it', () => {
    const frames = readings.demo![WIDE]!.frames;
    expect(frames.length).toBeGreaterThan(0);
    for (const f of frames) {
      // RFC 2397 data URI, base64 (RFC 4648): the picture's first shape is its ground, the whole size.
      const svg = Buffer.from(f.src.replace(/^data:image\/svg\+xml;base64,/, ''), 'base64').toString('utf8');
      const size = /<svg [^>]*width="(\d+)" height="(\d+)"/.exec(svg);
      const ground = /<\/title><rect x="0" y="0" width="(\d+)" height="(\d+)" fill="(#[0-9a-f]{6})"\/>/.exec(svg);
      expect(ground?.slice(1, 3)).toEqual(size?.slice(1, 3));
      expect(luminance(hexToRgb(ground![3]!))).toBeGreaterThan(0.6);
      expect(luminance(parseColour(f.background))).toBeGreaterThan(0.6);
      expect(f.border).toBeGreaterThanOrEqual(1);
    }
  });

  it.each(Object.keys(REPORTS))('%s at 450 px: nothing scrolls sideways; every table stacks into labelled cards', (report) => {
    const r = readings[report]![NARROW]!;
    console.log(`${host.name}, ${report} at ${NARROW} px: scrollWidth ${r.scrollWidth}`);
    expect(r.scrollWidth).toBeLessThanOrEqual(NARROW);
    for (const h of r.holders) expect(h.scrollWidth).toBeLessThanOrEqual(h.clientWidth);
    expect(r.tables.length).toBeGreaterThan(0);
    for (const t of r.tables) {
      expect(t.stacked).toBe(true);
      for (const row of t.rows) {
        expect(row.map((c) => c.label)).toEqual(t.headers);
        expect(row.map((c) => c.drawn)).toEqual(t.headers.map((h) => JSON.stringify(h)));
      }
    }
  });

  it.each(Object.keys(REPORTS))('%s at 1280 px: the tables stay tables, one row per output', (report) => {
    const r = readings[report]![WIDE]!;
    expect(r.scrollWidth).toBeLessThanOrEqual(WIDE);
    for (const t of r.tables) {
      expect(t.stacked).toBe(false);
      for (const row of t.rows) expect(row.map((c) => c.drawn)).toEqual(t.headers.map(() => 'none'));
    }
  });

  if (host.bodyClass?.includes('vscode-high-contrast')) {
    it.each(each)('$report at $width px: every badge, card, finding, table cell and picture has an edge of at least 3:1 (WCAG 2.1 SC 1.4.11)', ({ report, width }) => {
      const edges = readings[report]![width]!.edges;
      expect(edges.length).toBeGreaterThan(0);
      const weak = edges
        .map((e) => {
          const bg = effectiveBackground(e.outside);
          return { what: e.what, best: Math.max(0, ...e.sides.map((s) => contrast(parseColour(s.colour), bg))) };
        })
        .filter((e) => !(e.best >= 3));
      expect(weak).toEqual([]);
    });
  }
});
