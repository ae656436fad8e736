// The one schema of the extension's settings. package.json's `contributes.configuration` must
// match it key for key (test/protocol/settings.test.ts checks), so a setting is added here first.
// Values are read per resource through workspace/configuration and cached per document URI;
// didChangeConfiguration clears the cache and the server re-checks.

import type { Connection } from 'vscode-languageserver/node';

interface BooleanSetting {
  type: 'boolean';
  default: boolean;
  description: string;
}
interface StringSetting {
  type: 'string';
  default: string;
  description: string;
  enum?: readonly string[];
}
type SettingSchema = BooleanSetting | StringSetting;

export const SETTINGS = {
  'waveplan.annotations.enabled': {
    type: 'boolean',
    default: true,
    description: "Show each output's achieved frequency, error, divider, jitter and seam inline after its name.",
  },
  'waveplan.annotations.sfdr': {
    type: 'boolean',
    default: false,
    description:
      "Add each output's spurious-free dynamic range (SFDR, from the spectrum of the signal its plan emits) to its annotation. Each output shown costs a transform the first time.",
  },
  'waveplan.hover.pictures': {
    type: 'boolean',
    default: true,
    description: 'Show pictures of the waveform, the table seam and the jitter pattern in hovers.',
  },
  'waveplan.export.directory': {
    type: 'string',
    default: 'generated',
    description: 'Folder, relative to the spec, that exported C headers are written to.',
  },
  'waveplan.trace.server': {
    type: 'string',
    enum: ['off', 'messages', 'verbose'],
    default: 'off',
    description: 'Traces the communication between VS Code and the waveplan language server.',
  },
} as const satisfies Record<string, SettingSchema>;

export interface Settings {
  annotationsEnabled: boolean;
  annotationsSfdr: boolean;
  hoverPictures: boolean;
  exportDirectory: string;
  traceServer: 'off' | 'messages' | 'verbose';
}

export const DEFAULT_SETTINGS: Settings = {
  annotationsEnabled: SETTINGS['waveplan.annotations.enabled'].default,
  annotationsSfdr: SETTINGS['waveplan.annotations.sfdr'].default,
  hoverPictures: SETTINGS['waveplan.hover.pictures'].default,
  exportDirectory: SETTINGS['waveplan.export.directory'].default,
  traceServer: SETTINGS['waveplan.trace.server'].default,
};

/** Reads one key of a `waveplan` section as returned by workspace/configuration. */
function pick(section: unknown, dotted: string): unknown {
  let value: unknown = section;
  for (const part of dotted.split('.').slice(1)) {
    if (value === null || typeof value !== 'object') return undefined;
    value = (value as Record<string, unknown>)[part];
  }
  return value;
}

/** Turns the client's answer into Settings; anything missing or of the wrong type keeps its default. */
export function toSettings(section: unknown): Settings {
  const bool = (key: keyof typeof SETTINGS, fallback: boolean): boolean => {
    const v = pick(section, key);
    return typeof v === 'boolean' ? v : fallback;
  };
  const str = (key: keyof typeof SETTINGS, fallback: string): string => {
    const v = pick(section, key);
    return typeof v === 'string' && v !== '' ? v : fallback;
  };
  const trace = str('waveplan.trace.server', DEFAULT_SETTINGS.traceServer);
  return {
    annotationsEnabled: bool('waveplan.annotations.enabled', DEFAULT_SETTINGS.annotationsEnabled),
    annotationsSfdr: bool('waveplan.annotations.sfdr', DEFAULT_SETTINGS.annotationsSfdr),
    hoverPictures: bool('waveplan.hover.pictures', DEFAULT_SETTINGS.hoverPictures),
    exportDirectory: str('waveplan.export.directory', DEFAULT_SETTINGS.exportDirectory),
    traceServer: trace === 'messages' || trace === 'verbose' ? trace : 'off',
  };
}

/** Per-resource settings, fetched once per document and dropped on didChangeConfiguration. */
export class SettingsCache {
  private readonly byUri = new Map<string, Promise<Settings>>();
  private pullSupported = false;

  constructor(private readonly connection: Connection) {}

  /** Whether the client answers workspace/configuration (known after initialize). */
  setPullSupported(supported: boolean): void {
    this.pullSupported = supported;
  }

  get(uri: string): Promise<Settings> {
    if (!this.pullSupported) return Promise.resolve(DEFAULT_SETTINGS);
    let entry = this.byUri.get(uri);
    if (!entry) {
      entry = this.connection.workspace
        .getConfiguration({ scopeUri: uri, section: 'waveplan' })
        .then(toSettings, () => DEFAULT_SETTINGS);
      this.byUri.set(uri, entry);
    }
    return entry;
  }

  forget(uri: string): void {
    this.byUri.delete(uri);
  }

  clear(): void {
    this.byUri.clear();
  }
}
