// The clock file a wave spec names, read from its frame alone (no output read, nothing planned):
// what the language server needs to know, for every wave spec in a workspace at startup, to find
// the specs a clock edit must re-check. The path resolves as the analysis resolves it.

import * as nodePath from 'node:path';
import { frameSyntax } from './frame-tolerant';
import { splitWave } from './segments';
import { readSource } from './source';

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
