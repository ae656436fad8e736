// What the theme tests read from the report page in Chromium: the host put in as the editor does
// (its stylesheet, variables and body class), then every text with its colour and the backgrounds
// beneath it, the edges of the page's parts, the pictures, the widths and the tables' labels.
// The functions given to page.evaluate run in the page; the project's tsconfig has no DOM library,
// so the little of the DOM they use is declared here, for this module only.
import type { Browser, Page } from 'playwright-core';
import { WEBVIEW_DEFAULT_CSS, type Host } from './themes';

interface Style {
  color: string;
  backgroundColor: string;
  content: string;
  display: string;
  borderTopWidth: string;
  getPropertyValue(name: string): string;
  setProperty(name: string, value: string): void;
}
interface Elem {
  tagName: string;
  className: string;
  textContent: string | null;
  parentElement: Elem | null;
  scrollWidth: number;
  clientWidth: number;
  style: Style;
  closest(selector: string): Elem | null;
  matches(selector: string): boolean;
  getAttribute(name: string): string | null;
  querySelector(selector: string): Elem | null;
  querySelectorAll(selector: string): ArrayLike<Elem>;
  prepend(child: Elem): void;
}
declare const document: {
  head: Elem;
  body: Elem;
  documentElement: Elem;
  createElement(tag: string): Elem;
  querySelectorAll(selector: string): ArrayLike<Elem>;
  createTreeWalker(root: Elem, show: number): { nextNode(): { parentElement: Elem | null; textContent: string | null } | null };
};
declare const NodeFilter: { SHOW_TEXT: number };
declare function getComputedStyle(el: Elem, pseudo?: string): Style;

/** The report as `host` shows it: the editor's stylesheet, variables and body class put in as the editor does. */
async function openIn(browser: Browser, host: Host, file: string, width: number): Promise<Page> {
  const context = await browser.newContext({ viewport: { width, height: 900 }, colorScheme: host.colorScheme });
  const page = await context.newPage();
  await page.goto(`file://${file}`, { waitUntil: 'load' });
  if (host.bodyClass) {
    await page.evaluate(
      ({ cls, vars, css }) => {
        const style = document.createElement('style');
        style.textContent = css;
        document.head.prepend(style);
        for (const [k, v] of Object.entries(vars)) document.documentElement.style.setProperty(k, v);
        document.body.className = cls;
      },
      { cls: host.bodyClass, vars: host.vars ?? {}, css: WEBVIEW_DEFAULT_CSS },
    );
  }
  return page;
}

export interface TextSample {
  kind: 'heading' | 'link' | 'badge' | 'table cell' | 'text';
  what: string;
  colour: string;
  /** background-color of the element and each ancestor, innermost first. */
  backgrounds: string[];
}

/** Every element that holds text of its own, and every column label the stacked tables draw. */
function textSamples(page: Page): Promise<TextSample[]> {
  return page.evaluate(() => {
    const stack = (el: Elem | null): string[] => {
      const s: string[] = [];
      for (let e = el; e; e = e.parentElement) s.push(getComputedStyle(e).backgroundColor);
      return s;
    };
    const kindOf = (el: Elem): TextSample['kind'] =>
      el.closest('.badge') ? 'badge' : el.closest('a') ? 'link' : el.closest('h1, h2, h3, h4') ? 'heading' : el.closest('td, th') ? 'table cell' : 'text';
    const out: TextSample[] = [];
    const seen = new Set<Elem>();
    const walker = document.createTreeWalker(document.body, NodeFilter.SHOW_TEXT);
    for (let n = walker.nextNode(); n; n = walker.nextNode()) {
      const el = n.parentElement;
      if (!el || seen.has(el) || !(n.textContent ?? '').trim()) continue;
      seen.add(el);
      const what = `${el.tagName.toLowerCase()}${el.className ? `.${String(el.className).trim().replace(/\s+/g, '.')}` : ''} "${(el.textContent ?? '').trim().slice(0, 40)}"`;
      out.push({ kind: kindOf(el), what, colour: getComputedStyle(el).color, backgrounds: stack(el) });
    }
    for (const td of Array.from(document.querySelectorAll('td'))) {
      const label = getComputedStyle(td, '::before');
      if (label.content && label.content !== 'none' && label.content !== 'normal')
        out.push({ kind: 'table cell', what: `td::before ${label.content}`, colour: label.color, backgrounds: stack(td) });
    }
    return out;
  });
}

