/**
 * `tauline clock`: characterise a clock from its phase record — polynomial model (af0/af1/af2) with
 * uncertainties under the clock's own noise, diffusion coefficients q1/q2/q3 fitted to the stability of
 * the residuals, and a Kalman pass with outliers, phase/frequency jumps and NIS consistency.
 */

import { statSync } from 'node:fs';
import { characterizeClock } from '@tauline/sdk/clock-model';
import { type ClockFlags, clockJson, clockReport, clockText } from '../clock-output.js';
import { parseStampFlag, type RecordEpoch, recordEpochFlag, STAMP_HELP, stampOf } from '../epochs.js';
import {
  type Command,
  EXIT_OK,
  formatFlag,
  formatFlags,
  type Io,
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
import { outputWidth, wrappedOut } from '../layout.js';
import { phaseSigmaHint, warn } from '../plausibility.js';
import { startProgress } from '../progress.js';
import { type ClockRecord, readClockRecord, recordFlags } from '../records.js';

/** Input size above which a terminal shows the progress of reading and characterising, in bytes. */
export const CLOCK_PROGRESS_BYTES = 4 * 1024 * 1024;

/** Size of the record file named by the input flags, in bytes (0 when it cannot be known, e.g. a pipe). */
function inputBytes(args: ParsedArgs): number {
  const path = optionalFlag(args, 'rinex-clock') ?? optionalFlag(args, 'phase');
  try {
    return path === undefined ? 0 : statSync(path).size;
  } catch {
    return 0; // the reader reports an unusable file
  }
}

function choice<T extends number>(args: ParsedArgs, flag: string, allowed: readonly T[], fallback: T): T {
  const text = optionalFlag(args, flag);
  if (text === undefined) return fallback;
  const v = parseNumber(`--${flag}`, text);
  if (!allowed.includes(v as T))
    throw new UsageError(`--${flag} must be ${allowed.join(' or ')}; received ${JSON.stringify(text)}`);
  return v as T;
}

function uniformEpochs(n: number, tau0: number): Float64Array {
  const t = new Float64Array(n);
  for (let k = 0; k < n; k++) t[k] = k * tau0;
  return t;
}

/** The instant of t = 0 of the record's time axis (see {@link recordEpochFlag}); required for a text record. */
function recordEpoch(args: ParsedArgs, rec: ClockRecord): RecordEpoch {
  const epoch = recordEpochFlag(args, rec);
  if (epoch === undefined) {
    throw new UsageError(
      `${rec.flag} ${rec.source} has no calendar: give --epoch <ISO 8601>, the instant at which its time column ` +
        'reads 0 s (one column: the first sample), e.g. --epoch 2027-02-08T06:00:00 (GPS time) or 2027-02-08T06:00:00Z (UTC)',
    );
  }
  return epoch;
}

function clockFlags(args: ParsedArgs, io: Io): ClockFlags {
  const format = formatFlag(args, TABLE_OR_JSON, 'table');
  const tau0 = numberFlag(args, 'tau0');
  const degree = choice(args, 'degree', [1, 2] as const, 2);
  const states = choice(args, 'states', [2, 3] as const, 2);
  const sigma = numberFlag(args, 'measurement-sigma');
  if (sigma !== undefined && !(sigma > 0)) throw new UsageError(`--measurement-sigma must be > 0 s; received ${sigma}`);
  const sigmaHint = sigma === undefined ? undefined : phaseSigmaHint('--measurement-sigma', sigma);
  if (sigmaHint) warn(io, 'clock', sigmaHint);
  const predictText = optionalFlag(args, 'predict');
  const predict =
    predictText === undefined
      ? []
      : predictText.split(',').map((text) => ({ text, instant: parseStampFlag('--predict', text).instant }));
  const referenceText = optionalFlag(args, 'reference-epoch');
  const referenceEpoch =
    referenceText === undefined ? undefined : parseStampFlag('--reference-epoch', referenceText).instant;
  return {
    format,
    tau0,
    degree,
    states,
    sigma,
    referenceEpoch,
    predict,
    scenarioNoise: args.values['scenario-noise'] === true,
  };
}

/**
 * `--reference-epoch` and `--predict` as seconds on the record's time axis (since `epoch`, its t = 0).
 * @throws {UsageError} for a prediction epoch before the last sample, naming both epochs.
 */
function onRecordAxis(
  flags: ClockFlags,
  { instant: epoch, scale }: RecordEpoch,
  rec: ClockRecord,
  t: Float64Array,
): { referenceTime: number | undefined; predict: number[] } {
  const lastT = t[t.length - 1] ?? 0;
  const predict = flags.predict.map(({ text, instant }) => {
    const p = instant.secondsSince(epoch);
    if (p < lastT) {
      const last = stampOf(epoch.plus(lastT), scale);
      const onColumn = rec.epoch === undefined ? ` (${sig(lastT, 12)} s on the time column)` : '';
      throw new UsageError(
        `--predict: ${text} is before the last sample epoch ${last.iso} ${last.scale}${onColumn}; predictions are for epochs after the record`,
      );
    }
    return p;
  });
  return { referenceTime: flags.referenceEpoch?.secondsSince(epoch), predict };
}

export const MIN_CLOCK_SAMPLES = 12;

export const clockCommand: Command = {
  name: 'clock',
  summary:
    'Characterise a clock from its phase record: af0/af1/af2 with uncertainty, noise q1/q2/q3 from the stability of the residuals, Kalman outliers and jumps.',
  usage:
    '(--phase <file> --epoch <ISO 8601> | --rinex-clock <file> --clock <name>) [--tau0 <s>] [--degree 1|2] [--reference-epoch <ISO 8601>] [--predict <ISO 8601,...>] [--states 2|3] [--measurement-sigma <s>] [--scenario-noise] [--json | --format table|json]',
  flags: {
    ...recordFlags(['phase']),
    epoch: {
      type: 'string',
      value: '<ISO 8601>',
      description: `Instant at which the time column of a --phase record reads 0 s (one column: the first sample); required for a text record (a RINEX clock file starts at its first epoch). ${STAMP_HELP}.`,
    },
    tau0: {
      type: 'string',
      value: '<s>',
      description: 'Sample spacing τ0 in seconds (required for one-column files).',
    },
    degree: {
      type: 'string',
      value: '1|2',
      description: 'Polynomial degree: 1 = af0, af1; 2 = af0, af1, af2 (default 2).',
    },
    'reference-epoch': {
      type: 'string',
      value: '<ISO 8601>',
      description: `Reference epoch t_oc of af0/af1/af2 (default: the first sample's epoch). ${STAMP_HELP}.`,
    },
    predict: {
      type: 'string',
      value: '<ISO 8601,...>',
      description:
        'Epochs, comma-separated, at or after the last sample, at which to predict the phase with its 1σ; read as --reference-epoch.',
    },
    states: {
      type: 'string',
      value: '2|3',
      description: 'Noise model: 2 = q1, q2 from OADEV; 3 = q1, q2, q3 from OHDEV (default 2).',
    },
    'measurement-sigma': {
      type: 'string',
      value: '<s>',
      description: 'White measurement noise 1σ of the phase, in seconds (default: estimated from the record).',
    },
    'scenario-noise': {
      type: 'boolean',
      description: 'Also print { "q1", "q2", "q3" } for a steering scenario\'s clock.noise.',
    },
    ...formatFlags(TABLE_OR_JSON, { json: 'Print one JSON object instead of tables (same as --format json).' }),
  },
  details: `
Procedure (each step an SDK call, nothing interpolated):
 1. Measurement noise σ_v: --measurement-sigma, or the lag-2 autocovariance of the second differences
    (measurementNoiseFromPhase). When it is not significantly above zero, the noise fit assumes none and the
    filter uses its 2σ upper bound.
 2. Pass 1: least-squares polynomial (fitClockPolynomial) → OADEV/OHDEV of the residuals (NIST SP 1065)
    → q1, q2(, q3) (diffusionFromStabilityRows, Zucca & Tavella 2005 variance forms) → Kalman pass
    (runClockFilter: GLR outlier and phase/frequency jump detection on the innovations of all samples,
    Willsky & Jones 1976; a false jump is declared with probability ≤ 1e-6 per sample, a good sample is
    rejected as an outlier with probability 1e-4; both thresholds are printed).
 3. If jumps or outliers were declared: phases corrected by the declared jumps, outliers removed, and pass 2
    repeats step 2 on the corrected record (up to 3 passes). Reported model = last pass.
Uncertainties: af0/af1/af2 and predictions under the fitted clock noise plus measurement noise
(polynomialNoiseCovariance; the white-noise formula would understate them); q's with χ² intervals (±1σ
level) from a covariance that accounts for the correlation of overlapping estimates.
h-coefficients (IEEE Std 1139, one-sided): h0 = 2q1, h₋₂ = q2/(2π²), h₋₄ = q3/(8π⁴).
Epochs: the record's time axis starts at input.epoch: a RINEX clock file's first sample, or --epoch
for a text record. JSON gives each epoch as seconds since input.epoch (firstEpoch, lastEpoch,
gaps[].time, referenceTime, predictions[].t, jumps[].epoch, rejected[].t) and as a stamp
{ iso, scale } beside it (…Stamp fields, referenceEpoch): ISO 8601 without zone, read on the file's
time system (for a text record, the one --epoch was given on).
Units: seconds, fractional frequency (dimensionless), 1/s, 1/s³. A --measurement-sigma of 1 µs or more (ns given as s?)
is used as given, with a warning on stderr. Exit status: 0 success, 2 unusable input.`,
  retiredFlags: {
    'reference-time':
      'give t_oc as --reference-epoch <ISO 8601> (GPS time; UTC with Z), e.g. --reference-epoch 2027-02-08T06:00:00',
  },
  async run(args, io) {
    const flags = clockFlags(args, io);
    // Progress on a terminal for a big file, in four stages: reading, then up to three characterisation passes
    // (a bar left by an error is cleared by main before the error line).
    const bar = startProgress(io, 'characterising the clock', inputBytes(args) > CLOCK_PROGRESS_BYTES);
    bar.update(0, 4);
    const rec = await readClockRecord(args, ['phase'], flags.tau0);
    bar.update(1, 4);
    let present = 0;
    for (const v of rec.values) if (v === v) present += 1;
    if (present < MIN_CLOCK_SAMPLES) {
      throw new UsageError(
        `${rec.flag} ${rec.source} has ${present} phase samples; the clock model needs at least ${MIN_CLOCK_SAMPLES} ` +
          '(the measurement-noise estimate uses lag-2 second differences and the noise fit at least two averaging times): give a longer record',
      );
    }
    const t = rec.times ?? uniformEpochs(rec.values.length, rec.tau0); // a one-column record's epochs are k·τ0
    const recEpoch = recordEpoch(args, rec);
    const { instant: epoch, scale } = recEpoch;
    const { referenceTime, predict } = onRecordAxis(flags, recEpoch, rec, t);
    // A record too short for the noise estimate is the file's fault: name the flag that gave it.
    const result = withFlagNames({ phase: rec.flag }, () =>
      characterizeClock(
        { epoch, phase: rec.values, t, tau0: rec.tau0 },
        {
          degree: flags.degree,
          states: flags.states,
          predict,
          onPass: (pass) => bar.update(1 + pass, 4),
          ...(referenceTime === undefined ? {} : { referenceTime }),
          ...(flags.sigma === undefined ? {} : { measurementSigma: flags.sigma }),
        },
      ),
    );
    bar.finish();
    const report = clockReport(result, flags, predict);
    if (flags.format === 'json') io.out(toJson(clockJson(rec, t, result, report, flags, scale)));
    else clockText(wrappedOut(io.out, outputWidth(args)), outputWidth(args), rec, t, result, report, flags, scale);
    return EXIT_OK;
  },
};
