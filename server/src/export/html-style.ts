// The report's look: a paper-and-ink page that matches the pictures' palette; print-friendly.
// The colours per theme live in html-theme.ts, after the layout so a theme's rule wins a tie.
// Below 600 px (the editor's panel in a column beside the spec) the tables stack: each row is a
// card, each value a line labelled with its column's name (the cell's data-label), so a 450 px
// column shows everything without scrolling sideways; long words break rather than overflow.
import { THEME_CSS } from './html-theme';

const LAYOUT_CSS = `
* { box-sizing: border-box; }
body { margin:0; padding:0; background:var(--paper); color:var(--ink); font:14px/1.45 Verdana, "DejaVu Sans", sans-serif; }
header.page { padding:22px 32px 14px; border-bottom:3px double var(--rule); }
header.page h1 { margin:0; font-size:22px; letter-spacing:.02em; }
header.page h1 span { color:var(--copper); }
header.page p { margin:4px 0 0; color:var(--muted); }
main { padding:8px 32px 32px; }
.scroll { overflow-x:auto; }
section.spec { margin-top:22px; }
section.spec > h2 { font-size:18px; margin:0 0 2px; font-family:"DejaVu Sans Mono", monospace; }
.meta { color:var(--muted); font-size:12px; margin:0 0 10px; word-break:break-all; }
.hardware { display:flex; flex-wrap:wrap; gap:6px 22px; margin:8px 0 12px; padding:0; list-style:none; }
.hardware li b { color:var(--muted); font-weight:normal; margin-right:4px; }
h3 { font-size:15px; margin:18px 0 6px; border-bottom:1px solid var(--rule); padding-bottom:2px; }
table.plans { border-collapse:collapse; width:100%; font-size:12.5px; background:var(--card); }
table.plans th, table.plans td { padding:4px 8px; border-bottom:1px solid var(--rule); text-align:right; white-space:nowrap; }
table.plans th:nth-child(-n+2), table.plans td:nth-child(-n+2) { text-align:left; }
table.plans th { color:var(--muted); font-weight:normal; border-bottom:2px solid var(--rule); }
.badge { display:inline-block; padding:0 7px; border-radius:9px; font-size:11.5px; color:var(--badge-ink); }
.badge.exact, .badge.within-tolerance { background:var(--ok); }
.badge.fractional, .badge.pinned { background:var(--warn); }
.badge.out-of-tolerance, .badge.no-plan { background:var(--fault); }
ul.findings { list-style:none; padding:0; margin:0; font-size:13px; }
ul.findings li { padding:4px 8px; border-left:4px solid var(--muted); margin:3px 0; background:var(--card); }
ul.findings li.error { border-color:var(--error-edge); }
ul.findings li.warning { border-color:var(--warning-edge); }
ul.findings code { font-size:12px; color:var(--muted); background:none; padding:0; }
.none { color:var(--muted); font-style:italic; }
article.output { margin-top:16px; padding:10px 14px 12px; background:var(--card); border:1px solid var(--rule); border-radius:6px; }
article.output h4 { margin:0 0 6px; font-size:15px; }
dl.figures { display:grid; grid-template-columns:max-content 1fr max-content 1fr; gap:2px 14px; margin:0 0 8px; font-size:13px; }
dl.figures dt { color:var(--muted); }
dl.figures dd { margin:0; }
.pictures { display:flex; flex-wrap:wrap; gap:10px; }
.pictures figure { margin:0; }
.pictures figcaption { font-size:11.5px; color:var(--muted); }
.pictures img { display:block; max-width:100%; height:auto; border:1px solid var(--rule); }
footer.page { padding:12px 32px 28px; color:var(--muted); font-size:12px; border-top:1px solid var(--rule); }
@media (max-width: 600px) {
  header.page { padding:16px 14px 12px; }
  main { padding:4px 14px 24px; overflow-wrap:anywhere; }
  footer.page { padding:12px 14px 24px; }
  .scroll { overflow-x:visible; }
  table.plans, table.plans tbody, table.plans tr, table.plans td { display:block; width:100%; }
  table.plans { background:none; }
  table.plans thead { position:absolute; width:1px; height:1px; overflow:hidden; clip-path:inset(50%); white-space:nowrap; }
  table.plans tr { margin:0 0 8px; padding:2px 0; background:var(--card); border:1px solid var(--rule); border-radius:6px; }
  table.plans td, table.plans td:nth-child(-n+2) { display:flex; justify-content:space-between; gap:12px; text-align:right; white-space:normal; }
  table.plans td:last-child { border-bottom:none; }
  table.plans td::before { content:attr(data-label); color:var(--muted); text-align:left; flex:none; }
  dl.figures { grid-template-columns:max-content 1fr; }
}
`;

export const REPORT_CSS = LAYOUT_CSS + THEME_CSS;
