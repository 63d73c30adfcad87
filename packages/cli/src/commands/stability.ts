/**
 * `tauline stability`: Allan-family frequency-stability statistics of a phase or frequency record
 * with chi-square confidence intervals and per-τ noise identification (NIST SP 1065).
 */

import { InvalidArgumentError } from '@tauline/sdk/errors';
import {
  analyzeStability,
  DEFAULT_STATISTICS,
  type NoiseType,
  STATISTIC_NAMES,
  type StabilityAnalysis,
  type StabilityData,
  type StatisticName,
} from '@tauline/sdk/stability';
import {
  epochFormat,
  gapsJson,
  type RecordEpoch,
  recordEpochFlag,
  STAMP_HELP,
  type Stamp,
  stampOf,
  timeSystemJson,
} from '../epochs.js';
import {
  type Command,
  EXIT_OK,
  formatFlag,
  formatFlags,
  numberFlag,
  optionalFlag,
  type ParsedArgs,
  parseNumber,
  sig,
  TABLE_OR_JSON,
  toJson,
  UsageError,
  withFlagNames,
} from '../framework.js';
import { fitTable, outputWidth, wrappedOut } from '../layout.js';
import { type ClockRecord, readClockRecord, recordFlags } from '../records.js';

/** Fewest phase points any statistic here can use (one second difference needs 3; the edf models need 4). */
export const MIN_PHASE_POINTS = 4;

/**
 * The flag an argument path of `analyzeStability` came from (`data.tau0` → `--tau0`, `taus[2]` →
 * `--taus`, `options.confidence` → `--confidence`, …), for {@link withFlagNames}.
 */
function stabilityFlagOf(argument: string): string | undefined {
  if (/^(data\.)?tau0$/.test(argument)) return '--tau0';
  if (/^(options\.)?taus(\[\d+\])?$/.test(argument)) return '--taus';
  const option = /^(?:options\.)?(confidence|noise|statistics)$/.exec(argument);
  return option ? `--${option[1]}` : undefined;
}

const NOISES: readonly NoiseType[] = ['WPM', 'FPM', 'WFM', 'FFM', 'RWFM'];

function listFlag(args: ParsedArgs, flag: string): string[] | undefined {
  const text = optionalFlag(args, flag);
  if (text === undefined) return undefined;
  const items = text
    .split(',')
    .map((s) => s.trim())
    .filter((s) => s !== '');
  if (items.length === 0) throw new UsageError(`--${flag} needs a comma-separated list`);
  return items;
}

function formatDeviation(stat: StatisticName, v: number): string {
  return stat === 'tdev' ? `${sig(v, 4)} s` : v.toExponential(3);
}

/** The analysis options of a `tauline stability` run, from its flags. */
interface StabilityRequest {
  /** `--tau0`, in seconds. */
  tau0: number | undefined;
  statistics: StatisticName[];
  /** `--taus`, in seconds. */
  taus: number[] | undefined;
  noise: NoiseType | undefined;
  confidence: number | undefined;
}

/** Reads and checks `--tau0`, `--statistics`, `--taus`, `--noise` and `--confidence`. */
function stabilityRequest(args: ParsedArgs): StabilityRequest {
  const tau0 = numberFlag(args, 'tau0');
  const statistics = (listFlag(args, 'statistics') ?? [...DEFAULT_STATISTICS]).map((s) => s.toLowerCase());
  for (const s of statistics) {
    if (!STATISTIC_NAMES.includes(s as StatisticName))
      throw new UsageError(
        `--statistics: unknown statistic ${JSON.stringify(s)}; choose from ${STATISTIC_NAMES.join(', ')}`,
      );
  }
  const taus = listFlag(args, 'taus')?.map((t) => parseNumber('--taus', t));
  const noiseText = optionalFlag(args, 'noise');
  const noise = noiseText?.toUpperCase() as NoiseType | undefined;
  if (noise !== undefined && !NOISES.includes(noise))
    throw new UsageError(`--noise must be one of ${NOISES.join(', ')}; received ${JSON.stringify(noiseText)}`);
  const confidence = numberFlag(args, 'confidence');
  if (confidence !== undefined && !(confidence > 0 && confidence < 1)) {
    throw new InvalidArgumentError(
      '--confidence',
      confidence,
      'in (0, 1), e.g. 0.6827 or 0.95',
      confidence >= 1 && confidence < 100 ? 'a fraction, not a percentage' : undefined,
    );
  }
  return { tau0, statistics: statistics as StatisticName[], taus, noise, confidence };
}

