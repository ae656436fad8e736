// Writes the JSON Schemas, the TextMate grammar and the README's file reference from the zod schemas.
// Run: npx tsx shared-schema/generate.ts   (a test fails while the committed copies are stale)

import { readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { renderGrammar } from './src/grammar';
import { renderJsonSchema, withReference } from './src/reference';

const here = dirname(fileURLToPath(import.meta.url));
writeFileSync(join(here, 'clock.schema.json'), renderJsonSchema('clock'));
writeFileSync(join(here, 'wave.schema.json'), renderJsonSchema('wave'));
writeFileSync(join(here, '..', 'syntaxes', 'waveplan.tmLanguage.json'), renderGrammar());

const readmePath = join(here, '..', 'README.md');
const updated = withReference(readFileSync(readmePath, 'utf8'));
if (updated === undefined) {
  console.error('README.md has no file-reference markers; the JSON Schemas were written, the README was not.');
  process.exitCode = 1;
} else {
  writeFileSync(readmePath, updated);
}
