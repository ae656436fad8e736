// The seed files of the fuzz harness: the demo, the test fixtures and the protocol corpus, copied
// into a scratch workspace so mutated files sit beside the clock files they name.

import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { ROOT } from '../lsp-client';

export const SEED_FOLDERS = ['examples', 'test/fixtures/good', 'test/fixtures/bad', 'test/fixtures/boards', 'test/protocol/corpus', 'test/protocol/fixtures'];

export interface Seed {
  /** Where the seed lives in the repository, for failure messages. */
  name: string;
  /** The folder of the scratch workspace it was copied into. */
  folder: string;
  kind: 'wave' | 'clock';
  text: string;
}

export interface Workspace {
  dir: string;
  seeds: Seed[];
  remove(): void;
}

/** A scratch copy of every seed folder (each into its own subfolder), and its spec files as seeds. */
export function fuzzWorkspace(prefix: string): Workspace {
  const dir = fs.realpathSync(fs.mkdtempSync(path.join(os.tmpdir(), `waveplan-${prefix}-`)));
  const seeds: Seed[] = [];
  for (const [i, source] of SEED_FOLDERS.entries()) {
    const from = path.join(ROOT, source);
    const folder = path.join(dir, String(i));
    fs.mkdirSync(folder);
    for (const entry of fs.readdirSync(from, { withFileTypes: true }).filter((e) => e.isFile())) {
      fs.copyFileSync(path.join(from, entry.name), path.join(folder, entry.name));
      const kind = entry.name.endsWith('.wave.yaml') ? 'wave' : entry.name.endsWith('.clock.yaml') ? 'clock' : undefined;
      if (kind) seeds.push({ name: `${source}/${entry.name}`, folder, kind, text: fs.readFileSync(path.join(from, entry.name), 'utf8') });
    }
  }
  return { dir, seeds, remove: () => fs.rmSync(dir, { recursive: true, force: true }) };
}