/**
 * Runs the SDK analysis on a record, naming the flag behind a bad argument.
 * @throws {InvalidArgumentError} for a record under {@link MIN_PHASE_POINTS} phase points, or when no τ has a complete term.
 */
function analyzeRecord(input: ClockRecord, request: StabilityRequest): StabilityAnalysis {
  const { taus, noise, confidence } = request;
  const phasePoints = input.values.length + (input.kind === 'frequency' ? 1 : 0);
  if (phasePoints < MIN_PHASE_POINTS) {
    throw new InvalidArgumentError(
      input.flag,
      input.source,
      `a record of at least ${MIN_PHASE_POINTS} phase points (${MIN_PHASE_POINTS - 1} frequency values)`,
      `it has ${input.values.length} sample(s)`,
    );
  }
  const data: StabilityData =
    input.kind === 'phase' ? { phase: input.values, tau0: input.tau0 } : { frequency: input.values, tau0: input.tau0 };
  const analysis = withFlagNames(stabilityFlagOf, () =>
    analyzeStability(data, {
      statistics: request.statistics,
      ...(taus ? { taus } : {}),
      ...(noise ? { noise } : {}),
      ...(confidence !== undefined ? { confidence } : {}),
    }),
  );
  if (analysis.rows.length === 0) {
    const n = analysis.input.phasePoints;
    const longest = Math.floor((n - 1) / 2) * analysis.input.tau0;
    throw new InvalidArgumentError(
      taus ? '--taus' : input.flag,
      taus ? taus.join(',') : input.source,
      'a request in which at least one τ has a complete (gap-free) term',
      `the record has ${n} phase points, ${analysis.input.missing} missing in ${input.gaps.length} gap(s); ` +
        `without gaps oadev reaches τ = ⌊(N − 1)/2⌋·τ0 = ${sig(longest)} s; dropped τ: ${analysis.droppedTaus.map((t) => sig(t)).join(', ')} s`,
    );
  }
  return analysis;
}

/** What `gaps[].time` counts from, for `units.gapTime`. */
function gapTimeUnit(input: ClockRecord, epoch: RecordEpoch | undefined): string {
  if (input.epoch !== undefined) return 's since input.epoch (the first sample)';
  if (epoch !== undefined)
    return "s on the record's time column, since input.epoch (--epoch: where the column reads 0 s)";
  return "s on the record's time column (its origin not named: give --epoch <ISO 8601> to place it)";
}

/**
 * The `--json` document: input summary, one flat row per τ (`<stat>`, `<stat>Low`, … null where a statistic has no
 * terms), units. `epoch`: t = 0 of the record's axis (a RINEX clock's first sample, or `--epoch`), if known.
 */
function stabilityJson(
  input: ClockRecord,
  analysis: StabilityAnalysis,
  epoch: RecordEpoch | undefined,
): Record<string, unknown> {
  const stats = analysis.statistics;
  // A RINEX clock record is placed on its first sample's instant (read on GPS time when the file names no system);
  // a text record on --epoch, on the scale it was given on.
  const stamp = epoch === undefined ? undefined : (t: number): Stamp => stampOf(epoch.instant.plus(t), epoch.scale);
  const rows = analysis.rows.map((r) => {
    const row: Record<string, unknown> = {
      tau: r.tau,
      m: r.m,
      noise: r.noise,
      alpha: r.alpha,
      noiseSource: r.noiseSource,
    };
    for (const s of stats) {
      const e = r.statistics[s];
      row[s] = e?.deviation ?? null;
      row[`${s}Low`] = e?.low ?? null;
      row[`${s}High`] = e?.high ?? null;
      row[`${s}N`] = e?.n ?? null;
      row[`${s}Edf`] = e?.edf ?? null;
      row[`${s}EdfModel`] = e?.edfModel ?? null;
    }
    return row;
  });
  return {
    input: {
      kind: input.kind,
      file: input.source,
      ...(input.clock ? { clock: input.clock } : {}),
      ...timeSystemJson(input),
      ...(stamp ? { epoch: stamp(0) } : {}),
      samples: analysis.input.samples,
      phasePoints: analysis.input.phasePoints,
      missing: analysis.input.missing,
      // A RINEX clock file's gap epochs also as stamps in its time system (timeStamp).
      gaps: gapsJson(input.gaps, stamp),
      tau0: analysis.input.tau0,
    },
    confidence: analysis.confidence,
    statistics: stats,
    rows,
    droppedTaus: analysis.droppedTaus,
    units: {
      tau: 's',
      tau0: 's',
      droppedTaus: 's',
      tdev: 's',
      tdevLow: 's',
      tdevHigh: 's',
      confidence: 'dimensionless (probability)',
      deviations: 'dimensionless (fractional frequency) for every statistic except tdev',
      gapTime: gapTimeUnit(input, epoch),
      ...(stamp === undefined
        ? {}
        : {
            epoch: '{ iso: ISO 8601 without zone, scale: the time system it is read on }',
            gapTimeStamp: '{ iso: ISO 8601 without zone, scale: the time system it is read on }',
          }),
    },
  };
}

