// The report's look: a paper-and-ink page that matches the pictures' palette; print-friendly.
export const REPORT_CSS = `
:root { --paper:#fbf8f1; --ink:#2b2720; --muted:#7a735f; --rule:#ddd5c2; --blue:#1d4e89; --copper:#c46d1c;
  --ok:#3c7a3a; --warn:#a8700f; --fault:#b23a2e; --card:#fffdf8; }
* { box-sizing: border-box; }
body { margin:0; background:var(--paper); color:var(--ink); font:14px/1.45 Verdana, "DejaVu Sans", sans-serif; }
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
.badge { display:inline-block; padding:0 7px; border-radius:9px; font-size:11.5px; color:#fff; }
.badge.exact, .badge.within-tolerance { background:var(--ok); }
.badge.fractional, .badge.pinned { background:var(--warn); }
.badge.out-of-tolerance, .badge.no-plan { background:var(--fault); }
ul.findings { list-style:none; padding:0; margin:0; font-size:13px; }
ul.findings li { padding:4px 8px; border-left:4px solid var(--muted); margin:3px 0; background:var(--card); }
ul.findings li.error { border-color:var(--fault); }
ul.findings li.warning { border-color:var(--warn); }
ul.findings code { font-size:12px; color:var(--muted); }
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
`;
