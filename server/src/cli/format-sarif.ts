// SARIF 2.1.0 (OASIS), the format code-scanning services ingest. Every code of the catalogue is a
// rule, so a result's ruleIndex is stable; URIs are relative to the working directory (the repo
// root in CI) under the %SRCROOT% base, and regions are 1-based as the standard requires.

import type { Log, ReportingDescriptor, Result, Run } from 'sarif';
import type { Severity } from '../spec/types';
import { sortedDiagnostics, type CheckedFile } from './checked';

export interface SarifTool {
  version: string;
  /** Where a reader learns about the rules (SARIF authoring rules ask for it). */
  informationUri: string;
}

export interface RuleInfo {
  code: string;
  severity: Severity;
  title: string;
  help: string;
}

const SCHEMA_URI = 'https://json.schemastore.org/sarif-2.1.0.json';

const LEVELS: Record<Severity, 'error' | 'warning' | 'note'> = {
  error: 'error',
  warning: 'warning',
  information: 'note',
};

/** A sentence as SARIF wants messages: ends with a full stop. */
function sentence(text: string): string {
  const t = text.trim();
  return /[.!?]$/.test(t) ? t : `${t}.`;
}

function ruleOf(r: RuleInfo): ReportingDescriptor {
  return {
    id: r.code,
    // A readable identifier that differs from the opaque id, as SARIF §3.49.7 asks.
    name: r.title
      .split(/[^A-Za-z0-9]+/)
      .filter((w) => w !== '')
      .map((w) => w.charAt(0).toUpperCase() + w.slice(1))
      .join(''),
    shortDescription: { text: sentence(r.title) },
    fullDescription: { text: sentence(r.help) },
    help: { text: sentence(r.help) },
    defaultConfiguration: { level: LEVELS[r.severity] },
  };
}

/** A code missing from the catalogue still gets a rule, so no result points at nothing. */
function fallbackRule(code: string, severity: Severity): RuleInfo {
  return { code, severity, title: `waveplan finding ${code}`, help: `See the waveplan documentation for ${code}` };
}

export function sarifLog(files: readonly CheckedFile[], rules: readonly RuleInfo[], tool: SarifTool): Log {
  const catalogue = [...rules];
  const index = new Map(catalogue.map((r, i) => [r.code, i]));
  const results: Result[] = [];
  for (const file of files) {
    for (const d of sortedDiagnostics(file.analysis.diagnostics)) {
      if (!index.has(d.code)) {
        index.set(d.code, catalogue.length);
        catalogue.push(fallbackRule(d.code, d.severity));
      }
      results.push({
        ruleId: d.code,
        ruleIndex: index.get(d.code),
        level: LEVELS[d.severity],
        message: { text: sentence(d.message) },
        locations: [
          {
            physicalLocation: {
              artifactLocation: { uri: encodeURI(file.path), uriBaseId: '%SRCROOT%' },
              region: {
                startLine: d.range.start.line + 1,
                startColumn: d.range.start.character + 1,
                endLine: d.range.end.line + 1,
                // SARIF's endColumn is the column just past the region, as LSP's end character.
                endColumn: d.range.end.character + 1,
              },
            },
          },
        ],
      });
    }
  }
  const run: Run = {
    tool: {
      driver: {
        name: 'waveplan',
        version: tool.version,
        semanticVersion: tool.version,
        informationUri: tool.informationUri,
        rules: catalogue.map(ruleOf),
      },
    },
    columnKind: 'utf16CodeUnits',
    artifacts: files.map((f) => ({ location: { uri: encodeURI(f.path), uriBaseId: '%SRCROOT%' } })),
    results,
  };
  return { $schema: SCHEMA_URI, version: '2.1.0', runs: [run] };
}

export function formatSarif(files: readonly CheckedFile[], rules: readonly RuleInfo[], tool: SarifTool): string {
  return `${JSON.stringify(sarifLog(files, rules, tool), null, 2)}\n`;
}
