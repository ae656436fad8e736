// The result of analysing one spec file: what every face (LSP features, checker, exporters)
// reads. Plain data; positions are 0-based line/character (UTF-16), as in LSP.

import type { Rational } from '../../../shared-schema/src/rational';
import type { PhaseResult } from '../planning/groups';
import type { Hardware, OutputPlanning, OutputRequest } from '../planning/types';

export interface Position {
  line: number;
  character: number;
}
export interface Range {
  start: Position;
  end: Position;
}

export type Severity = 'error' | 'warning' | 'information';

export interface SpecDiagnostic {
  range: Range;
  severity: Severity;
  /** Stable code, e.g. "unknown-key"; quick fixes and the checker key on it. */
  code: string;
  /** One sentence that says what is wrong and what to do. */
  message: string;
  /** The output the diagnostic is about, when it is about one. */
  output?: string;
  /** The inputs of a quick fix, set where the finding is made (a fix never reads the message). */
  fix?: FixData;
}

export interface FixData {
  /** unknown-key: the known keys it is close to; bad-unit: the units. */
  suggestions?: string[];
  /** missing-key: the key to add, and the placeholder value to add it with. */
  key?: string;
  placeholder?: string;
  /** missing-key: the path of the mapping that lacks it. */
  parent?: (string | number)[];
}

export type SpecKind = 'wave' | 'clock';

/** One output of a wave spec with everything planned for it. */
export interface OutputAnalysis {
  name: string;
  /** The output's key in `outputs:`. */
  nameRange: Range;
  /** The whole entry (key and value). */
  entryRange: Range;
  /** Ranges of the entry's own keys' values, by key name (e.g. "frequency", "plan"). */
  valueRanges: Record<string, Range>;
  targetHz: Rational;
  /** The tolerance as written (or its default), for messages. */
  toleranceText?: string;
  request: OutputRequest;
  planning: OutputPlanning;
  /** The signal-quality floor in dB (min-snr, min-sfdr or their defaults from the DAC's bits). */
  qualityFloor?: { snrDb: number; sfdrDb: number };
}

/** A group of outputs planned together (see planning/groups.ts). */
export interface GroupAnalysis {
  name: string;
  lock: 'sample-clock' | 'phase';
  offsetsAs: 'table-rotation' | 'start-offset';
  /** Member output names, the first is the phase reference. */
  members: string[];
  /** Each member's stated offset ahead of the first, degrees (0 where none is stated). */
  offsetsDeg: number[];
  /** Phase-locked groups: each member's offset as realised (null without a plan). */
  phases: PhaseResult[] | null;
}

export interface Analysis {
  /** Absolute file-system path of the analysed file. */
  path: string;
  kind: SpecKind;
  /** The text analysed (the unsaved buffer when an editor supplied one). */
  text: string;
  diagnostics: SpecDiagnostic[];
  /** Wave specs only; in file order. */
  outputs: OutputAnalysis[];
  /** The hardware: of the clock file itself, or of the clock file a wave spec references. */
  hardware: Hardware | null;
  /** Wave specs: the absolute path `clock:` resolves to, if any. */
  clockPath: string | null;
  /**
   * Wave specs: the files the outputs' `sample-file:` values resolve to (absolute paths), each with
   * the sha256 of the text read (null when it could not be read).
   */
  sampleFiles?: { path: string; sha256: string | null }[];
  /** Groups of outputs planned together (wave specs with `groups:`). */
  groups?: GroupAnalysis[];
  /** Total table bytes of all planned outputs against hardware.memory.budgetBytes. */
  memory: { usedBytes: number; budgetBytes: number } | null;
}

/** How the analysis reads files: an editor prefers its unsaved buffers over the disk. */
export interface SpecHost {
  /** Text of the file, or undefined when it cannot be read. */
  readFile(path: string): string | undefined;
  /**
   * Why readFile answered undefined for `path` (completes "Cannot read X: …", e.g. "it lies
   * outside the workspace folder …"); hosts that cannot tell leave it out.
   */
  whyUnreadable?(path: string): string | undefined;
}