/** The record's one-line summary: kind, file, clock, samples, τ0, the span of a RINEX clock's epochs and the gaps. */
function recordSummary(input: ClockRecord, analysis: StabilityAnalysis): string {
  const epoch = epochFormat(input);
  const first = input.times?.[0];
  const last = input.times?.at(-1);
  const span =
    input.flag === '--rinex-clock' && first !== undefined && last !== undefined
      ? `epochs ${epoch.text(first)} … ${epoch.text(last)}, `
      : '';
  return (
    `${input.kind} record ${input.source}${input.clock ? ` (clock ${input.clock}${input.timeSystem ? `, ${input.timeSystem} time` : ''})` : ''}: ` +
    `${analysis.input.samples} samples, τ0 = ${sig(analysis.input.tau0)} s, ` +
    span +
    `${analysis.input.missing} missing in ${input.gaps.length} gap(s)\n`
  );
}

/** The human-readable report: record summary, first gaps, the deviation table fitted to `width` and its notes. */
function printStabilityText(
  out: (text: string) => void,
  width: number | undefined,
  input: ClockRecord,
  analysis: StabilityAnalysis,
  recordEpoch: RecordEpoch | undefined,
): void {
  const stats = analysis.statistics;
  // A text record placed by --epoch prints its gaps as stamps on the scale --epoch was read on.
  const epoch = epochFormat(
    input.epoch === undefined && recordEpoch !== undefined
      ? { epoch: recordEpoch.instant, timeSystem: recordEpoch.scale }
      : input,
  );
  out(recordSummary(input, analysis));
  for (const g of input.gaps.slice(0, 10)) {
    out(
      `  gap: ${g.missing} missing sample(s) from index ${g.index}${g.time !== undefined ? ` (t = ${epoch.text(g.time)})` : ''}, line ${g.line}\n`,
    );
  }
  if (input.gaps.length > 10) out(`  ... ${input.gaps.length - 10} more gaps (see --json)\n`);
  const headers = ['τ (s)', 'noise'];
  for (const s of stats) headers.push(s, `${s} interval`, 'n');
  const rows = analysis.rows.map((r) => {
    const cells: string[] = [
      sig(r.tau, 6),
      `${r.noise}${r.noiseSource === 'identified' ? '' : r.noiseSource === 'stated' ? ' (stated)' : '*'}`,
    ];
    for (const s of stats) {
      const e = r.statistics[s];
      if (!e) cells.push('—', '—', '—');
      else
        cells.push(
          formatDeviation(s, e.deviation),
          `[${formatDeviation(s, e.low)}, ${formatDeviation(s, e.high)}]`,
          String(e.n),
        );
    }
    return cells;
  });
  // Too many statistics for the width: panels of whole statistics (value, interval, n), each with τ and noise.
  const groups = stats.map((_, k) => [2 + 3 * k, 3 + 3 * k, 4 + 3 * k]);
  out(`\n${fitTable(headers, rows, { width, panels: { keys: 2, groups } })}`);
  out(
    `\nDeviations are fractional frequency (dimensionless); tdev in seconds. Intervals: ${sig(analysis.confidence * 100, 4)} % chi-square (NIST SP 1065 §5.3).\n`,
  );
  if (analysis.rows.some((r) => r.noiseSource === 'carried-from-shorter-tau' || r.noiseSource === 'default-wfm')) {
    out(
      '* noise type not identifiable at this τ (fewer than 32 points): carried from a shorter τ, or white FM when none could be identified.\n',
    );
  }
  if (analysis.droppedTaus.length > 0)
    out(`Dropped τ (no complete term): ${analysis.droppedTaus.map((t) => sig(t)).join(', ')} s\n`);
}

