// The file an output's `sample-file:` names, read as the `clock:` reference is read: through the
// SpecHost, whose reader is the containment policy (containment.ts: inside the workspace folder
// after resolving symbolic links, regular files only, size checked before reading). Its text
// becomes one cycle of the output's table (signal/custom-tables.ts); what is wrong with it is
// said on the `sample-file:` value, with the file's line when the problem has one.

import { createHash } from 'node:crypto';
import * as nodePath from 'node:path';
import type { CustomWave } from '../planning/custom-wave';
import { type SampleSeam, parseSampleFile, sampleSeam, sampleWave } from '../signal/custom-tables';
import { Memo } from './memo';
import type { SpecHost } from './types';

/** A file another file names, read through the host; `why` completes "Cannot read X: …". */
export function readReferenced(host: SpecHost, path: string): { text: string } | { why: string | undefined } {
  try {
    const text = host.readFile(path);
    if (text !== undefined) return { text };
    return { why: host.whyUnreadable?.(path) };
  } catch {
    return { why: undefined };
  }
}

export type SampleRead =
  | { ok: true; wave: CustomWave; seam: SampleSeam; count: number }
  | { ok: false; code: 'sample-file-unreadable' | 'sample-file-invalid'; message: string };

/** An output's sample file, resolved and read: what the planning of the output depends on. */
export interface SampleSource {
  /** Absolute path the value resolves to (relative to the wave file). */
  path: string;
  /** Identity of what was read (path and digest of the text, or the refusal): part of memo keys. */
  key: string;
  /** sha256 of the text read (hex), null when the file could not be read. */
  sha256: string | null;
  read: SampleRead;
}

const parsed = new Memo<string, SampleRead & { digest: string }>(16);

function readText(text: string, written: string): SampleRead & { digest: string } {
  const digest = createHash('sha256').update(text, 'utf8').digest('hex');
  const result = parseSampleFile(text);
  if (!result.ok) {
    const said = result.message.replace(/ of the sample file/, '').replace(/^The sample file /, 'it ').replace(/^./, (c) => c.toLowerCase());
    return { ok: false, code: 'sample-file-invalid', message: `The sample file ${written} cannot be read as one cycle: ${said.replace(/\.$/, '')}.`, digest };
  }
  return { ok: true, wave: sampleWave(result.values, digest), seam: sampleSeam(result.values), count: result.values.length, digest };
}

/** Reads the sample file `written` names, relative to the wave file at `specPath`. */
export function resolveSampleFile(specPath: string, written: string, host: SpecHost): SampleSource {
  const path = nodePath.resolve(nodePath.dirname(specPath), written);
  const got = readReferenced(host, path);
  if (!('text' in got)) {
    const reason = got.why ?? `no such file (looked for ${path}); check the path, which is relative to this file`;
    return { path, key: `${path}\u0000refused\u0000${reason}`, sha256: null, read: { ok: false, code: 'sample-file-unreadable', message: `Cannot read the sample file ${written}: ${reason}.` } };
  }
  // Keyed by the text: the message names the file as written, so the key holds that too.
  const read = parsed.get(`${written}\u0000${got.text}`, (k) => readText(k.slice(written.length + 1), written));
  return { path, key: `${path}\u0000${read.digest}`, sha256: read.digest, read };
}
