// The hosts the report page is shown in, for the theme tests: a plain browser with either colour
// preference, and the editor's webview under each kind of theme. The editor marks <body> with the
// theme's kind and sets the theme's colours as --vscode-* variables on <html>, after a default
// stylesheet of its own; the values below are representative of the editor's built-in themes
// (`from memory`, not read from a running editor), enough to show the page takes the editor's
// colours where it has them and keeps readable ones where it has not.

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

/** The editor's own stylesheet for webviews, placed before the page's (`from memory`, abridged). */
export const WEBVIEW_DEFAULT_CSS = `
body { background-color: transparent; color: var(--vscode-editor-foreground); font-family: var(--vscode-font-family);
  font-size: var(--vscode-font-size); margin: 0; padding: 0 20px; }
img, video { max-width: 100%; max-height: 100%; }
a, a code { color: var(--vscode-textLink-foreground); }
code { color: var(--vscode-textPreformat-foreground); }
`;

const FONT = { '--vscode-font-family': 'sans-serif', '--vscode-font-size': '13px' };

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
      '--vscode-editor-foreground': '#000000',
      '--vscode-descriptionForeground': '#717171',
      '--vscode-textLink-foreground': '#006ab1',
      '--vscode-textPreformat-foreground': '#a31515',
      '--vscode-panel-border': 'rgba(128, 128, 128, 0.35)',
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
      '--vscode-editor-background': '#1e1e1e',
      '--vscode-editor-foreground': '#d4d4d4',
      '--vscode-descriptionForeground': 'rgba(204, 204, 204, 0.7)',
      '--vscode-textLink-foreground': '#3794ff',
      '--vscode-textPreformat-foreground': '#d7ba7d',
      '--vscode-panel-border': 'rgba(128, 128, 128, 0.35)',
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
      '--vscode-textPreformat-foreground': '#d7ba7d',
      '--vscode-panel-border': '#6fc3df',
      '--vscode-contrastBorder': '#6fc3df',
      '--vscode-editorError-foreground': '#f48771',
      '--vscode-editorWarning-foreground': '#ffd370',
    },
  },
  {
    name: 'editor, high contrast light',
    colorScheme: 'dark',
    bodyClass: 'vscode-high-contrast vscode-high-contrast-light',
    dark: false,
    vars: {
      ...FONT,
      '--vscode-editor-background': '#ffffff',
      '--vscode-editor-foreground': '#292929',
      '--vscode-descriptionForeground': 'rgba(41, 41, 41, 0.7)',
      '--vscode-textLink-foreground': '#0f4a85',
      '--vscode-textPreformat-foreground': '#a31515',
      '--vscode-panel-border': '#0f4a85',
      '--vscode-contrastBorder': '#0f4a85',
      '--vscode-editorError-foreground': '#b5200d',
      '--vscode-editorWarning-foreground': '#895503',
    },
  },
];