export const stabilityCommand: Command = {
  name: 'stability',
  summary: 'Allan, modified Allan, time, Hadamard and total deviations with confidence intervals and noise type per τ.',
  usage:
    '(--phase <file> | --frequency <file> | --rinex-clock <file> --clock <name>) [--epoch <ISO 8601>] [--tau0 <s>] [--statistics oadev,mdev,...] [--taus <s,...>] [--noise <type>] [--confidence <p>] [--json | --format table|json]',
  flags: {
    ...recordFlags(['phase', 'frequency']),
    epoch: {
      type: 'string',
      value: '<ISO 8601>',
      description: `Instant at which the time column of a --phase or --frequency record reads 0 s (one column: the first sample); optional: input.epoch and the gaps' stamps are then reported (a RINEX clock file starts at its first epoch). ${STAMP_HELP}.`,
    },
    tau0: {
      type: 'string',
      value: '<s>',
      description: 'Sample spacing τ0 in seconds (required for one-column files; otherwise the smallest time step).',
    },
    statistics: {
      type: 'string',
      value: '<list>',
      description: `Comma list of ${STATISTIC_NAMES.join(', ')} (default ${DEFAULT_STATISTICS.join(',')}).`,
    },
    taus: {
      type: 'string',
      value: '<s,...>',
      description: 'Averaging times in seconds, each a whole multiple of τ0 (default octaves τ0·2^k).',
    },
    noise: {
      type: 'string',
      value: '<type>',
      description: 'State the noise type for the intervals (WPM, FPM, WFM, FFM, RWFM) instead of identifying it per τ.',
    },
    confidence: {
      type: 'string',
      value: '<p>',
      description: 'Two-sided confidence level of the intervals, in (0, 1) (default 0.6827 = ±1σ).',
    },
    ...formatFlags(TABLE_OR_JSON),
  },
  details: `
Statistics (NIST SP 1065, W. J. Riley 2008, §5.2), τ = m·τ0, x phase in s:
  adev/oadev  σ² = Σ(x[i+2m] − 2x[i+m] + x[i])² / (2τ²n)   (non-overlapping / overlapping)
  mdev        σ² = Σ_j[Σ_{i=j}^{j+m−1}(x[i+2m] − 2x[i+m] + x[i])]² / (2m²τ²n)
  tdev        σ_x = τ/√3 · mdev  (seconds)
  hdev/ohdev  σ² = Σ(x[i+3m] − 3x[i+2m] + 3x[i+m] − x[i])² / (6τ²n)
  totdev      reflected-extension total deviation (§5.2.11)
Gaps: a missing epoch (time column) or NaN value is a missing sample; statistics use complete terms
only and report the reduced n; totdev refuses records with gaps. Nothing is interpolated.
Intervals: chi-square with equivalent degrees of freedom (SP 1065 §5.3): oadev Howe–Allan–Barnes
formulas; adev, mdev, tdev, hdev, ohdev exact Gaussian edf for the noise type; totdev b·T/τ − c.
Noise type per τ: B1 ratio, R(n) and lag-1 autocorrelation (NIST SP 1065 §5.6), unless --noise is given.
JSON: { input: { kind, file, samples, phasePoints, missing, gaps[], tau0 }, confidence, statistics,
rows: [ { tau, m, noise, alpha, noiseSource, <stat>, <stat>Low, <stat>High, <stat>N, <stat>Edf,
<stat>EdfModel } ], droppedTaus, units }. A statistic without terms at a τ is null in that row.
Deviations are dimensionless fractional frequency; tdev and tau are in seconds. A RINEX clock record adds
input.clock, input.timeSystem and input.epoch (its first sample, { iso, scale }); its gaps' time is in seconds
since input.epoch, with timeStamp ({ iso, scale }) beside it. A text record's gaps' time is on its own time column;
with --epoch (the instant at which that column reads 0 s) input.epoch and timeStamp are given too. units.gapTime
says which.
A record needs at least ${MIN_PHASE_POINTS} phase points (${MIN_PHASE_POINTS - 1} frequency values); a request in which no τ has a complete
term (e.g. --taus longer than half the record) is refused.
Exit status: 0 success, 2 unusable input.`,
  async run(args, io) {
    const format = formatFlag(args, TABLE_OR_JSON, 'table');
    const request = stabilityRequest(args);
    const input = await readClockRecord(args, ['phase', 'frequency'], request.tau0);
    const epoch = recordEpochFlag(args, input);
    const analysis = analyzeRecord(input, request);
    if (format === 'json') {
      io.out(toJson(stabilityJson(input, analysis, epoch)));
    } else {
      const width = outputWidth(args);
      printStabilityText(wrappedOut(io.out, width), width, input, analysis, epoch);
    }
    return EXIT_OK;
  },
};
