// What the documentation tests read: the repository's own text files and the citations in them.
// A citation is recognised by its form — a standard's number, an application note, a protocol or
// language edition, an author with a year — so a new source is caught without being named here.

import * as fs from 'node:fs';
import * as path from 'node:path';
import { fileURLToPath } from 'node:url';

export const ROOT = fileURLToPath(new URL('../..', import.meta.url)).replace(/[\\/]$/, '');

/** Folders that are not the project's own text: installs, builds, caches, version control. */
const SKIP_DIRS = new Set(['node_modules', 'dist', 'out', '.git', '.e2e-tools', 'test-results', 'generated']);
/** Files that hold no prose: binaries, lock files, digests. */
const SKIP_FILE = /\.(png|jpe?g|gif|vsix|tgz|sha256|sarif)$|^package-lock\.json$|^\.git$/;

/** Every text file of the repository, as paths relative to the root. */
export function repoFiles(): string[] {
  const out: string[] = [];
  const walk = (rel: string): void => {
    for (const e of fs.readdirSync(path.join(ROOT, rel), { withFileTypes: true })) {
      const child = rel ? `${rel}/${e.name}` : e.name;
      if (e.isDirectory()) {
        if (!SKIP_DIRS.has(e.name)) walk(child);
      } else if (e.isFile() && !SKIP_FILE.test(e.name)) out.push(child);
    }
  };
  walk('');
  return out.sort();
}

export const read = (rel: string): string => fs.readFileSync(path.join(ROOT, rel), 'utf8');

/** Files whose comments and titles cite sources: code, tests, scripts, docs. */
export function citingFiles(): string[] {
  return repoFiles().filter(
    (f) => /\.(ts|mjs|cjs|js|c|sh|md|ya?ml)$/.test(f) && !f.startsWith('docs/') && !f.includes('/golden/') && !f.includes('/fixtures/'),
  );
}

interface Form {
  pattern: RegExp;
  /** Set on the author-and-year form, whose first word may be an ordinary one. */
  author?: true;
  /** The text docs/REFERENCES.md must contain for this citation. */
  key: (m: RegExpExecArray) => string;
}

const whole = (m: RegExpExecArray): string => m[0];

/** The forms a citation takes in this repository's comments and test titles. */
export const CITATION_FORMS: Form[] = [
  { pattern: /\b(?:ADI )?((?:MT|AN)-\d{3,4})\b/g, key: (m) => m[1]! },
  { pattern: /\bIEEE Std \d{3,4}(?:-\d{4})?/g, key: whole },
  { pattern: /\bITU-T [A-Z]\.\d+/g, key: whole },
  { pattern: /\bRFC \d{3,5}\b/g, key: whole },
  { pattern: /\bLSP \d\.\d+/g, key: whole },
  { pattern: /\bSARIF \d\.\d\.\d/g, key: whole },
  { pattern: /(?<![#\w])C(?:89|90|99|11|17|23)\b/g, key: whole },
  { pattern: /\bC\+\+\d\d\b/g, key: whole },
  { pattern: /\bCircuit Cellar,? (?:issue )?#?(\d+)/g, key: (m) => `Circuit Cellar #${m[1]}` },
  { pattern: /\bJSON Schema \d{4}-\d\d\b/g, key: whole },
  { pattern: /\bYAML 1\.\d\b/g, key: whole },
  { pattern: /\bWCAG \d\.\d\b/g, key: whole },
  { pattern: /\bIMTC \d{4}\b/g, key: whole },
  { pattern: /\bIEC \d{4,5}(?:-\d+)?/g, key: whole },
  { pattern: /\bISO(?:\/IEC)? \d{3,5}(?:-\d+)?/g, key: whole },
  { pattern: /\bECMA(?:Script|-\d+)\b/g, key: whole },
  { pattern: /\bSI Brochure\b/g, key: whole },
  { pattern: /\bOASIS\b/g, key: whole },
  { pattern: /\bC?Python\b/g, key: () => 'Python' },
  { pattern: /\bProofWiki\b/g, key: whole },
  { pattern: /\bNPTEL\b/g, key: whole },
  { pattern: /\bBSTJ\b|\bBell System Technical Journal\b/g, key: () => 'Bell System Technical Journal' },
  // An author and a year: "Bennett 1948", "Blair, IMTC 2002", "Gentile, 2016".
  { pattern: /\b([A-Z][a-z]{2,})(?: et al\.)?,? (?:[A-Z]{3,5},? )?(?:19[4-9]\d|20[0-4]\d)\b/g, key: (m) => m[1]!, author: true },
];

/** Words before a year that are not authors. */
const NOT_AUTHORS = new Set(['Std', 'Node', 'Since', 'From', 'Until', 'The', 'Edition', 'Debian', 'Ubuntu', 'Schema', 'Issue']);

export interface Citation {
  file: string;
  line: number;
  key: string;
  text: string;
}

/** Every citation in a text, with the key docs/REFERENCES.md must hold for it. */
export function citationsIn(file: string, text: string): Citation[] {
  const found: Citation[] = [];
  for (const form of CITATION_FORMS) {
    form.pattern.lastIndex = 0;
    for (let m = form.pattern.exec(text); m; m = form.pattern.exec(text)) {
      const key = form.key(m);
      if (form.author && NOT_AUTHORS.has(key)) continue;
      const line = text.slice(0, m.index).split('\n').length;
      found.push({ file, line, key, text: m[0] });
    }
  }
  return found;
}
