// The generated artefacts: the two JSON Schemas and the README's file reference, both rendered
// from the zod schemas. generate.ts writes them; a test compares them with the committed files.

import { z } from 'zod';
import { type FileKind, type KeyInfo, listKeys, schemaOf } from './keys';

export const README_START = '<!-- file-reference:start -->';
export const README_END = '<!-- file-reference:end -->';

const TITLES: Record<FileKind, string> = { clock: 'waveplan clock file (*.clock.yaml)', wave: 'waveplan wave file (*.wave.yaml)' };

export function renderJsonSchema(kind: FileKind): string {
  const schema = z.toJSONSchema(schemaOf(kind), { io: 'input', target: 'draft-2020-12' }) as Record<string, unknown>;
  const { $schema, ...rest } = schema;
  return `${JSON.stringify({ $schema, title: TITLES[kind], ...rest }, null, 2)}\n`;
}

const cell = (s: string): string => s.replace(/\|/g, '\\|').replace(/\n/g, ' ');

function typeText(k: KeyInfo): string {
  switch (k.type) {
    case 'quantity': {
      const q = k.quantity!;
      const units = q.units.map((u) => `\`${u}\``).join(', ');
      if (q.units.length === 0) return 'number (exact decimal)';
      const plain = q.plain === null ? 'unit required' : `plain number = ${q.plain === 'ratio' ? 'a fraction' : q.plain}`;
      return `${q.what.replace(/^an? /, '')}: ${units}; ${plain}`;
    }
    case 'whole number':
    case 'number':
      return `${k.type} ${k.min ?? ''}–${k.max ?? ''}`;
    case 'list':
      return k.items ? `list of ${typeText(k.items)}` : 'list';
    case 'choice':
    case 'true/false': {
      const words = (k.values ?? []).map((v) => `\`${v}\``);
      // A choice that also takes a quantity (`band-limit: 20 kHz`) names its units too.
      return k.quantity ? `${words.join(', ')} or ${k.quantity.what.replace(/^an? /, '')}: ${k.quantity.units.join(', ')}` : words.join(' or ');
    }
    default:
      return k.type;
  }
}

function table(kind: FileKind): string {
  const rows = listKeys(kind).map((k) => {
    const def = k.required ? 'required' : k.default === undefined ? 'optional' : k.defaultInWords ? k.default : `\`${k.default}\``;
    return `| \`${k.path}\` | ${cell(typeText(k))} | ${cell(def)} | ${cell(k.description)} |`;
  });
  return ['| key | value | default | meaning |', '|---|---|---|---|', ...rows].join('\n');
}

/** The README section between the markers (markers excluded). */
export function renderReference(): string {
  return [
    '',
    '## File reference',
    '',
    'Generated from the schemas by `npx tsx shared-schema/generate.ts`; do not edit by hand.',
    'Quantities are written with a unit (`125 MHz`, `50 ppm`, `64 KiB`, `2 Vpp`, `1.65 V`) or as plain numbers in base units;',
    'units are case-sensitive (`MHz` is megahertz, `mHz` millihertz). Frequencies, tolerances and dividers are read exactly from their decimal text.',
    'JSON Schemas for YAML-aware editors: `shared-schema/clock.schema.json`, `shared-schema/wave.schema.json`.',
    '',
    `### ${TITLES.clock}`,
    '',
    schemaOf('clock').description ?? '',
    '',
    table('clock'),
    '',
    `### ${TITLES.wave}`,
    '',
    schemaOf('wave').description ?? '',
    '',
    table('wave'),
    '',
  ].join('\n');
}

/** The README text with its file-reference section replaced; undefined when the markers are missing. */
export function withReference(readme: string): string | undefined {
  const start = readme.indexOf(README_START);
  const end = readme.indexOf(README_END);
  if (start < 0 || end < start) return undefined;
  return readme.slice(0, start + README_START.length) + '\n' + renderReference() + readme.slice(end);
}
