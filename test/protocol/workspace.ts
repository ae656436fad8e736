// A scratch copy of the protocol fixtures and the demo, so tests may change files on disk freely.

import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { afterAll, beforeAll } from 'vitest';
import { ensureBuilt, LspClient, ROOT, type ClientOptions } from '../support/lsp-client';

export const FIXTURES = path.join(ROOT, 'test', 'protocol', 'fixtures');
export const EXAMPLES = path.join(ROOT, 'examples');

export function scratchCopy(): { dir: string; lab: string; labClock: string; demo: string | undefined; remove(): void } {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'waveplan-lsp-'));
  for (const name of fs.readdirSync(FIXTURES)) fs.copyFileSync(path.join(FIXTURES, name), path.join(dir, name));
  let demo: string | undefined;
  if (fs.existsSync(EXAMPLES)) {
    fs.mkdirSync(path.join(dir, 'demo'));
    for (const name of fs.readdirSync(EXAMPLES).filter((n) => n.endsWith('.yaml'))) {
      fs.copyFileSync(path.join(EXAMPLES, name), path.join(dir, 'demo', name));
      if (name.endsWith('.wave.yaml')) demo ??= path.join(dir, 'demo', name);
    }
  }
  return {
    dir,
    lab: path.join(dir, 'lab.wave.yaml'),
    labClock: path.join(dir, 'lab.clock.yaml'),
    demo,
    remove: () => fs.rmSync(dir, { recursive: true, force: true }),
  };
}

/** 0-based line of the first line containing `needle`. */
export function lineOf(text: string, needle: string): number {
  const index = text.split('\n').findIndex((l) => l.includes(needle));
  if (index < 0) throw new Error(`no line contains ${needle}`);
  return index;
}

/** A server on a fresh scratch copy for one test file: started before its tests, stopped after. */
export function serverOnScratch(options: Omit<ClientOptions, 'folders'> = {}, prepare: (dir: string) => void = () => {}) {
  const held: { client?: LspClient; ws?: ReturnType<typeof scratchCopy> } = {};
  beforeAll(async () => {
    ensureBuilt();
    held.ws = scratchCopy();
    prepare(held.ws.dir);
    held.client = await LspClient.start({ ...options, folders: [held.ws.dir] });
  });
  afterAll(async () => {
    await held.client?.stop();
    held.ws?.remove();
  });
  return {
    get client(): LspClient {
      return held.client!;
    },
    get ws(): ReturnType<typeof scratchCopy> {
      return held.ws!;
    },
  };
}
