/**
 * `tauline propertime`: integrates an orbit together with its clock's proper time and prints
 * τ − TT at regular samples.
 */
import { InvalidArgumentError } from '@tauline/sdk/errors';
import { GRAVITY_MODELS, type GravityModel } from '@tauline/sdk/orbit';
import { integrateProperTime } from '@tauline/sdk/relativity';
import { EXIT_OK, numberFlag, parseNumber, requireFlag, sig, table, toJson, optionalFlag, type Command } from '../framework.js';
import { constantsFlag, withFlagNames } from './rate.js';

/** Parses `x,y,z,vx,vy,vz` (metres, m/s). */
export function parseStateFlag(text: string): { position: [number, number, number]; velocity: [number, number, number] } {
  const parts = text.split(',');
  if (parts.length !== 6) {
    throw new InvalidArgumentError('--state', text, 'six comma-separated numbers x,y,z,vx,vy,vz in m and m/s',
      parts.length === 3 ? 'only three values: the velocity is missing' : undefined);
  }
  const names = ['x', 'y', 'z', 'vx', 'vy', 'vz'];
  const v = parts.map((p, i) => parseNumber(`--state ${names[i]}`, p));
  return { position: [v[0]!, v[1]!, v[2]!], velocity: [v[3]!, v[4]!, v[5]!] };
}

function modelFlag(text: string | undefined): GravityModel {
  const m = (text ?? 'j2').toLowerCase();
  if ((GRAVITY_MODELS as readonly string[]).includes(m)) return m as GravityModel;
  throw new InvalidArgumentError('--model', text, `one of ${GRAVITY_MODELS.join(', ')}`);
}

export const propertimeCommand: Command = {
  name: 'propertime',
  summary: 'Integrate an orbit and its clock\'s proper time τ − TT (point mass, J2, or J2 + Sun/Moon).',
  usage: '--state x,y,z,vx,vy,vz --duration <s> --step <s> [--model point-mass|j2|full] [--epoch-tt-j2000 <s>] [--constants <name>] [--tolerance <rtol>] [--json]',
  flags: {
    state: { type: 'string', value: 'x,y,z,vx,vy,vz', description: 'Initial geocentric inertial state at t = 0, metres and m/s (z along the rotation axis). Use --state=-1.2e7,... when it starts with a minus sign.' },
    duration: { type: 'string', value: '<s>', description: 'Span to integrate, in seconds (> 0).' },
    step: { type: 'string', value: '<s>', description: 'Output sample spacing, in seconds (0 < step ≤ duration).' },
    model: { type: 'string', value: '<name>', description: 'Force and clock-potential model: point-mass, j2 (default), full (J2 + lunar and solar tides).' },
    'epoch-tt-j2000': { type: 'string', value: '<s>', description: 'For --model full: TT epoch of t = 0 in seconds since J2000.0 (default 0).' },
    constants: { type: 'string', value: '<name>', description: 'Constant set: iers-2010 (default), gps-icd, galileo-icd, beidou-icd.' },
    tolerance: { type: 'string', value: '<rtol>', description: 'Integrator relative tolerance, in [1e-15, 1e-6] (default 1e-12).' },
    json: { type: 'boolean', description: 'Print one JSON object instead of a table.' },
  },
  details: `
Integrates r̈ = ∇U and d(τ − TT)/dTT = L_G − (U + v²/2)/c² (IERS Conventions 2010 §10.2 eq. 10.9 form) with an
adaptive Dormand–Prince 8(5,3) integrator and its 7th-order dense output (Hairer, Nørsett & Wanner, Solving ODE I,
1993). Models: point-mass U = GM/r; j2 adds −(GM J2 a_e²/(2r³))(3z²/r² − 1); full adds the lunar and solar tidal
potential with Sun/Moon from the low-precision series of Montenbruck & Gill, Satellite Orbits (2000) §3.3.2.
Accuracy: integration error < 1 ps/day at the default tolerance (LEO to GEO, e up to 0.16); model limits: see
packages/sdk/packages/sdk/docs/relativity-models.md. τ − TT = 0 at t = 0; the samples are t = 0, step, 2·step, … and the duration.
JSON fields: samples [{ t (s), tauMinusTT (s) }], model, constants, epochTtSecondsSinceJ2000, ephemeris,
relativeTolerance, acceptedSteps, rejectedSteps, meanRate (τ − TT at the end divided by the duration).
Exit status: 0 success, 2 invalid input.`,
  run(args, io) {
    const state = parseStateFlag(requireFlag(args, 'state'));
    const duration = numberFlag(args, 'duration', true);
    const step = numberFlag(args, 'step', true);
    const model = modelFlag(optionalFlag(args, 'model'));
    const epoch = numberFlag(args, 'epoch-tt-j2000') ?? 0;
    const tolerance = numberFlag(args, 'tolerance');
    const constants = constantsFlag(args);
    const result = withFlagNames({
      '|state.position|': '--state (|position|)', 'state.position[0]': '--state x', 'state.position[1]': '--state y',
      'state.position[2]': '--state z', 'state.velocity[0]': '--state vx', 'state.velocity[1]': '--state vy',
      'state.velocity[2]': '--state vz', duration: '--duration', step: '--step', relativeTolerance: '--tolerance',
      epochTtSecondsSinceJ2000: '--epoch-tt-j2000',
    }, () => integrateProperTime(state, duration, step, {
      model, constants, epochTtSecondsSinceJ2000: epoch, ...(tolerance === undefined ? {} : { relativeTolerance: tolerance }),
    }));
    const n = result.t.length;
    const meanRate = result.tauMinusTT[n - 1]! / duration;
    if (args.values['json']) {
      const samples = Array.from(result.t, (t: number, k: number) => ({ t, tauMinusTT: result.tauMinusTT[k]! }));
      io.out(toJson({
        samples,
        model: result.model,
        constants: result.constants,
        epochTtSecondsSinceJ2000: result.epochTtSecondsSinceJ2000,
        ephemeris: result.ephemeris,
        relativeTolerance: result.relativeTolerance,
        acceptedSteps: result.acceptedSteps,
        rejectedSteps: result.rejectedSteps,
        meanRate,
      }));
      return EXIT_OK;
    }
    io.out(`Proper time τ − TT, model ${result.model}, constants ${result.constants}` +
      (result.model === 'full' ? `, epoch TT J2000 + ${result.epochTtSecondsSinceJ2000} s (${result.ephemeris})` : '') + '\n\n');
    io.out(table(['t (s)', 'τ − TT (s)', 'τ − TT (ns)'],
      Array.from(result.t, (t: number, k: number): (string | number)[] => [sig(t, 12), result.tauMinusTT[k]!.toExponential(12), (result.tauMinusTT[k]! * 1e9).toFixed(6)])));
    io.out(`\nmean rate over the span: ${meanRate.toExponential(9)} (${sig(meanRate * 86400e6, 8)} µs/day); ` +
      `${result.acceptedSteps} steps (${result.rejectedSteps} rejected), rtol ${result.relativeTolerance}\n`);
    return EXIT_OK;
  },
};
