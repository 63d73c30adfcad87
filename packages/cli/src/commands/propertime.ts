/**
 * `tauline propertime`: integrates an orbit together with its clock's proper time and prints
 * τ − TT at regular samples.
 */

import type { ConstantSet } from '@tauline/sdk/constants';
import { InvalidArgumentError } from '@tauline/sdk/errors';
import { GRAVITY_MODELS, type GravityModel, orbitalPeriod } from '@tauline/sdk/orbit';
import { boundStateCheck, integrateProperTime } from '@tauline/sdk/relativity';
import { BUNDLED_LEAP_SECONDS, createTimeScales, type Instant, J2000_EPOCH } from '@tauline/sdk/time';
import { parseStampFlag } from '../epochs.js';
import { CONSTANTS_FLAG, constantsFlag } from '../flags.js';
import {
  type Command,
  choiceFlag,
  EXIT_OK,
  FLIGHT_CAUTION,
  formatFlag,
  formatFlags,
  numberFlag,
  optionalFlag,
  parseNumber,
  requireFlag,
  sig,
  TABLE_OR_JSON,
  toJson,
  withFlagNames,
} from '../framework.js';
import { fitTable, outputWidth, wrapLines } from '../layout.js';
import { speedHint, warn } from '../plausibility.js';
import { startProgress, withProgress } from '../progress.js';

/** Orbits integrated above which a terminal shows progress (about a second of integration, j2 model). */
export const PROPERTIME_PROGRESS_ORBITS = 100;

/** Parses `x,y,z,vx,vy,vz` (metres, m/s). */
export function parseStateFlag(text: string): {
  position: [number, number, number];
  velocity: [number, number, number];
} {
  const parts = text.split(',');
  if (!isSix(parts)) {
    throw new InvalidArgumentError(
      '--state',
      text,
      'six comma-separated numbers x,y,z,vx,vy,vz in m and m/s',
      parts.length === 3 ? 'only three values: the velocity is missing' : undefined,
    );
  }
  const [x, y, z, vx, vy, vz] = parts;
  const num = (name: string, value: string): number => parseNumber(`--state ${name}`, value);
  return { position: [num('x', x), num('y', y), num('z', z)], velocity: [num('vx', vx), num('vy', vy), num('vz', vz)] };
}

/** True when `parts` holds exactly the six values of a state. */
function isSix(parts: string[]): parts is [string, string, string, string, string, string] {
  return parts.length === 6;
}

/**
 * The (t, τ − TT) pairs of a proper-time result, walking its two arrays together (one entry per sample each).
 * @throws {RangeError} when the arrays differ in length or are empty (an internal error, never an input problem).
 */
function samplesOf(result: { t: Float64Array; tauMinusTT: Float64Array }): { t: number; tauMinusTT: number }[] {
  if (result.t.length !== result.tauMinusTT.length || result.t.length === 0) {
    throw new RangeError(`proper-time result with ${result.t.length} times and ${result.tauMinusTT.length} values`);
  }
  const taus = result.tauMinusTT.values();
  return Array.from(result.t, (t) => {
    const tau = taus.next();
    if (tau.done) throw new RangeError('proper-time result with fewer values than times');
    return { t, tauMinusTT: tau.value };
  });
}

/** SDK argument names → the flags that gave them, for the bound check and the integration. */
const PROPERTIME_FLAG_NAMES: Readonly<Record<string, string>> = {
  '|state.position|': '--state (|position|)',
  'state.position[0]': '--state x',
  'state.position[1]': '--state y',
  'state.position[2]': '--state z',
  'state.velocity[0]': '--state vx',
  'state.velocity[1]': '--state vy',
  'state.velocity[2]': '--state vz',
  duration: '--duration',
  step: '--step',
  relativeTolerance: '--tolerance',
};

/**
 * `--epoch`: read on TT (UTC with a zone designator, or a time-system code after it, as the shared stamp parser
 * reads it); J2000.0 (2000-01-01T12:00:00 TT) when absent.
 */
export function epochFlag(text: string | undefined): Instant {
  return text === undefined ? J2000_EPOCH : parseStampFlag('--epoch', text, 'TT').instant;
}

/** ISO 8601 reading of `instant` on TT, to the nanosecond only where it has a fraction. */
function ttText(instant: Instant): string {
  return createTimeScales(BUNDLED_LEAP_SECONDS)
    .formatIso(instant, { scale: 'TT', fractionDigits: 9 })
    .replace(/\.?0+$/, '');
}

/**
 * Refuses an unbound state with a message naming the flags; the judgement (which body, which escape speed) is
 * the SDK's `boundStateCheck` (Earth energy, or for `full` the Moon inside its Hill sphere).
 */
