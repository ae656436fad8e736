// The hosts the report page is shown in, for the theme tests: a plain browser with either colour
// preference, and the editor's webview under each kind of theme. The editor marks <body> with the
// theme's kind, sets the theme's colours as --vscode-* variables on <html> and puts a default
// stylesheet of its own (in a cascade layer) before the page's. The values below were read from
// the webview of the report panel in VS Code 1.139 (code-server 4.139.1, the editor of test/e2e/)
// under its built-in themes Default Light Modern, Default Dark Modern, Default High Contrast and
// Default High Contrast Light; the stylesheet is the part of the editor's that touches this page.
// In that editor `prefers-color-scheme` stayed light under every theme, so the body class decides.

export interface Host {
  name: string;
  /** What the system's `prefers-color-scheme` says (inside the editor it must not matter). */
  colorScheme: 'light' | 'dark';
  /** The body classes of an editor webview; absent for a plain browser. */
  bodyClass?: string;
  vars?: Record<string, string>;
  /** A dark page (its background's relative luminance below 0.2) or a light one (above 0.6). */
  dark: boolean;
}

/** The editor's own stylesheet for webviews, placed before the page's (the rules that touch it). */
export const WEBVIEW_DEFAULT_CSS = `
@layer vscode-default {
  body { background-color: transparent; color: var(--vscode-editor-foreground); font-family: var(--vscode-font-family);
    font-size: var(--vscode-font-size); margin: 0; padding: 0 20px; }
  img, video { max-width: 100%; max-height: 100%; }
  a, a code { color: var(--vscode-textLink-foreground); }
  code { color: var(--vscode-textPreformat-foreground); background-color: var(--vscode-textPreformat-background);
    padding: 1px 3px; border-radius: 4px; }
}
`;

const FONT = { '--vscode-font-family': 'system-ui, "Ubuntu", "Droid Sans", sans-serif', '--vscode-font-size': '13px' };

export const HOSTS: Host[] = [
  { name: 'browser, light preference', colorScheme: 'light', dark: false },
  { name: 'browser, dark preference', colorScheme: 'dark', dark: true },
  {
    // A light theme on a system that prefers dark: the body class must win.
    name: 'editor, light theme',
    colorScheme: 'dark',
    bodyClass: 'vscode-light',
    dark: false,
    vars: {
      ...FONT,
      '--vscode-editor-background': '#ffffff',
      '--vscode-editor-foreground': '#3b3b3b',
      '--vscode-descriptionForeground': '#3b3b3b',
      '--vscode-textLink-foreground': '#005fb8',
      '--vscode-textPreformat-foreground': '#3b3b3b',
      '--vscode-textPreformat-background': 'rgba(0, 0, 0, 0.12)',
      '--vscode-panel-border': '#e5e5e5',
      '--vscode-editorError-foreground': '#e51400',
      '--vscode-editorWarning-foreground': '#bf8803',
    },
  },
  {
    name: 'editor, dark theme',
    colorScheme: 'light',
    bodyClass: 'vscode-dark',
    dark: true,
    vars: {
      ...FONT,
      '--vscode-editor-background': '#1f1f1f',
      '--vscode-editor-foreground': '#cccccc',
      '--vscode-descriptionForeground': '#9d9d9d',
      '--vscode-textLink-foreground': '#4daafc',
      '--vscode-textPreformat-foreground': '#d0d0d0',
      '--vscode-textPreformat-background': '#3c3c3c',
      '--vscode-panel-border': '#2b2b2b',
      '--vscode-editorError-foreground': '#f14c4c',
      '--vscode-editorWarning-foreground': '#cca700',
    },
  },
  {
    name: 'editor, high contrast (dark)',
    colorScheme: 'light',
    bodyClass: 'vscode-high-contrast',
    dark: true,
    vars: {
      ...FONT,
      '--vscode-editor-background': '#000000',
      '--vscode-editor-foreground': '#ffffff',
      '--vscode-descriptionForeground': 'rgba(255, 255, 255, 0.7)',
      '--vscode-textLink-foreground': '#21a6ff',
      '--vscode-textPreformat-foreground': '#ffffff',
      '--vscode-panel-border': '#6fc3df',
      '--vscode-contrastBorder': '#6fc3df',
      '--vscode-editorError-foreground': '#f48771',
      '--vscode-editorWarning-foreground': '#ffd370',
    },
  },
  {
    name: 'editor, high contrast light',
    colorScheme: 'dark',
    bodyClass: 'vscode-high-contrast-light vscode-high-contrast',
    dark: false,
    vars: {
      ...FONT,
      '--vscode-editor-background': '#ffffff',
      '--vscode-editor-foreground': '#292929',
      '--vscode-descriptionForeground': 'rgba(41, 41, 41, 0.7)',
      '--vscode-textLink-foreground': '#0f4a85',
      '--vscode-textPreformat-foreground': '#ffffff',
      '--vscode-textPreformat-background': '#09345f',
      '--vscode-panel-border': '#0f4a85',
      '--vscode-contrastBorder': '#0f4a85',
      '--vscode-editorError-foreground': '#b5200d',
      '--vscode-editorWarning-foreground': '#895503',
    },
  },
];
