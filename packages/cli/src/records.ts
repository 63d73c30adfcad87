/**
 * The clock record read by `tauline stability` and `tauline clock`: a phase (or fractional-frequency)
 * text file, or one clock of a RINEX clock file, named by `--phase`, `--frequency` or
 * `--rinex-clock <file> --clock <name>`. One place for the flags, their help and their errors.
 */
import { readPhaseTextSeries, readRinexClockSeries, type SampleGap } from '@tauline/sdk/io';
import type { Instant } from '@tauline/sdk/time';
import { MAX_RECORD_BYTES, sourceLabel, textChunks } from './files.js';
import { type FlagSpec, optionalFlag, type ParsedArgs, UsageError } from './framework.js';

/** What a text record holds: phase (time error, s) or fractional frequency (dimensionless). */
export type RecordKind = 'phase' | 'frequency';

const TEXT_FLAGS: Record<RecordKind, FlagSpec> = {
  phase: {
    type: 'string',
    value: '<file>',
    description:
      'Phase (time error) record: one value in seconds per line, or two columns time (s), phase (s); # comments; - reads standard input.',
  },
  frequency: {
    type: 'string',
    value: '<file>',
    description: 'Fractional-frequency record (dimensionless), same layout as --phase; - reads standard input.',
  },
};

/**
 * The input flags of a command reading a clock record: one per text kind in `kinds` (in that
 * order), then `--rinex-clock` and `--clock`.
 */
export function recordFlags(kinds: readonly RecordKind[]): Record<string, FlagSpec> {
  const flags: Record<string, FlagSpec> = {};
  for (const kind of kinds) flags[kind] = TEXT_FLAGS[kind];
  flags['rinex-clock'] = {
    type: 'string',
    value: '<file>',
    description:
      'RINEX clock file (versions 2.00–3.05, streamed); the clock bias of --clock is used as phase; - reads standard input.',
  };
  flags.clock = {
    type: 'string',
    value: '<name>',
    description: 'Satellite (e.g. G05) or station name in the RINEX clock file.',
  };
  return flags;
}

/** A clock record as read from its file. */
export interface ClockRecord {
  /** What `values` are; a RINEX clock bias is phase. */
  kind: RecordKind;
  /** The samples (phase in s, or fractional frequency), uniformly spaced by `tau0`; NaN where one is missing. */
  values: Float64Array;
  /**
   * Time of each sample in seconds: a text record's time column as written, a RINEX clock's seconds since
   * {@link ClockRecord.epoch}; undefined for a one-column text file.
   */
  times: Float64Array | undefined;
  /** Sample spacing, in seconds. */
  tau0: number;
  /** The file as the user named it. */
  source: string;
  /** The flag that named the file (`--phase`, `--frequency` or `--rinex-clock`), for messages. */
  flag: string;
  /** Runs of missing samples, each at its `time` on the `times` axis. */
  gaps: readonly SampleGap[];
  /** The clock's name in a RINEX clock file. */
  clock?: string;
  /** The RINEX file's time system, when it states one. */
  timeSystem?: string;
  /** RINEX clock file: its first sample's instant, at which `times` reads 0 s. A text record has no calendar. */
  epoch?: Instant;
}

/**
 * Reads the record named by exactly one of the input flags of {@link recordFlags}.
 * @param kinds  The text kinds the command accepts.
 * @param tau0   `--tau0`, in seconds: imposes the sample spacing (required for one-column files).
 * @throws {UsageError} for no input or several, `--rinex-clock` without `--clock` (or `--clock` without
 *   `--rinex-clock`), a directory, a
 *   one-column file without `--tau0`, or a RINEX clock with a single epoch.
 * @throws {ParseError} from the SDK readers, with file and line.
 */
export async function readClockRecord(
  args: ParsedArgs,
  kinds: readonly RecordKind[],
  tau0: number | undefined,
): Promise<ClockRecord> {
  const record = await readRecord(args, kinds, tau0);
  if (tau0 !== undefined && record.times !== undefined) {
    // An imposed τ0 finer than the record's spacing leaves most grid epochs empty; say so instead of
    // letting a statistic fail later on "too few terms".
    let missing = 0;
    for (const v of record.values) if (v !== v) missing++;
    if (missing > record.values.length / 2) {
      throw new UsageError(
        `--tau0 ${tau0} s leaves ${missing} of ${record.values.length} epochs of ${record.source} empty: ` +
          "is it smaller than the record's sample spacing? Leave --tau0 out to use the spacing of the file",
      );
    }
  }
  return record;
}

async function readRecord(
  args: ParsedArgs,
  kinds: readonly RecordKind[],
  tau0: number | undefined,
): Promise<ClockRecord> {
  const texts = kinds.map((kind) => ({ kind, file: optionalFlag(args, kind) }));
  const rinexFile = optionalFlag(args, 'rinex-clock');
  const inputs = [...kinds.map((kind) => `--${kind} <file>`), '--rinex-clock <file> --clock <name>'];
  const oneInput = `give exactly one input: ${inputs.slice(0, -1).join(', ')} or ${inputs.at(-1)}`;
  if ([...texts.map((t) => t.file), rinexFile].filter((f) => f !== undefined).length !== 1)
    throw new UsageError(oneInput);
  if (rinexFile === undefined && optionalFlag(args, 'clock') !== undefined) {
    throw new UsageError(
      '--clock names a clock of a RINEX clock file: give it with --rinex-clock <file>, or leave it out',
    );
  }
  const tau0Option = tau0 === undefined ? {} : { tau0 };
  if (rinexFile !== undefined) {
    const clock = optionalFlag(args, 'clock');
    if (clock === undefined)
      throw new UsageError('--rinex-clock needs --clock <name> (satellite such as G05, or station name)');
    // Streamed: only the chosen clock's records are kept, so memory follows its series, not the file.
    const s = await readRinexClockSeries(
      textChunks(rinexFile, 'a RINEX clock file', { maxBytes: MAX_RECORD_BYTES }),
      clock,
      { sourceName: sourceLabel(rinexFile), ...tau0Option },
    );
    // With one epoch and --tau0 the record is still a single sample: a longer file is the only fix.
    if (s.tau0 === undefined) throw new UsageError(`clock ${clock} has a single epoch; give a longer file`);
    return {
      epoch: s.epoch,
      kind: 'phase',
      values: s.phase,
      times: s.t,
      tau0: s.tau0,
      source: rinexFile,
      flag: '--rinex-clock',
      gaps: s.gaps,
      clock,
      ...(s.timeSystem ? { timeSystem: s.timeSystem } : {}),
    };
  }
  const text = texts.find((t): t is { kind: RecordKind; file: string } => t.file !== undefined);
  if (text === undefined) throw new UsageError(oneInput); // not reached: exactly one input was checked above
  const { kind, file } = text;
  const chunks = textChunks(file, `a ${kind} record (text, one or two columns)`, { maxBytes: MAX_RECORD_BYTES });
  const s = await readPhaseTextSeries(chunks, { sourceName: sourceLabel(file), ...tau0Option });
  if (s.tau0 === undefined) throw new UsageError(`${file} has one column; give the sample spacing with --tau0 <s>`);
  return { kind, values: s.phase, times: s.times, tau0: s.tau0, source: file, flag: `--${kind}`, gaps: s.gaps };
}