export function requireBoundState(
  state: { position: readonly number[]; velocity: readonly number[] },
  constants: ConstantSet,
  model: GravityModel = 'j2',
  epoch: Instant = J2000_EPOCH,
): void {
  const [x = Number.NaN, y = Number.NaN, z = Number.NaN] = state.position;
  const [vx = Number.NaN, vy = Number.NaN, vz = Number.NaN] = state.velocity;
  if (!(Math.hypot(x, y, z) > 0) || !Number.isFinite(Math.hypot(vx, vy, vz))) return; // the SDK names the position or velocity error
  const full = model === 'full';
  const check = boundStateCheck(
    { position: [x, y, z], velocity: [vx, vy, vz] },
    { model: full ? 'full' : 'j2', constants, ...(full ? { epoch } : {}) },
  );
  if (check.bound) return;
  if (check.body === 'moon') {
    throw new InvalidArgumentError(
      '--state (|velocity relative to the Moon|)',
      check.speed,
      `below the lunar escape speed √(2GM_M/ρ) = ${check.escapeSpeed.toFixed(1)} m/s at ρ = ${check.distance.toFixed(0)} m from the Moon's centre (a Moon-bound orbit inside its Hill sphere, ${(check.hillRadius ?? 0).toFixed(0)} m)`,
      "the state is inside the Moon's Hill sphere but not bound to the Moon; check the velocity (m/s, geocentric) and --epoch",
    );
  }
  throw new InvalidArgumentError(
    '--state (|velocity|)',
    check.speed,
    `below the escape speed √(2GM/r) = ${check.escapeSpeed.toFixed(1)} m/s at r = ${check.distance} m (a bound orbit)`,
    check.speed > 1e5
      ? 'a speed this large looks like mm/s or cm/s; give m/s'
      : `the state is parabolic or hyperbolic; check the velocity unit (m/s) and value${model === 'full' ? '' : ' (for a lunar orbiter use --model full)'}`,
  );
}

