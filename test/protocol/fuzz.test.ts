// The fuzz harness (issue 9): seeded mutations of the demo, the fixtures and the protocol corpus
// (token deletion and duplication, look-alike, bidirectional, zero-width and astral characters,
// extreme numbers, wrong units, deep nesting, alias bombs, files of megabytes, tabs, byte order
// marks, CR LF, lone CR and mixed breaks) through analyze() and the checker, and through the
// built server over stdio with interleaved edits, requests and cancellations. The technique is
// ordinary mutation fuzzing (common practice); the oracles are the LSP 3.17 rules for positions,
// vscode-languageserver-textdocument for applying edits and the `yaml` package for what a quick
// fix must leave alone. CI runs a bounded run; `npm run fuzz` a long one (see test/README.md).

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeCase, caseFiles, bigSize } from '../support/fuzz/cases';
import { checkOnDisk } from '../support/fuzz/checker-side';
import { fuzzConfig, runsCase, sessionKind } from '../support/fuzz/config';
import { fuzzWorkspace, type Workspace } from '../support/fuzz/corpus';
import { runSession } from '../support/fuzz/session';
import { rssKib, Tally } from '../support/fuzz/tally';
import { ensureBuilt, LspClient } from '../support/lsp-client';

const config = fuzzConfig();
const tally = new Tally(config);
const started = performance.now();
// A budget of wall time for each half, far above what the run takes, so a hang fails rather than stalls CI.
const budgetMs = config.long ? Math.max(600_000, config.cases * 2_000) : 300_000;

let checkerWs: Workspace;
let serverWs: Workspace;
let client: LspClient;
// FUZZ_PROF=<folder>: the server writes a V8 CPU profile there at exit, to see where a slow request
// went; FUZZ_NODE_ARGS: other flags for its node (`--prof`, whose log survives a server killed as hung).
const nodeArgs = [...(process.env.FUZZ_PROF ? ['--cpu-prof', `--cpu-prof-dir=${process.env.FUZZ_PROF}`] : []), ...(process.env.FUZZ_NODE_ARGS ?? '').split(' ').filter(Boolean)];

beforeAll(async () => {
  ensureBuilt();
  checkerWs = fuzzWorkspace('fuzz-check');
  serverWs = fuzzWorkspace('fuzz-lsp');
  client = await LspClient.start({ nodeArgs, folders: [serverWs.dir] });
  tally.rss.start = rssKib(client.process.pid);
});

afterAll(async () => {
  if (client) tally.rss.end = rssKib(client.process.pid);
  await client?.stop();
  checkerWs?.remove();
  serverWs?.remove();
  console.log(tally.summary(performance.now() - started));
});

const failuresSince = (from: number) => tally.failures.slice(from);

describe('fuzz', () => {
  it(`mutated files: analyze() and the checker agree, every range on the text, no internal error (seed ${config.seed}, ${config.cases} cases)`, () => {
    const from = tally.failures.length;
    for (let n = 0; n < config.cases; n++) {
      if (!runsCase(config, n)) continue;
      const c = makeCase(config, checkerWs.seeds, n);
      // Every 25th case also through the built bundle, as users run it.
      const bundled = n % 25 === 0;
      const { problems, analyses } = checkOnDisk(caseFiles(c, 'case'), checkerWs.dir, bundled);
      if (bundled) tally.count('bundled checker runs');
      tally.count('cases');
      if (bigSize(config, n)) tally.count('large files');
      for (const a of analyses) tally.analysis(`case ${n} (${c.seed.name}, ${a.analysis.text.length} chars)`, a.ms);
      tally.fail(n, `checker, ${c.seed.name}, ${c.kinds.join(' + ')}`, problems);
      if (config.long && n % 500 === 0) console.log(`fuzz: checker at case ${n}, ${tally.failures.length} failures so far, ${((performance.now() - started) / 1000).toFixed(0)} s`);
    }
    expect(failuresSince(from)).toStrictEqual([]);
  }, budgetMs);

  it(`server sessions: no crash, no error answer, ranges on the text, editor equals checker, quick fixes keep the rest (2 in every ${config.sessionEvery} cases)`, async () => {
    const from = tally.failures.length;
    for (let n = 0; n < config.cases; n++) {
      const kind = sessionKind(config, n);
      if (!kind || !runsCase(config, n)) continue;
      const c = makeCase(config, serverWs.seeds, n);
      const result = await runSession(client, config, c, serverWs.dir, tally, kind);
      tally.count(`${kind === 'edits' ? 'editing' : 'fixing'} sessions`);
      tally.count('edits', result.edits);
      tally.fail(n, `${kind === 'edits' ? 'editing' : 'fixing'} session, ${c.seed.name}, ${kind === 'edits' ? c.kinds.join(' + ') : 'one mild change'}`, result.problems);
      tally.rssAfter(n, rssKib(client.process.pid), `${c.seed.name}, ${c.text.length} chars`);
      if (result.stalled || !client.alive) {
        // A hung or dead server is replaced, so one bug does not hide the rest of the run.
        client.process.kill('SIGKILL');
        await client.stop();
        client = await LspClient.start({ folders: [serverWs.dir], nodeArgs });
        tally.count('server restarts');
      }
      if (config.long && n % 500 === 0) console.log(`fuzz: session of case ${n}, ${tally.failures.length} failures so far, ${((performance.now() - started) / 1000).toFixed(0)} s`);
    }
    expect(failuresSince(from)).toStrictEqual([]);
  }, budgetMs);
});
