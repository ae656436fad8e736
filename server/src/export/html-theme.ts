// The report's colours. One page serves two hosts: a browser opening `waveplan report --html`,
// and the editor's report panel (a webview), which marks <body> with the theme's kind
// (vscode-light, vscode-dark, vscode-high-contrast, plus vscode-high-contrast-light for the light
// one) and defines the theme's colours as --vscode-* variables.
//
// So the colours come in two layers. The --wp-* palette is the page's own: light by default, dark
// under `prefers-color-scheme: dark` (screen only; print stays paper and ink), and set again by
// each body class, so inside the editor the theme's kind decides, not the system's preference.
// The names the rules use (--paper, --ink, …) take the editor's variable where it has one and the
// palette otherwise. Badges keep colours of their own, picked for a contrast of at least 4.5:1
// with their text in every theme (test/export/report-theme.test.ts measures it); high contrast
// draws them as outlined words, as it draws every edge, so no meaning rests on colour alone.
// The pictures are SVG on their own light paper (shared with the hover); on a dark page they sit
// as framed light cards.

import { palette } from '../render/palette';

const LIGHT = `--wp-paper:#fbf8f1; --wp-card:#fffdf8; --wp-ink:#2b2720; --wp-muted:#6b6453; --wp-rule:#ddd5c2;
  --wp-link:#1d4e89; --wp-copper:#a65a14; --wp-ok:#3c7a3a; --wp-warn:#8a5a00; --wp-fault:#b23a2e; --wp-badge-ink:#ffffff;`;
const DARK = `--wp-paper:#1d1b17; --wp-card:#26231e; --wp-ink:#ece6d8; --wp-muted:#b0a792; --wp-rule:#4d4639;
  --wp-link:#8fb8ea; --wp-copper:#e49a58; --wp-ok:#86c983; --wp-warn:#e3b35a; --wp-fault:#f2917f; --wp-badge-ink:#1a1712;`;

export const THEME_CSS = `
:root { color-scheme:light; ${LIGHT} }
@media screen and (prefers-color-scheme: dark) { :root { color-scheme:dark; ${DARK} } }
body.vscode-light, body.vscode-high-contrast-light { color-scheme:light; ${LIGHT} }
body.vscode-dark, body.vscode-high-contrast:not(.vscode-high-contrast-light) { color-scheme:dark; ${DARK} }
body {
  --paper:var(--vscode-editor-background, var(--wp-paper));
  --ink:var(--vscode-editor-foreground, var(--wp-ink));
  --muted:var(--vscode-descriptionForeground, var(--wp-muted));
  --rule:var(--vscode-panel-border, var(--wp-rule));
  --link:var(--vscode-textLink-foreground, var(--wp-link));
  --card:var(--wp-card); --copper:var(--wp-copper);
  --ok:var(--wp-ok); --warn:var(--wp-warn); --fault:var(--wp-fault); --badge-ink:var(--wp-badge-ink);
  --error-edge:var(--vscode-editorError-foreground, var(--wp-fault));
  --warning-edge:var(--vscode-editorWarning-foreground, var(--wp-warn));
}
body.vscode-light, body.vscode-dark, body.vscode-high-contrast { --card:var(--paper); }
body.vscode-high-contrast { --muted:var(--ink); --copper:var(--ink); --rule:var(--vscode-contrastBorder, var(--ink)); }
a { color:var(--link); }
.pictures img { background:${palette.paper}; border-radius:3px; }
body.vscode-high-contrast a { text-decoration:underline; }
body.vscode-high-contrast .badge { background:transparent; color:var(--ink); border:1px solid var(--rule); }
body.vscode-high-contrast article.output, body.vscode-high-contrast ul.findings li { border:1px solid var(--rule); }
body.vscode-high-contrast ul.findings li.warning { border-left:4px dashed var(--warning-edge); }
body.vscode-high-contrast ul.findings li.error { border-left:4px solid var(--error-edge); }
body.vscode-high-contrast .pictures img { border:2px solid var(--rule); }
`;
