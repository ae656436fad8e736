// Asks the editor to report changes of the sample files the analysed specs read. Spec files are
// watched by one pattern from the start (server.ts); a sample file can have any name, so each one
// gets a watcher of its own when an analysis first reads it: its folder and name as a relative
// pattern where the client takes one (LSP 3.17), else its name anywhere in the workspace.

import * as nodePath from 'node:path';
import { DidChangeWatchedFilesNotification, type Connection, type FileSystemWatcher } from 'vscode-languageserver/node';
import { pathToUri } from './documents';

/** Watchers registered at most (one a sample file); a workspace needs a handful. */
const MAX_WATCHED = 256;

/** A glob matching only `name` itself (glob metacharacters written as one-character classes). */
const literal = (name: string): string => name.replace(/[*?[\]{}!\\]/g, (c) => `[${c}]`);

export class SampleWatch {
  private readonly watched = new Set<string>();
  private enabled = false;
  private relative = false;

  constructor(private readonly connection: Connection) {}

  configure(dynamicRegistration: boolean, relativePatterns: boolean): void {
    this.enabled = dynamicRegistration;
    this.relative = relativePatterns;
  }

  /** Registers a watcher for each of `paths` not watched yet. */
  watch(paths: Iterable<string>): void {
    if (!this.enabled) return;
    const watchers: FileSystemWatcher[] = [];
    for (const path of paths) {
      if (this.watched.has(path) || this.watched.size >= MAX_WATCHED) continue;
      this.watched.add(path);
      const name = literal(nodePath.basename(path));
      watchers.push({ globPattern: this.relative ? { baseUri: pathToUri(nodePath.dirname(path)), pattern: name } : `**/${name}` });
    }
    if (watchers.length === 0) return;
    void this.connection.client.register(DidChangeWatchedFilesNotification.type, { watchers }).catch(() => undefined);
  }
}
