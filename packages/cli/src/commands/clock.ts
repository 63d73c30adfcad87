/**
 * `tauline clock`: characterise a clock from its phase record — polynomial model (af0/af1/af2) with
 * uncertainties under the clock's own noise, diffusion coefficients q1/q2/q3 fitted to the stability of
 * the residuals, and a Kalman pass with outliers, phase/frequency jumps and NIS consistency.
 */

import { statSync } from 'node:fs';
import { type ClockCharacterization, characterizeClock } from '@tauline/sdk/clock-model';
import { epochFormat } from '../epochs.js';
import {
  type Command,
  EXIT_OK,
  FLIGHT_CAUTION,
  formatFlag,
  formatFlags,
  type Io,
  keyValueTable,
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

/** The h-coefficient of each diffusion coefficient (IEEE Std 1139): its field in `h`/`hStd` and its printed name. */
const H_OF_Q = {
  q1: { field: 'h0', label: 'h0' },
  q2: { field: 'hMinus2', label: 'h₋₂' },
  q3: { field: 'hMinus4', label: 'h₋₄' },
} as const;

function uniformEpochs(n: number, tau0: number): Float64Array {
  const t = new Float64Array(n);
  for (let k = 0; k < n; k++) t[k] = k * tau0;
  return t;
}

const fmt = (v: number, d = 4): string => sig(v, d);
const pm = (v: number, s: number, unit: string): string => `${fmt(v, 6)} ± ${fmt(s, 2)}${unit ? ` ${unit}` : ''}`;

/** The parsed flags of `tauline clock`. */
interface ClockFlags {
  readonly format: 'table' | 'json';
  readonly tau0: number | undefined;
  readonly degree: 1 | 2;
  readonly states: 2 | 3;
  readonly sigma: number | undefined;
  readonly referenceTime: number | undefined;
  readonly predict: number[];
  readonly scenarioNoise: boolean;
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
  const predict = predictText === undefined ? [] : predictText.split(',').map((v) => parseNumber('--predict', v));
  const referenceTime = numberFlag(args, 'reference-time');
  return {
    format,
    tau0,
    degree,
    states,
    sigma,
    referenceTime,
    predict,
    scenarioNoise: args.values['scenario-noise'] === true,
  };
}

type QName = 'q1' | 'q2' | 'q3';
const Q_UNITS = { q1: 's', q2: '1/s', q3: '1/s³' } as const;

/** The derived numbers both output forms print. */
function clockReport(result: ClockCharacterization, flags: ClockFlags) {
  const { polynomial: poly, polynomialNoise: polyNoise, noise } = result;
  const names = flags.degree === 2 ? ['af0', 'af1', 'af2'] : ['af0', 'af1'];
  const units = ['s', 'dimensionless', '1/s'];
  const coefficients = names.map((name, i) => ({
    name,
    value: poly.coefficients[i] ?? Number.NaN,
    std: polyNoise.std[i] ?? Number.NaN,
    whiteNoiseStd: Math.sqrt(poly.covariance[i]?.[i] ?? Number.NaN),
    unit: units[i] ?? '',
  }));
  const rFit = result.measurementNoise.varianceInNoiseFit;
  const residualRms = Math.sqrt(poly.chiSquare / poly.residuals.length);
  const reducedChiSquare = rFit > 0 ? poly.chiSquare / rFit / poly.dof : Number.NaN;
  const predictions = flags.predict.map((T, j) => ({
    t: T,
    phase: poly.predict(T),
    std: polyNoise.predictStd[j] ?? Number.NaN,
  }));
  const qNames: QName[] = flags.states === 3 ? ['q1', 'q2', 'q3'] : ['q1', 'q2'];
  const allJumps = result.passes.flatMap((e) => e.jumps.map((j) => ({ pass: e.pass, ...j, index: j.updateIndex })));
  const allRejected = result.passes.flatMap((e) => e.rejected.map((r) => ({ pass: e.pass, ...r })));
  const scenarioNoise = { q1: noise.q.q1, q2: noise.q.q2, q3: noise.q.q3 };
  return { coefficients, residualRms, reducedChiSquare, predictions, qNames, allJumps, allRejected, scenarioNoise };
}
type ClockReport = ReturnType<typeof clockReport>;

/** The `--json` object. Epochs stay in seconds; a RINEX clock file adds ISO 8601 in its time system (…Iso fields). */
function clockJson(
  rec: ClockRecord,
  t: Float64Array,
  result: ClockCharacterization,
  report: ClockReport,
  flags: ClockFlags,
) {
  const epoch = epochFormat(rec);
  const isoOf = (name: string, value: number): Record<string, string> => {
    const iso = epoch.iso(value);
    return iso === undefined ? {} : { [`${name}Iso`]: iso };
  };
  const { polynomial: poly, noise, filter, measurementNoise: mn } = result;
  const first = t[0] ?? 0;
  const last = t[t.length - 1] ?? 0;
  const detection = filter.detection;
  return {
    input: {
      file: rec.source,
      ...(rec.clock ? { clock: rec.clock } : {}),
      ...(rec.timeSystem ? { timeSystem: rec.timeSystem } : {}),
      samples: rec.values.length,
      tau0: rec.tau0,
      gaps: rec.gaps.map((g) => ({ ...g, ...(g.time === undefined ? {} : isoOf('time', g.time)) })),
      firstEpoch: first,
      lastEpoch: last,
      ...isoOf('firstEpoch', first),
      ...isoOf('lastEpoch', last),
      ...(epoch.scale === undefined
        ? {}
        : { epochUnits: `seconds since 1980-01-06T00:00:00 ${epoch.scale}; …Iso fields: ISO 8601 in ${epoch.scale}` }),
    },
    measurementNoise: {
      sigma: Math.sqrt(mn.filterVariance),
      source: mn.source,
      ...(mn.estimate
        ? { estimateVariance: mn.estimate.variance, estimateStandardError: mn.estimate.standardError }
        : {}),
      varianceInNoiseFit: mn.varianceInNoiseFit,
    },
    polynomial: {
      degree: flags.degree,
      referenceTime: result.referenceTime,
      ...isoOf('referenceTime', result.referenceTime),
      coefficients: report.coefficients,
      residualRms: report.residualRms,
      reducedChiSquare: report.reducedChiSquare,
      dof: poly.dof,
      samplesUsed: result.samplesUsed,
      predictions: report.predictions.map((p) => ({ ...p, ...isoOf('t', p.t) })),
      uncertaintyNote:
        'std: under the fitted clock noise (q) plus measurement noise; whiteNoiseStd: residual-scaled white-noise formula, for comparison',
      caution: FLIGHT_CAUTION,
    },
    noise: {
      states: flags.states,
      statistic: noise.statistic,
      q: noise.q,
      qStd: noise.qStd,
      intervals: noise.intervals,
      confidence: noise.confidence,
      atZero: noise.atZero,
      h: noise.h,
      hStd: noise.hStd,
      chiSquare: noise.chiSquare,
      dof: noise.dof,
      chiSquareProbability: noise.chiSquareProbability,
      points: noise.points,
      excluded: noise.excluded,
    },
    filter: {
      states: filter.states,
      passes: result.passes.length,
      jumps: report.allJumps.map((j) => ({ ...j, ...isoOf('epoch', j.epoch) })),
      rejected: report.allRejected.map((r) => ({ ...r, ...isoOf('t', r.t) })),
      nis: filter.nisSummary,
      detection: {
        falseAlarmProbabilityPerSample: detection.falseAlarmProbability,
        jumpThreshold: detection.jumpThreshold,
        testsPerSample: detection.testsPerUpdate,
        window: detection.window,
        minEpochs: detection.minEpochs,
        outlierProbability: detection.outlierProbability,
        outlierThreshold: detection.outlierThreshold,
        holdGate: detection.holdGate,
      },
    },
    ...(flags.scenarioNoise ? { scenarioNoise: report.scenarioNoise } : {}),
  };
}

/** The record, measurement noise and polynomial sections of the text output. */
function recordAndModelText(
  out: (text: string) => void,
  width: number | undefined,
  rec: ClockRecord,
  t: Float64Array,
  result: ClockCharacterization,
  report: ClockReport,
  flags: ClockFlags,
): void {
  const epoch = epochFormat(rec);
  const table = (headers: string[], rows: (string | number)[][]): string => fitTable(headers, rows, { width });
  const mn = result.measurementNoise;
  out(
    `clock record ${rec.source}${rec.clock ? ` (clock ${rec.clock}${rec.timeSystem ? `, ${rec.timeSystem} time` : ''})` : ''}: ${rec.values.length} samples, τ0 = ${sig(rec.tau0)} s, ` +
      `epochs ${epoch.text(t[0] ?? 0)} … ${epoch.text(t[t.length - 1] ?? 0)}, ${rec.gaps.reduce((a, g) => a + g.missing, 0)} missing in ${rec.gaps.length} gap(s)\n`,
  );
  for (const g of rec.gaps.slice(0, 10)) {
    out(
      `  gap: ${g.missing} missing sample(s) from index ${g.index}${g.time !== undefined ? ` (t = ${epoch.text(g.time)})` : ''}, line ${g.line}\n`,
    );
  }
  if (rec.gaps.length > 10) out(`  ... ${rec.gaps.length - 10} more gaps (see --json)\n`);
  out(
    `measurement noise σ_v = ${fmt(Math.sqrt(mn.filterVariance), 3)} s (${mn.source}${mn.estimate ? `; lag-2 estimate ${fmt(mn.estimate.variance, 3)} ± ${fmt(mn.estimate.standardError, 2)} s²` : ''})\n\n`,
  );

  out(
    `Polynomial model x(t) = af0 + af1·(t − t_oc)${flags.degree === 2 ? ' + af2·(t − t_oc)²' : ''}, t_oc = ${epoch.text(result.referenceTime)}, degree ${flags.degree}, ${result.samplesUsed} samples\n`,
  );
  out(
    table(
      ['coefficient', 'value', '1σ (clock noise)', '1σ (white-noise formula)', 'unit'],
      report.coefficients.map((c) => [c.name, fmt(c.value, 10), fmt(c.std, 3), fmt(c.whiteNoiseStd, 3), c.unit]),
    ),
  );
  out(
    keyValueTable(
      [
        ['residual RMS', `${fmt(report.residualRms, 4)} s`],
        [
          'reduced χ² (vs σ_v²)',
          Number.isFinite(report.reducedChiSquare)
            ? `${fmt(report.reducedChiSquare, 4)} (residuals are clock noise, not white: >> 1 is expected)`
            : 'n/a (no measurement noise resolved)',
        ],
      ],
      width,
    ),
  );
  for (const p of report.predictions)
    out(
      `prediction at t = ${epoch.text(p.t)}: x = ${pm(p.phase, p.std, 's')} (1σ, model + clock noise after the record)\n`,
    );
  out(`${FLIGHT_CAUTION}\n\n`);
}

/** The noise-model section of the text output. */
function noiseText(
  out: (text: string) => void,
  width: number | undefined,
  result: ClockCharacterization,
  report: ClockReport,
  flags: ClockFlags,
): void {
  const noise = result.noise;
  const table = (headers: string[], rows: (string | number)[][]): string => fitTable(headers, rows, { width });
  out(
    `Noise model (${flags.states}-state, from ${noise.statistic.toUpperCase()} of the residuals; ${sig(noise.confidence * 100, 4)} % χ² intervals)\n`,
  );
  out(
    table(
      ['coefficient', 'value', '1σ', 'interval', 'unit', 'h-coefficient'],
      report.qNames.map((n) => {
        const iv = noise.intervals[n];
        const h = H_OF_Q[n];
        const interval = noise.atZero.includes(n)
          ? 'held at 0 (not resolved)'
          : iv
            ? `[${fmt(iv.low, 3)}, ${fmt(iv.high, 3)}]${iv.edf < 1 ? ' (not resolved)' : ''}`
            : '—';
        return [
          n,
          fmt(noise.q[n], 4),
          fmt(noise.qStd[n], 2),
          interval,
          Q_UNITS[n],
          `${h.label} = ${fmt(noise.h[h.field], 4)} ± ${fmt(noise.hStd[h.field], 2)} ${Q_UNITS[n]}`,
        ];
      }),
    ),
  );
  out(
    `fit: χ² = ${fmt(noise.chiSquare, 4)} on ${noise.dof} dof (p = ${fmt(noise.chiSquareProbability, 3)})${noise.excluded.length ? `; left out: ${noise.excluded.map((e) => `τ = ${sig(e.tau)} s (${e.reason})`).join(', ')}` : ''}\n`,
  );
  out(
    table(
      ['τ (s)', noise.statistic, 'model', 'edf', 'residual (σ)'],
      noise.points.map((p) => [
        sig(p.tau, 6),
        p.deviation.toExponential(3),
        p.modelDeviation.toExponential(3),
        fmt(p.edf, 3),
        p.normalizedResidual.toFixed(2),
      ]),
    ),
  );
  out('\n');
}

/** The Kalman-pass section of the text output. */
function filterText(
  out: (text: string) => void,
  rec: ClockRecord,
  result: ClockCharacterization,
  report: ClockReport,
  flags: ClockFlags,
): void {
  const epoch = epochFormat(rec);
  const { filter } = result;
  const { allJumps, allRejected } = report;
  const detection = filter.detection;
  out(`Kalman pass (${filter.states}-state, R = σ_v², q from the noise model; ${result.passes.length} pass(es))\n`);
  out(
    `jump detection: GLR statistic l > ${fmt(detection.jumpThreshold, 4)} (χ²(1) at ${sig(detection.falseAlarmProbability, 3)}/${detection.testsPerUpdate}); ` +
      `on a jump-free record a false jump is declared with probability ≤ ${sig(detection.falseAlarmProbability, 3)} per sample ` +
      `(≤ ${sig(detection.falseAlarmProbability * rec.values.length, 3)} expected in this record)\n`,
  );
  out(
    `outliers: impulse statistic l > ${fmt(detection.outlierThreshold, 4)}, i.e. a good sample is rejected with probability ${sig(detection.outlierProbability, 3)}\n`,
  );
  if (allJumps.length === 0) out('jumps: none detected\n');
  else {
    out(
      fitTable(
        ['pass', 'kind', epoch.column, 'sample', 'size', '1σ', 'unit'],
        allJumps.map((j) => [
          String(j.pass),
          j.kind,
          epoch.cell(j.epoch),
          String(j.index),
          fmt(j.size, 4),
          fmt(j.sizeStd, 2),
          j.kind === 'phase' ? 's' : 'dimensionless',
        ]),
      ),
    );
  }
  if (allRejected.length === 0) out('outliers: none rejected\n');
  else {
    out(
      fitTable(
        ['pass', epoch.column, 'sample', 'innovation (s)', 'NIS'],
        allRejected.map((r) => [String(r.pass), epoch.cell(r.t), String(r.index), fmt(r.innovation, 4), fmt(r.nis, 4)]),
      ),
    );
  }
  const nis = filter.nisSummary;
  const inside = nis.mean >= nis.low && nis.mean <= nis.high;
  out(
    `mean NIS ${fmt(nis.mean, 4)} over ${nis.count} updates; ${sig(nis.confidence * 100, 3)} % χ² bounds [${fmt(nis.low, 4)}, ${fmt(nis.high, 4)}]: ${inside ? 'consistent' : 'NOT consistent (noise model or σ_v off)'}\n`,
  );
  if (allJumps.length > 0 || allRejected.length > 0) {
    out(
      `The model and noise above come from the record${allJumps.length ? ' corrected for these jumps' : ''}${allJumps.length && allRejected.length ? ' and' : ''}${allRejected.length ? ' without the rejected samples' : ''}.\n`,
    );
  }
  if (flags.scenarioNoise) {
    out(`\nSteering scenario clock.noise (q1 in s, q2 in 1/s, q3 in 1/s³):\n${JSON.stringify(report.scenarioNoise)}\n`);
  }
}

/** The human-readable output: record, model, noise, Kalman pass. */
function clockText(
  out: (text: string) => void,
  width: number | undefined,
  rec: ClockRecord,
  t: Float64Array,
  result: ClockCharacterization,
  report: ClockReport,
  flags: ClockFlags,
): void {
  recordAndModelText(out, width, rec, t, result, report, flags);
  noiseText(out, width, result, report, flags);
  filterText(out, rec, result, report, flags);
}

/** Fewest phase samples `tauline clock` accepts (the lag-2 measurement-noise estimate needs 8 pairs). */
export const MIN_CLOCK_SAMPLES = 12;

export const clockCommand: Command = {
  name: 'clock',
  summary:
    'Characterise a clock from its phase record: af0/af1/af2 with uncertainty, noise q1/q2/q3 from the stability of the residuals, Kalman outliers and jumps.',
  usage:
    '(--phase <file> | --rinex-clock <file> --clock <name>) [--tau0 <s>] [--degree 1|2] [--reference-time <s>] [--predict <s,...>] [--states 2|3] [--measurement-sigma <s>] [--scenario-noise] [--json | --format table|json]',
  flags: {
    ...recordFlags(['phase']),
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
    'reference-time': {
      type: 'string',
      value: '<s>',
      description:
        "Reference epoch t_oc of af0/af1/af2, in the record's seconds: the time column of a text record, or for a RINEX clock file seconds since 1980-01-06T00:00:00 of its time system (default: first epoch).",
    },
    predict: {
      type: 'string',
      value: '<s,...>',
      description:
        'Epochs (record seconds as for --reference-time, ≥ the last sample) at which to predict the phase with its 1σ.',
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
Units: seconds, fractional frequency (dimensionless), 1/s, 1/s³. A --measurement-sigma of 1 µs or more (ns given as s?)
is used as given, with a warning on stderr. Exit status: 0 success, 2 unusable input.`,
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
    const lastT = t[t.length - 1] ?? 0;
    for (const p of flags.predict)
      if (p < lastT)
        throw new UsageError(
          `--predict: ${p} s is before the last sample epoch ${lastT} s; predictions are for epochs after the record`,
        );
    // A record too short for the noise estimate is the file's fault: name the flag that gave it.
    const result = withFlagNames({ phase: rec.flag }, () =>
      characterizeClock(
        { phase: rec.values, t, tau0: rec.tau0 },
        {
          degree: flags.degree,
          states: flags.states,
          predict: flags.predict,
          onPass: (pass) => bar.update(1 + pass, 4),
          ...(flags.referenceTime === undefined ? {} : { referenceTime: flags.referenceTime }),
          ...(flags.sigma === undefined ? {} : { measurementSigma: flags.sigma }),
        },
      ),
    );
    bar.finish();
    const report = clockReport(result, flags);
    if (flags.format === 'json') io.out(toJson(clockJson(rec, t, result, report, flags)));
    else clockText(wrappedOut(io.out, outputWidth(args)), outputWidth(args), rec, t, result, report, flags);
    return EXIT_OK;
  },
};
