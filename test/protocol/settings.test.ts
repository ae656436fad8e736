// One schema of settings (server/src/lsp/settings.ts): package.json's contributes.configuration
// must say the same, and the server must obey the values the client sends per resource.

import * as fs from 'node:fs';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SETTINGS } from '../../server/src/lsp/settings';
import { ensureBuilt, LspClient, ROOT, uriOf } from '../support/lsp-client';
import { lineOf, scratchCopy } from './workspace';

describe('settings schema', () => {
  it('matches contributes.configuration in package.json key for key', () => {
    const manifest = JSON.parse(fs.readFileSync(path.join(ROOT, 'package.json'), 'utf8'));
    const properties = manifest.contributes?.configuration?.properties as Record<string, Record<string, unknown>> | undefined;
    expect(properties, 'package.json has no contributes.configuration.properties').toBeDefined();
    expect(Object.keys(properties!).sort()).toEqual(Object.keys(SETTINGS).sort());
    for (const [key, schema] of Object.entries(SETTINGS)) {
      const declared = properties![key];
      expect({ key, type: declared.type, default: declared.default, description: declared.description, enum: declared.enum }).toEqual({
        key,
        type: schema.type,
        default: schema.default,
        description: schema.description,
        enum: 'enum' in schema ? schema.enum : undefined,
      });
    }
  });
});

describe('settings over the protocol', () => {
  let client: LspClient;
  let ws: ReturnType<typeof scratchCopy>;
  let uri: string;
  let text: string;

  beforeAll(async () => {
    ensureBuilt();
    ws = scratchCopy();
    client = await LspClient.start({ folders: [ws.dir], settings: { annotations: { enabled: false }, hover: { pictures: false } } });
    uri = uriOf(ws.lab);
    text = fs.readFileSync(ws.lab, 'utf8');
    client.open(uri, text);
    await client.diagnosticsFor(uri);
  });

  afterAll(async () => {
    await client?.stop();
    ws?.remove();
  });

  const hints = () =>
    client.request<{ label: string }[]>('textDocument/inlayHint', { textDocument: { uri }, range: { start: { line: 0, character: 0 }, end: { line: 99, character: 0 } } });
  const hover = () =>
    client.request<{ contents: { value: string } }>('textDocument/hover', { textDocument: { uri }, position: { line: lineOf(text, 'probe-drive:'), character: 4 } });

  it('turns the inline annotations and the hover pictures off, and back on after a configuration change', async () => {
    expect(await hints()).toEqual([]);
    const card = (await hover()).contents.value;
    expect(card).toContain('probe-drive');
    expect(card).not.toContain('data:image/svg+xml');
    expect(client.serverRequests).toContain('workspace/configuration');

    client.settings = {};
    client.notify('workspace/didChangeConfiguration', { settings: null });
    expect((await hints()).length).toBe(3);
    expect((await hover()).contents.value).toContain('data:image/svg+xml;base64,');
  });

  it('adds each output’s SFDR to its annotation when waveplan.annotations.sfdr asks, the figure the hover states', async () => {
    client.settings = { annotations: { sfdr: true } };
    client.notify('workspace/didChangeConfiguration', { settings: null });
    const got = await client.request<{ label: string; tooltip: string; position: { line: number } }[]>('textDocument/inlayHint', {
      textDocument: { uri },
      range: { start: { line: 0, character: 0 }, end: { line: 99, character: 0 } },
    });
    expect(got.length).toBe(3);
    for (const hint of got) {
      const sfdr = /SFDR (-?\d+\.\d dB|unbounded)/.exec(hint.tooltip)?.[1];
      expect(sfdr, hint.tooltip).toBeDefined();
      const card = (
        await client.request<{ contents: { value: string } }>('textDocument/hover', { textDocument: { uri }, position: { line: hint.position.line, character: 4 } })
      ).contents.value;
      expect(card).toContain(`SFDR ${sfdr}`);
    }
    client.settings = {};
    client.notify('workspace/didChangeConfiguration', { settings: null });
    const plain = await hints();
    expect(plain.map((h) => h.label).join('\n')).not.toContain('SFDR');
  });
});
