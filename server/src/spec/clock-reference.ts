// The clock file a wave spec names, read from its frame alone (no output read, nothing planned),
// and the sample files its outputs name: what the language server needs to know, for every wave
// spec in a workspace at startup, to find the specs a clock edit or a sample file's change must
// re-check. The paths resolve as the analysis resolves them.

import * as nodePath from 'node:path';
import { frameSyntax } from './frame-tolerant';
import { splitWave } from './segments';
import { WAVE_OUTPUTS, readSource } from './source';

/** Absolute path of the clock file `clock:` names, or null when it names none that can be read here. */
export function clockReference(path: string, text: string): string | null {
  const seg = splitWave(text, Number.MAX_SAFE_INTEGER);
  let clock: unknown;
  if (seg) {
    clock = frameSyntax(seg.frameText).clock;
  } else {
    const data = readSource(text).data as { clock?: unknown } | null | undefined;
    clock = data && typeof data === 'object' ? data.clock : undefined;
  }
  return typeof clock === 'string' && clock.length > 0 ? nodePath.resolve(nodePath.dirname(path), clock) : null;
}

/** Absolute paths of the sample files the outputs' `sample-file:` values name (read only when the text has the key). */
export function sampleReferences(path: string, text: string): string[] {
  if (!text.includes('sample-file')) return [];
  const outputs = (readSource(text, WAVE_OUTPUTS).data as { outputs?: unknown } | null | undefined)?.outputs;
  if (!outputs || typeof outputs !== 'object') return [];
  const found = new Set<string>();
  for (const entry of Object.values(outputs as Record<string, unknown>)) {
    const written = entry && typeof entry === 'object' ? (entry as Record<string, unknown>)['sample-file'] : undefined;
    if (typeof written === 'string' && written.length > 0) found.add(nodePath.resolve(nodePath.dirname(path), written));
  }
  return [...found];
}
