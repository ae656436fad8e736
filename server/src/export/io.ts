// Where the export and report commands write their messages: the checker's own CliIo shape, so
// main.ts can hand every command the same object; tests pass their own.
import type { CliIo } from '../cli/check';
import { UsageError } from '../cli/args';
import { CliInputError } from '../cli/disk';

export type CommandIo = CliIo;

export function processIo(): CommandIo {
  return {
    cwd: process.cwd(),
    stdout: (t) => void process.stdout.write(t),
    stderr: (t) => void process.stderr.write(t),
  };
}

/**
 * Runs a command body and turns what it throws into exit code 2 and one message line (plus the
 * usage for misuse): the commands never end in a stack trace.
 */
export async function guarded(command: string, usage: string, io: CommandIo, body: () => Promise<number> | number): Promise<number> {
  try {
    return await body();
  } catch (e) {
    if (e instanceof UsageError) io.stderr(`waveplan ${command}: ${e.message}\n${usage}`);
    else if (e instanceof CliInputError) io.stderr(`waveplan ${command}: ${e.message}\n`);
    else io.stderr(`waveplan ${command}: internal error: ${e instanceof Error ? e.message : String(e)}\n`);
    return 2;
  }
}
