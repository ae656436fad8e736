// The TextMate grammar (syntaxes/waveplan.tmLanguage.json) from the schemas: the words of every
// closed vocabulary (shape, jitter, table-span, …) and the units of every quantity kind, so the
// editor colours exactly what the checker accepts — never a `jitter: warn` it rejects.
// Written by `npm run schema`; a test fails while the committed grammar is stale.

import { listKeys, type FileKind } from './keys';
import { QUANTITY_KINDS, unitsOf } from './quantity';

const escapeRe = (s: string): string => s.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&');

/** Each choice key's name and the words the schema accepts for it, over both file kinds. */
export function choiceWords(): Array<{ key: string; words: string[] }> {
  const byKey = new Map<string, Set<string>>();
  for (const kind of ['wave', 'clock'] as FileKind[])
    for (const info of listKeys(kind))
      if (info.type === 'choice' && info.values) {
        const words = byKey.get(info.key) ?? new Set<string>();
        for (const v of info.values) words.add(v);
        byKey.set(info.key, words);
      }
  return [...byKey].map(([key, words]) => ({ key, words: [...words] }));
}

/** Every unit a quantity key accepts, longest first so a regex alternation never stops short. */
export function grammarUnits(): string[] {
  const units = new Set(QUANTITY_KINDS.flatMap((k) => unitsOf(k)));
  return [...units].sort((a, b) => b.length - a.length || (a < b ? -1 : 1));
}

export function renderGrammar(): string {
  const choices = choiceWords();
  const repository: Record<string, unknown> = {};
  for (const { key, words } of choices) {
    repository[`choice-${key}`] = {
      comment: `The words the schema accepts for \`${key}\`.`,
      match: `(?<![\\w-])(${escapeRe(key)})[ \\t]*(:)[ \\t]*(${words.map(escapeRe).join('|')})(?![\\w-])`,
      captures: {
        '1': { name: 'entity.name.tag.yaml' },
        '2': { name: 'punctuation.separator.key-value.mapping.yaml' },
        '3': { name: `constant.language.${key}.waveplan` },
      },
    };
  }
  repository.quantity = {
    comment:
      'A decimal number, optionally signed or with an exponent, then one of the units the schema accepts. The number and the unit get scopes of their own so themes colour them apart.',
    match: `(?<![\\w.\\-+])([+-]?(?:\\d[\\d_]*(?:\\.\\d+)?|\\.\\d+)(?:[eE][+-]?\\d+)?)[ \\t]*(${grammarUnits().map(escapeRe).join('|')})(?![\\w/µΩ%])`,
    captures: {
      '1': { name: 'constant.numeric.quantity.waveplan' },
      '2': { name: 'keyword.other.unit.waveplan' },
    },
  };
  const grammar = {
    $schema: 'https://raw.githubusercontent.com/martinring/tmlanguage/master/tmlanguage.json',
    name: 'waveplan spec',
    scopeName: 'source.waveplan',
    comment:
      'Generated from the schemas by `npm run schema`; do not edit by hand. Both file kinds are YAML. The YAML grammar does the structure; the injection below, with L: priority, marks the quantities engineers write (125 MHz, 50 ppm, 64 KiB, 2 Vpp) and the words of the closed vocabularies wherever YAML would see a plain scalar.',
    patterns: [{ include: 'source.yaml' }],
    injections: {
      'L:source.waveplan -comment -string.quoted': {
        patterns: [...choices.map(({ key }) => ({ include: `#choice-${key}` })), { include: '#quantity' }],
      },
    },
    repository,
  };
  return `${JSON.stringify(grammar, null, 2)}\n`;
}
