// What the .vsix may hold. vsce (the VS Code extension packager, its "Publishing Extensions"
// documentation) writes the manifest files at the top and the extension's own files under
// extension/, after applying .vscodeignore; it renames LICENSE to LICENSE.txt and README.md to
// readme.md. Anything else in the archive means .vscodeignore let it through.

import { execFileSync } from 'node:child_process';
import { expect } from './checks.mjs';

const REQUIRED = [
  'extension.vsixmanifest',
  '[Content_Types].xml',
  'extension/package.json',
  'extension/readme.md',
  'extension/LICENSE.txt',
  'extension/dist/extension.js',
  'extension/dist/waveplan.js',
  'extension/language-configuration.json',
  'extension/syntaxes/waveplan.tmLanguage.json',
];
const ALLOWED = [/^extension\/syntaxes\/[^/]+\.json$/, /^extension\/images\/[^/]+\.png$/];

export function listVsix(vsix) {
  return execFileSync('unzip', ['-Z1', vsix], { encoding: 'utf8' })
    .split('\n')
    .filter((line) => line !== '' && !line.endsWith('/'));
}

/** Passes with the file list; fails naming what is missing or what slipped in. */
export function checkPackage(vsix) {
  const entries = listVsix(vsix);
  const missing = REQUIRED.filter((f) => !entries.includes(f));
  const extra = entries.filter((f) => !REQUIRED.includes(f) && !ALLOWED.some((re) => re.test(f)));
  expect(missing.length === 0, `missing from the .vsix: ${missing.join(', ')}`);
  expect(extra.length === 0, `not meant to ship: ${extra.join(', ')}`);
  return `${entries.length} files: ${entries.join(', ')}`;
}