export const propertimeCommand: Command = {
  name: 'propertime',
  summary: "Integrate an orbit and its clock's proper time τ − TT (point mass, J2, or J2 + Sun/Moon).",
  usage:
    '--state x,y,z,vx,vy,vz --duration <s> --step <s> [--model point-mass|j2|full] [--epoch <ISO 8601>] [--constants <name>] [--tolerance <rtol>] [--json | --format table|json]',
  flags: {
    state: {
      type: 'string',
      value: 'x,y,z,vx,vy,vz',
      description:
        'Initial geocentric inertial state at t = 0, metres and m/s (z along the rotation axis). Use --state=-1.2e7,... when it starts with a minus sign.',
    },
    duration: { type: 'string', value: '<s>', description: 'Span to integrate, in seconds (> 0).' },
    step: { type: 'string', value: '<s>', description: 'Output sample spacing, in seconds (0 < step ≤ duration).' },
    model: {
      type: 'string',
      value: '<name>',
      description: 'Force and clock-potential model: point-mass, j2 (default), full (J2 + lunar and solar tides).',
    },
    epoch: {
      type: 'string',
      value: '<ISO 8601>',
      description:
        'Instant of t = 0, where --model full places the Sun and Moon: read on TT, on UTC with a zone designator (Z), or on a time-system code written after it ("… GPS"). Default 2000-01-01T12:00:00 (J2000.0).',
    },
    constants: CONSTANTS_FLAG,
    tolerance: {
      type: 'string',
      value: '<rtol>',
      description: 'Integrator relative tolerance, in [1e-15, 1e-6] (default 1e-12).',
    },
    ...formatFlags(TABLE_OR_JSON),
  },
  details: `
Integrates r̈ = ∇U and d(τ − TT)/dTT = L_G − (U + v²/2)/c² (IERS Conventions 2010 §10.2 eq. 10.9 form) with an
adaptive Dormand–Prince 8(5,3) integrator and its 7th-order dense output (Hairer, Nørsett & Wanner, Solving ODE I,
1993). Models: point-mass U = GM/r; j2 adds −(GM J2 a_e²/(2r³))(3z²/r² − 1); full adds the lunar and solar tidal
potential with Sun/Moon from the low-precision series of Montenbruck & Gill, Satellite Orbits (2000) §3.3.2.
Accuracy: integration error < 1 ps/day at the default tolerance (LEO to GEO, e up to 0.16); model limits: see
packages/sdk/docs/relativity-models.md. τ − TT = 0 at t = 0; the samples are t = 0, step, 2·step, … and the duration.
JSON fields: samples [{ t (s), tauMinusTT (s) }], model, constants, epoch { iso, scale: TT }, ephemeris,
relativeTolerance, acceptedSteps, rejectedSteps, meanRate (τ − TT at the end divided by the duration), caution
(the mean rate is what a factory offset is computed from), units.
An unbound state (v ≥ √(2GM/r), e.g. a velocity in the wrong unit) is refused; a speed under 1 % of the
circular speed (km/s given as m/s?) is used as given, with a warning on stderr. With --model full, a state inside
the Moon's Hill sphere (≈ 61 500 km from its centre) is judged against the Moon instead (lunar orbiters: give the
geocentric state at --epoch, mean equator and equinox of date); the run stops if the orbit hits the Moon.
Exit status: 0 success, 2 invalid input.`,
  retiredFlags: {
    'epoch-tt-j2000':
      'give the instant of t = 0 as --epoch <ISO 8601> on TT (J2000.0 + 725803200 s is --epoch 2023-01-01T00:00:00)',
  },
  run(args, io) {
    const format = formatFlag(args, TABLE_OR_JSON, 'table');
    const state = parseStateFlag(requireFlag(args, 'state'));
    const duration = numberFlag(args, 'duration', true);
    const step = numberFlag(args, 'step', true);
    const model = choiceFlag<GravityModel>(args, 'model', GRAVITY_MODELS, 'j2');
    const epoch = epochFlag(optionalFlag(args, 'epoch'));
    const tolerance = numberFlag(args, 'tolerance');
    const constants = constantsFlag(args);
    withFlagNames(PROPERTIME_FLAG_NAMES, () => requireBoundState(state, constants, model, epoch));
    // Orbits in the span: the two-body period at the initial radius (a circular orbit). The bound check above has
    // refused any radius orbitalPeriod would; r0 = 0 is left for integrateProperTime to name (--state).
    const r0 = Math.hypot(...state.position);
    const orbits = r0 > 0 ? duration / orbitalPeriod(r0, constants.gm) : 0;
    const bar = startProgress(io, 'integrating', orbits > PROPERTIME_PROGRESS_ORBITS);
    const result = withProgress(bar, () =>
      withFlagNames(PROPERTIME_FLAG_NAMES, () =>
        integrateProperTime(state, duration, step, {
          model,
          constants,
          epoch: epoch,
          ...(tolerance === undefined ? {} : { relativeTolerance: tolerance }),
          onProgress: bar.update,
        }),
      ),
    );
    // Warned only once the state is accepted: a refused state gets its one error line alone.
    const hint = speedHint(
      '--state (|velocity|)',
      Math.hypot(...state.velocity),
      Math.hypot(...state.position),
      constants.gm,
    );
    if (hint) warn(io, 'propertime', hint);
    const samples = samplesOf(result);
    const [lastSample] = samples.slice(-1);
    if (lastSample === undefined) throw new RangeError('proper-time result without samples');
    const meanRate = lastSample.tauMinusTT / duration;
    if (format === 'json') {
      io.out(
        toJson({
          samples,
          model: result.model,
          constants: result.constants,
          epoch: { iso: ttText(epoch), scale: 'TT' },
          ephemeris: result.ephemeris,
          relativeTolerance: result.relativeTolerance,
          acceptedSteps: result.acceptedSteps,
          rejectedSteps: result.rejectedSteps,
          meanRate,
          // The mean rate is the value a factory offset is computed from: it carries the flight caution.
          caution: FLIGHT_CAUTION,
          units: {
            t: 's (since the start)',
            tauMinusTT: 's',
            epoch: 'ISO 8601 reading on TT of the instant of t = 0',
            relativeTolerance: 'dimensionless',
            meanRate: 'dimensionless',
          },
        }),
      );
      return EXIT_OK;
    }
    const width = outputWidth(args);
    io.out(
      wrapLines(
        `Proper time τ − TT, model ${result.model}, constants ${result.constants}` +
          (result.model === 'full' ? `, epoch ${ttText(epoch)} TT (${result.ephemeris})` : '') +
          '\n\n',
        width,
      ),
    );
    io.out(
      fitTable(
        ['t (s)', 'τ − TT (s)', 'τ − TT (ns)'],
        samples.map(({ t, tauMinusTT }): (string | number)[] => [
          sig(t, 12),
          tauMinusTT.toExponential(12),
          (tauMinusTT * 1e9).toFixed(6),
        ]),
        { width },
      ),
    );
    io.out(
      wrapLines(
        `\nmean rate over the span: ${meanRate.toExponential(9)} (${sig(meanRate * 86400e6, 8)} µs/day); ` +
          `${result.acceptedSteps} steps (${result.rejectedSteps} rejected), rtol ${result.relativeTolerance}\n\n${FLIGHT_CAUTION}\n`,
        width,
      ),
    );
    return EXIT_OK;
  },
};