export interface EdgeSample {
  what: string;
  /** Width and colour of each drawn side. */
  sides: Array<{ width: number; colour: string }>;
  /** The backgrounds outside the element, innermost first. */
  outside: string[];
}

/** The edges of the page's parts: badges, output cards, findings, table cells, pictures. */
function edgeSamples(page: Page): Promise<EdgeSample[]> {
  return page.evaluate(() => {
    const out: EdgeSample[] = [];
    const sidesOf = (el: Elem) => {
      const cs = getComputedStyle(el);
      return (['top', 'right', 'bottom', 'left'] as const)
        .map((s) => ({ width: parseFloat(cs.getPropertyValue(`border-${s}-width`)), colour: cs.getPropertyValue(`border-${s}-color`), style: cs.getPropertyValue(`border-${s}-style`) }))
        .filter((s) => s.style !== 'none' && s.width > 0)
        .map(({ width, colour }) => ({ width, colour }));
    };
    for (const part of Array.from(document.querySelectorAll('.badge, article.output, ul.findings li, table.plans td, .pictures img'))) {
      // The last cell of a stacked row has no rule of its own: the row's card is its edge.
      const el = part.matches('td:last-child') && sidesOf(part).length === 0 ? part.parentElement! : part;
      const outside: string[] = [];
      for (let e = el.parentElement; e; e = e.parentElement) outside.push(getComputedStyle(e).backgroundColor);
      out.push({ what: `${el.tagName.toLowerCase()}.${String(el.className).trim().replace(/\s+/g, '.')}`, sides: sidesOf(el), outside });
    }
    return out;
  });
}

export interface Reading {
  background: string;
  texts: TextSample[];
  edges: EdgeSample[];
  badges: string[];
  frames: Array<{ src: string; background: string; border: number }>;
  scrollWidth: number;
  /** Each scrolling table holder: how wide its content is against how wide it is. */
  holders: Array<{ scrollWidth: number; clientWidth: number }>;
  /** Per plans table: the column headers, and per row its cells' data-label and drawn label. */
  tables: Array<{ headers: string[]; stacked: boolean; rows: Array<Array<{ label: string; drawn: string }>> }>;
}

/** What the test checks of one report in one host at one width. */
export async function read(browser: Browser, host: Host, file: string, width: number): Promise<Reading> {
  const page = await openIn(browser, host, file, width);
  const [texts, edges] = [await textSamples(page), await edgeSamples(page)];
  const rest = await page.evaluate(() => ({
    background: getComputedStyle(document.body).backgroundColor,
    badges: Array.from(document.querySelectorAll('.badge')).map((b) => b.className),
    frames: Array.from(document.querySelectorAll('.pictures img')).map((i) => ({
      src: i.getAttribute('src') ?? '',
      background: getComputedStyle(i).backgroundColor,
      border: parseFloat(getComputedStyle(i).borderTopWidth),
    })),
    scrollWidth: document.documentElement.scrollWidth,
    holders: Array.from(document.querySelectorAll('.scroll')).map((d) => ({ scrollWidth: d.scrollWidth, clientWidth: d.clientWidth })),
    tables: Array.from(document.querySelectorAll('table.plans')).map((t) => ({
      headers: Array.from(t.querySelectorAll('th')).map((th) => th.textContent ?? ''),
      stacked: getComputedStyle(t.querySelector('tr')!).display === 'block',
      rows: Array.from(t.querySelectorAll('tbody tr')).map((tr) =>
        Array.from(tr.querySelectorAll('td')).map((td) => ({ label: td.getAttribute('data-label') ?? '', drawn: getComputedStyle(td, '::before').content })),
      ),
    })),
  }));
  await page.context().close();
  return { texts, edges, ...rest };
}

