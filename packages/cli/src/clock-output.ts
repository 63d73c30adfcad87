import type { ClockCharacterization } from '@tauline/sdk/clock-model';
import type { Instant } from '@tauline/sdk/time';
import { epochFormat, gapsJson, type Stamp, stampOf, timeSystemJson } from './epochs.js';
import { FLIGHT_CAUTION, keyValueTable, sig } from './framework.js';
import { fitTable } from './layout.js';
import type { ClockRecord } from './records.js';

/** The h-coefficient of each diffusion coefficient (IEEE Std 1139): its field in `h`/`hStd` and its printed name. */
const H_OF_Q = {
  q1: { field: 'h0', label: 'h0' },
  q2: { field: 'hMinus2', label: 'h₋₂' },
  q3: { field: 'hMinus4', label: 'h₋₄' },
} as const;

export const fmt = (v: number, d = 4): string => sig(v, d);
export const pm = (v: number, s: number, unit: string): string =>
  `${fmt(v, 6)} ± ${fmt(s, 2)}${unit ? ` ${unit}` : ''}`;

/** The parsed flags of `tauline clock`. */
export interface ClockFlags {
  readonly format: 'table' | 'json';
  readonly tau0: number | undefined;
  readonly degree: 1 | 2;
  readonly states: 2 | 3;
  readonly sigma: number | undefined;
  /** `--reference-epoch`: t_oc as an instant. */
  readonly referenceEpoch: Instant | undefined;
  /** `--predict`: each epoch as given and its instant. */
  readonly predict: readonly { readonly text: string; readonly instant: Instant }[];
  readonly scenarioNoise: boolean;
}

type QName = 'q1' | 'q2' | 'q3';
const Q_UNITS = { q1: 's', q2: '1/s', q3: '1/s³' } as const;

/**
 * The derived numbers both output forms print.
 * @param predict  The prediction epochs in seconds since `result.epoch` (as passed to characterizeClock).
 */
export function clockReport(result: ClockCharacterization, flags: ClockFlags, predict: readonly number[]) {
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
  const predictions = predict.map((T, j) => ({
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
export type ClockReport = ReturnType<typeof clockReport>;

/**
 * The `--json` object. Epochs are seconds since `input.epoch` (the instant of t = 0: a RINEX clock file's first
 * sample, or `--epoch`), each with its stamp `{ iso, scale }` beside it (…Stamp fields; `polynomial.referenceEpoch`
 * for t_oc): ISO 8601 text read on `scale` (the file's time system, or the one `--epoch` was given on).
 */
export function clockJson(
  rec: ClockRecord,
  t: Float64Array,
  result: ClockCharacterization,
  report: ClockReport,
  flags: ClockFlags,
  scale: string,
) {
  const stamp = (t: number): Stamp => stampOf(result.epoch.plus(t), scale);
  const { polynomial: poly, noise, filter, measurementNoise: mn } = result;
  const first = t[0] ?? 0;
  const last = t[t.length - 1] ?? 0;
  const detection = filter.detection;
  return {
    input: {
      file: rec.source,
      ...(rec.clock ? { clock: rec.clock } : {}),
      ...timeSystemJson(rec),
      samples: rec.values.length,
      tau0: rec.tau0,
      gaps: gapsJson(rec.gaps, stamp),
      firstEpoch: first,
      lastEpoch: last,
      firstEpochStamp: stamp(first),
      lastEpochStamp: stamp(last),
      epochUnits:
        'seconds since input.epoch; …Stamp fields and referenceEpoch: { iso: ISO 8601 without zone, scale: the time system it is read on }',
      epoch: stampOf(result.epoch, scale),
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
      referenceEpoch: stampOf(result.referenceEpoch, scale),
      coefficients: report.coefficients,
      residualRms: report.residualRms,
      reducedChiSquare: report.reducedChiSquare,
      dof: poly.dof,
      samplesUsed: result.samplesUsed,
      predictions: report.predictions.map((p) => ({ ...p, tStamp: stamp(p.t) })),
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
      jumps: report.allJumps.map((j) => ({ ...j, epochStamp: stamp(j.epoch) })),
      rejected: report.allRejected.map((r) => ({ ...r, tStamp: stamp(r.t) })),
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
export function recordAndModelText(
  out: (text: string) => void,
  width: number | undefined,
  rec: ClockRecord,
  t: Float64Array,
  result: ClockCharacterization,
  report: ClockReport,
  flags: ClockFlags,
  scale: string,
): void {
  const epoch = epochFormat(rec);
  const table = (headers: string[], rows: (string | number)[][]): string => fitTable(headers, rows, { width });
  const mn = result.measurementNoise;
  // A RINEX file's t_oc already prints as a stamp in its time system; a text record's as a stamp and its seconds.
  const referenceStamp = stampOf(result.referenceEpoch, scale);
  const toc =
    rec.flag === '--rinex-clock'
      ? epoch.text(result.referenceTime)
      : `${referenceStamp.iso} ${referenceStamp.scale} (${epoch.text(result.referenceTime)} on the time column)`;
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
    `Polynomial model x(t) = af0 + af1·(t − t_oc)${flags.degree === 2 ? ' + af2·(t − t_oc)²' : ''}, t_oc = ${toc}, degree ${flags.degree}, ${result.samplesUsed} samples\n`,
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
  for (const p of report.predictions) {
    // A text record's prediction epoch as a stamp on --epoch's scale, and on its time column.
    const stamp = stampOf(result.epoch.plus(p.t), scale);
    const at =
      rec.epoch === undefined ? `${stamp.iso} ${stamp.scale} (${epoch.text(p.t)} on the time column)` : epoch.text(p.t);
    out(`prediction at t = ${at}: x = ${pm(p.phase, p.std, 's')} (1σ, model + clock noise after the record)\n`);
  }
  out(`${FLIGHT_CAUTION}\n\n`);
}

/** The noise-model section of the text output. */
export function noiseText(
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
export function filterText(
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
export function clockText(
  out: (text: string) => void,
  width: number | undefined,
  rec: ClockRecord,
  t: Float64Array,
  result: ClockCharacterization,
  report: ClockReport,
  flags: ClockFlags,
  scale: string,
): void {
  recordAndModelText(out, width, rec, t, result, report, flags, scale);
  noiseText(out, width, result, report, flags);
  filterText(out, rec, result, report, flags);
}

/** Fewest phase samples `tauline clock` accepts (the lag-2 measurement-noise estimate needs 8 pairs). */
