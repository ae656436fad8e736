// Help text of the bundled command: one entry per subcommand in COMMAND_LINES.

export const COMMAND_LINES: string[] = [
  '  waveplan check <files or folders…> [--format text|json|sarif] [--output FILE] [--root FOLDER] [--force]',
  '      Check *.wave.yaml and *.clock.yaml specs (folders are searched recursively).',
  '      Exit 0 when no errors (warnings allowed), 1 when any error, 2 on misuse or unreadable input.',
  '  waveplan export <file.wave.yaml…> [--c <folder>] [--json <file>] [--root FOLDER] [--force]',
  '      Write the checked plans as C sources and/or JSON; specs with errors are not exported.',
  '  waveplan report <file.wave.yaml…> --html <file> [--root FOLDER] [--force]',
  '      Write a self-contained HTML page of the plans, their pictures and the findings.',
  '  waveplan serve --stdio',
  '      Run the language server over stdin/stdout (started by the editor extension).',
  '  waveplan --version | --help',
];

export function usage(): string {
  return ['usage:', ...COMMAND_LINES, ''].join('\n');
}

export const CHECK_USAGE = [
  'usage: waveplan check <files or folders…> [--format text|json|sarif] [--output FILE] [--root FOLDER] [--force]',
  '  --format text   aligned plan table per file, then findings as path:line:col (default)',
  '  --format json   the same results as JSON (1-based lines and columns)',
  '  --format sarif  SARIF 2.1.0 for code-scanning services',
  '  --output FILE   write the report to FILE instead of standard output (never over a spec, a',
  '                  file the specs read, a symbolic link, or a file waveplan did not write)',
  '  --root FOLDER   the workspace: specs read files (their clock files) only inside it; by',
  '                  default the folders named and the folders of the files named',
  '  --force         replace an --output file that waveplan did not write',
  '',
].join('\n');
