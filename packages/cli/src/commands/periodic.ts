/**
 * `tauline periodic`: the periodic relativistic clock correction Δt_r = F·e·√a·sin E of an
 * eccentric orbit at a given mean anomaly.
 */

import { InvalidArgumentError } from '@tauline/sdk/errors';
import { periodicCorrectionAtMeanAnomaly } from '@tauline/sdk/relativity';
import { constantsFlag } from '../flags.js';
import {
  type Command,
  EXIT_OK,
  formatFlag,
  formatFlags,
  keyValueTable,
  numberFlag,
  sig,
  TABLE_OR_JSON,
  toJson,
  withFlagNames,
} from '../framework.js';
import { outputWidth } from '../layout.js';
import { angleHint, warn } from '../plausibility.js';

/**
 * Largest |M| accepted, in radians. Beyond it a float64 keeps the angle modulo 2π to worse than
 * ~1e-7 rad (ulp(1e9) = 1.2e-7), and at 1e16 not at all; reduce M modulo 2π first.
 */
export const MAX_MEAN_ANOMALY = 1e9;

const FLAG_NAMES: Record<string, string> = {
  semiMajorAxis: '--semi-major-axis',
  eccentricity: '--eccentricity',
  meanAnomaly: '--mean-anomaly',
};

export const periodicCommand: Command = {
  name: 'periodic',
  summary: 'Periodic relativistic clock correction of an eccentric orbit (Δt_r = F·e·√a·sin E).',
  usage:
    '--semi-major-axis <m> --eccentricity <e> --mean-anomaly <rad> [--constants <name>] [--json | --format table|json]',
  flags: {
    'semi-major-axis': {
      type: 'string',
      value: '<m>',
      description: 'Orbit semi-major axis a, in metres (e.g. 26561750).',
    },
    eccentricity: { type: 'string', value: '<e>', description: 'Eccentricity e, dimensionless, 0 ≤ e < 1.' },
    'mean-anomaly': {
      type: 'string',
      value: '<rad>',
      description: 'Mean anomaly M at the epoch, in radians, |M| ≤ 1e9.',
    },
    constants: {
      type: 'string',
      value: '<name>',
      description: 'Constant set giving F = −2√GM/c²: iers-2010 (default), gps-icd, galileo-icd, beidou-icd.',
    },
    ...formatFlags(TABLE_OR_JSON),
  },
  details: `
Solves Kepler's equation M = E − e·sin E, then
  Δt_r = F·e·√a·sin E,  F = −2√GM/c²  (= −2 r·v/c² on the same Kepler orbit)
Δt_r is ADDED to the broadcast clock offset: Δt_sv = a_f0 + a_f1(t − t_oc) + a_f2(t − t_oc)² + Δt_r, t = t_sv − Δt_sv.
Amplitude 2√(GM a)·e/c² ("about 2.29 µs × e" at GPS altitude).
Sources: IS-GPS-200 §20.3.3.3.3.1; IERS Conventions (2010) §10.2 eqs. 10.10–10.11.
Use --constants gps-icd for IS-GPS-200 conformance (F = −4.442807633e-10 s/√m).
JSON fields: semiMajorAxis (m), eccentricity, meanAnomaly (rad), eccentricAnomaly (rad), constants,
relativisticF (s/√m), correctionSeconds, amplitudeSeconds, units (unit of each field).
A mean anomaly above one turn but at most 360 (degrees?) is used as given, with a warning on stderr.
Exit status: 0 success, 2 invalid input.`,
  run(args, io) {
    const format = formatFlag(args, TABLE_OR_JSON, 'table');
    const semiMajorAxis = numberFlag(args, 'semi-major-axis', true);
    const eccentricity = numberFlag(args, 'eccentricity', true);
    const meanAnomaly = numberFlag(args, 'mean-anomaly', true);
    if (Math.abs(meanAnomaly) > MAX_MEAN_ANOMALY) {
      throw new InvalidArgumentError(
        '--mean-anomaly',
        meanAnomaly,
        'in [−1e9, 1e9] rad',
        'beyond that a double no longer holds the angle modulo 2π; reduce it modulo 2π first',
      );
    }
    const constants = constantsFlag(args);
    const result = withFlagNames(FLAG_NAMES, () =>
      periodicCorrectionAtMeanAnomaly(semiMajorAxis, eccentricity, meanAnomaly, { constants }),
    );
    const hint = angleHint('--mean-anomaly', meanAnomaly);
    if (hint) warn(io, 'periodic', hint);
    if (format === 'json') {
      io.out(
        toJson({
          semiMajorAxis,
          eccentricity,
          meanAnomaly,
          eccentricAnomaly: result.eccentricAnomaly,
          constants: constants.name,
          relativisticF: constants.relativisticF,
          correctionSeconds: result.correctionSeconds,
          amplitudeSeconds: result.amplitudeSeconds,
          units: {
            semiMajorAxis: 'm',
            eccentricity: 'dimensionless',
            meanAnomaly: 'rad',
            eccentricAnomaly: 'rad',
            relativisticF: 's/√m',
            correctionSeconds: 's',
            amplitudeSeconds: 's',
          },
        }),
      );
      return EXIT_OK;
    }
    io.out(
      keyValueTable(
        [
          ['semi-major axis', `${semiMajorAxis} m`],
          ['eccentricity', String(eccentricity)],
          ['mean anomaly', `${meanAnomaly} rad`],
          ['eccentric anomaly', `${sig(result.eccentricAnomaly, 15)} rad`],
          ['constants', `${constants.name} (F = ${constants.relativisticF.toExponential(9)} s/√m)`],
          [
            'correction Δt_r',
            `${sig(result.correctionSeconds, 13)} s (${sig(result.correctionSeconds * 1e9, 10)} ns; add to Δt_sv)`,
          ],
          ['amplitude', `${sig(result.amplitudeSeconds, 13)} s (${sig(result.amplitudeSeconds * 1e9, 10)} ns)`],
        ],
        outputWidth(args),
      ),
    );
    return EXIT_OK;
  },
};
