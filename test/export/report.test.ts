// The HTML report opened in headless Chromium (Debian's /usr/bin/chromium through playwright-core,
// flags as in test/e2e/README.md): every picture decodes, the page logs no errors and fetches nothing from
// the network; a screenshot goes to docs/report.png.
import * as fs from 'node:fs';
import * as path from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, FIXTURES, REPO, launchChromium, run, scratch } from './support';

let browser: Browser;
let html: string;
let file: string;
let code: number;

beforeAll(async () => {
  const dir = scratch('report');
  file = path.join(dir, 'report.html');
  const r = await run('report', [DEMO, path.join(FIXTURES, 'tone-lab.wave.yaml'), '--html', file]);
  code = r.code;
  html = fs.readFileSync(file, 'utf8');
  browser = await launchChromium();
}, 60_000);

afterAll(async () => {
  await browser?.close();
});

describe('the report page', () => {
  it('is written even though the demo has errors, and the exit code says so', () => {
    expect(code).toBe(html.includes('<b>error</b>') ? 1 : 0);
  });

  it('is self-contained: no URL outside data: in any src or href, a policy that forbids fetching', () => {
    for (const m of html.matchAll(/\s(?:src|href)="([^"]*)"/g)) expect(m[1]).toMatch(/^(data:image\/svg\+xml;base64,|#)/);
    expect(html).toContain(`default-src 'none'`);
    expect(html).not.toMatch(/<script|<link /);
  });

  it('renders in Chromium: every picture decodes, no console errors, no requests', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
    const problems: string[] = [];
    const requests: string[] = [];
    page.on('console', (m) => {
      if (m.type() === 'error' || m.type() === 'warning') problems.push(`${m.type()}: ${m.text()}`);
    });
    page.on('pageerror', (e) => problems.push(`pageerror: ${e.message}`));
    page.on('request', (r) => {
      if (!r.url().startsWith('data:') && !r.url().startsWith('file:')) requests.push(r.url());
    });
    await page.goto(`file://${file}`, { waitUntil: 'load' });
    const images = await page.$$eval('img', (imgs) =>
      imgs.map((i) => ({ alt: i.getAttribute('alt'), complete: i.complete, width: i.naturalWidth, height: i.naturalHeight })),
    );
    // Three pictures (waveform, seam, spectrum) per planned output, a jitter picture per
    // fractional plan, and one memory bar per spec.
    const planned = (html.match(/<article class="output"[^>]*><h4>[\s\S]*?<\/article>/g) ?? []).filter((a) => !a.includes('No plan'));
    const fractional = (html.match(/class="jitter"/g) ?? []).length;
    expect(images.length).toBe(planned.length * 3 + fractional + 2);
    expect((html.match(/class="spectrum"/g) ?? []).length).toBe(planned.length);
    expect(fractional).toBeGreaterThanOrEqual(1); // the fixture’s odd-tone at least
    for (const img of images) {
      expect(img.complete, img.alt ?? '').toBe(true);
      expect(img.width, img.alt ?? '').toBeGreaterThan(0);
      expect(img.height, img.alt ?? '').toBeGreaterThan(0);
    }
    expect(problems).toEqual([]);
    expect(requests).toEqual([]);
    const names = await page.$$eval('table.plans tbody tr td:first-child', (tds) => tds.map((t) => t.textContent));
    expect(names).toContain('coil-excitation');
    expect(names).toContain('odd-tone');
    fs.mkdirSync(path.join(REPO, 'docs'), { recursive: true });
    await page.screenshot({ path: path.join(REPO, 'docs/report.png'), fullPage: false });
    expect(fs.statSync(path.join(REPO, 'docs/report.png')).size).toBeGreaterThan(10_000);
    await page.close();
  }, 60_000);

  it('shows the same figures as the checker for an exact plan (96 MHz ÷ 8 / 128 = 93.75 kHz, derived)', () => {
    const row = /<tr><td data-label="output"><a href="#s1-pilot">pilot<\/a><\/td><td data-label="verdict"><span class="badge exact">exact<\/span><\/td>(.*?)<\/tr>/.exec(html)?.[1] ?? '';
    expect(row).toContain(
      '<td data-label="target">93.75 kHz</td><td data-label="achieved">93.75 kHz</td><td data-label="error">0 Hz (0 ppm)</td><td data-label="divider">÷8</td><td data-label="f_s">12 MHz</td><td data-label="N × M">128 × 1</td>',
    );
  });
});
