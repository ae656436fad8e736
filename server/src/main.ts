// The one bundled entry (dist/waveplan.js, started by bin/waveplan.js): the headless checker and
// the language server. Whatever happens, the user sees at most one line and an exit code, never a
// stack trace: 0 clean, 1 findings with errors, 2 misuse or unreadable input.

import pkg from '../../package.json';
import { UsageError } from './cli/args';
import { runCheck, type CliIo } from './cli/check';
import { CliInputError } from './cli/disk';
import { usage } from './cli/usage';

const EXIT_MISUSE = 2;

interface PackageInfo {
  version: string;
  homepage?: string;
  repository?: string | { url?: string };
}

/** Where SARIF readers learn about the rules: the package's homepage or repository. */
function informationUri(p: PackageInfo): string {
  const repo = typeof p.repository === 'string' ? p.repository : p.repository?.url;
  const candidate = p.homepage ?? repo?.replace(/^git\+/, '').replace(/\.git$/, '');
  return candidate && /^https?:\/\//.test(candidate) ? candidate : 'https://waveplan.invalid/';
}

const info = pkg as PackageInfo;
const tool = { version: info.version, informationUri: informationUri(info) };

const io: CliIo = {
  cwd: process.cwd(),
  stdout: (text) => void process.stdout.write(text),
  stderr: (text) => void process.stderr.write(text),
};

/** A subcommand returns its exit code, or null when it keeps running (the language server). */
type Command = (args: string[]) => Promise<number | null>;

const TRANSPORTS = /^--(stdio|node-ipc|socket=\d+|pipe=.+|clientProcessId=\d+)$/;

const COMMANDS: Record<string, Command> = {
  check: async (args) => runCheck(args, io, tool),
  serve: async (args) => {
    const unknown = args.find((a) => !TRANSPORTS.test(a));
    if (unknown !== undefined) throw new UsageError(`unknown option for serve: ${unknown}`);
    if (!args.some((a) => /^--(stdio|node-ipc|socket=|pipe=)/.test(a))) {
      throw new UsageError('serve needs a transport, e.g. --stdio');
    }
    // Loaded on demand so `check` never pays for the protocol code.
    const { startServer } = await import('./lsp/server');
    startServer();
    return null;
  },
  // Firmware export and the HTML report (server/src/export/), loaded on demand like the server.
  export: async (args) => (await import('./export/index')).runExport(args, io),
  report: async (args) => (await import('./export/index')).runReport(args, io),
  // A further subcommand goes here: a function from its argv to an exit code, plus a usage line.
};

async function main(argv: string[]): Promise<number | null> {
  const [first, ...rest] = argv;
  if (first === undefined || first === '--help' || first === '-h' || first === 'help') {
    (first === undefined ? io.stderr : io.stdout)(usage());
    return first === undefined ? EXIT_MISUSE : 0;
  }
  if (first === '--version' || first === '-v') {
    io.stdout(`${tool.version}\n`);
    return 0;
  }
  const command = Object.prototype.hasOwnProperty.call(COMMANDS, first) ? COMMANDS[first] : undefined;
  if (!command) throw new UsageError(first.startsWith('-') ? `unknown option ${first}` : `unknown command ${first}`);
  return command(rest);
}

function oneLine(e: unknown): string {
  const text = e instanceof Error ? e.message : String(e);
  return text.split('\n')[0];
}

// A reader that stops early (`waveplan check … | head`) is not an error of ours.
process.stdout.on('error', (e: NodeJS.ErrnoException) => {
  if (e.code === 'EPIPE') process.exit(process.exitCode ?? 0);
});

main(process.argv.slice(2)).then(
  (code) => {
    if (code !== null) process.exitCode = code;
  },
  (e: unknown) => {
    if (e instanceof UsageError) {
      io.stderr(`waveplan: ${oneLine(e)}\n${usage()}`);
    } else if (e instanceof CliInputError) {
      io.stderr(`waveplan: ${oneLine(e)}\n`);
    } else {
      io.stderr(`waveplan: internal error: ${oneLine(e)}\n`);
    }
    // Exit now: a half-started language server would otherwise keep the process alive.
    process.exit(EXIT_MISUSE);
  },
);
