/**
 * `tauline rate`: mean relativistic rate of a clock on a Kepler orbit, its split into
 * gravitational and velocity parts, and the factory frequency offset that compensates it.
 */

import { offsetFrequency } from '@tauline/sdk/oscillator';
import { meanClockRate, REFERENCE_CLOCKS, type ReferenceClock } from '@tauline/sdk/relativity';
import { CONSTANTS_FLAG, constantsFlag } from '../flags.js';
import {
  type Command,
  choiceFlag,
  EXIT_OK,
  FLIGHT_CAUTION,
  formatFlag,
  formatFlags,
  keyValueTable,
  numberFlag,
  sig,
  TABLE_OR_JSON,
  toJson,
  withFlagNames,
} from '../framework.js';
import { outputWidth, wrapLines } from '../layout.js';
import { frequencyHint, warn } from '../plausibility.js';

function signed(value: number, digits = 10): string {
  const text = sig(value, digits);
  return value > 0 ? `+${text}` : text;
}

export const rateCommand: Command = {
  name: 'rate',
  summary: 'Mean relativistic rate of an orbiting clock and the factory offset that compensates it.',
  usage:
    '--semi-major-axis <m> [--constants <name>] [--reference tt|tcg] [--nominal-frequency <Hz>] [--json | --format table|json]',
  flags: {
    'semi-major-axis': {
      type: 'string',
      value: '<m>',
      description: 'Orbit semi-major axis a, in metres (e.g. 26561750 for GPS).',
    },
    constants: CONSTANTS_FLAG,
    reference: {
      type: 'string',
      value: 'tt|tcg',
      description: 'Reference time scale: tt (clocks on the geoid, default) or tcg.',
    },
    'nominal-frequency': {
      type: 'string',
      value: '<Hz>',
      description: 'Nominal oscillator frequency f0, in Hz; adds the frequency to set on the ground.',
    },
    ...formatFlags(TABLE_OR_JSON),
  },
  details: `
Rate = dτ/dt − 1 of the satellite clock against the reference; positive means it runs fast.
  vs TT:  rate = L_G − 3GM/(2ac²)  = [L_G − GM/(ac²)] (gravitational) + [−GM/(2ac²)] (velocity)
  vs TCG: rate = −3GM/(2ac²)       = [−GM/(ac²)] + [−GM/(2ac²)]
  factory offset = 1/(1 + rate) − 1;   f_ground = f0·(1 + factory offset)
Source: IERS Conventions (2010) §10.2 eqs. 10.7 and 10.9, averaged over a Kepler orbit (energy v²/2 − GM/r = −GM/(2a));
N. Ashby, Living Rev. Relativity 6 (2003) §5. Point-mass Earth: J2 adds ~1e-14, and individual satellites differ
from the conventional value by up to 1e-13 (IERS 2010 §10.2). GPS check: a = 26561750 m → +4.4647e-10, 38.575 µs/day.
JSON fields: semiMajorAxis (m), constants, reference, fractionalRate, gravitational, velocity, microsecondsPerDay,
factoryOffset, and with --nominal-frequency: nominalFrequencyHz, offsetFrequencyHz, offsetHz; units (unit of each
field); caution.
A kilometre semi-major axis is refused with a hint; a nominal frequency below 1 kHz (MHz given as Hz?) is used
as given, with a warning on stderr.
Exit status: 0 success, 2 invalid input.`,
  run(args, io) {
    const format = formatFlag(args, TABLE_OR_JSON, 'table');
    const semiMajorAxis = numberFlag(args, 'semi-major-axis', true);
    const constants = constantsFlag(args);
    const reference = choiceFlag<ReferenceClock>(args, 'reference', REFERENCE_CLOCKS, 'tt');
    const nominal = numberFlag(args, 'nominal-frequency');
    const rate = withFlagNames({ semiMajorAxis: '--semi-major-axis' }, () =>
      meanClockRate(semiMajorAxis, { constants, reference }),
    );
    const shifted =
      nominal === undefined
        ? undefined
        : withFlagNames({ nominalFrequency: '--nominal-frequency' }, () =>
            offsetFrequency(nominal, rate.factoryOffset),
          );
    const hint = nominal === undefined ? undefined : frequencyHint('--nominal-frequency', nominal);
    if (hint) warn(io, 'rate', hint);
    if (format === 'json') {
      io.out(
        toJson({
          semiMajorAxis: rate.semiMajorAxis,
          constants: rate.constants,
          reference: rate.reference,
          fractionalRate: rate.fractionalRate,
          gravitational: rate.gravitational,
          velocity: rate.velocity,
          microsecondsPerDay: rate.microsecondsPerDay,
          factoryOffset: rate.factoryOffset,
          ...(shifted && nominal !== undefined
            ? { nominalFrequencyHz: nominal, offsetFrequencyHz: shifted.offsetFrequencyHz, offsetHz: shifted.offsetHz }
            : {}),
          units: {
            semiMajorAxis: 'm',
            fractionalRate: 'dimensionless (dτ/dt − 1)',
            gravitational: 'dimensionless',
            velocity: 'dimensionless',
            microsecondsPerDay: 'µs per day',
            factoryOffset: 'dimensionless (Δf/f)',
            ...(shifted ? { nominalFrequencyHz: 'Hz', offsetFrequencyHz: 'Hz', offsetHz: 'Hz' } : {}),
          },
          caution: FLIGHT_CAUTION,
        }),
      );
      return EXIT_OK;
    }
    const ref = reference.toUpperCase();
    const rows: [string, string][] = [
      ['semi-major axis', `${rate.semiMajorAxis} m`],
      ['constants', `${constants.name} (${constants.description})`],
      ['reference', ref],
      [
        'fractional rate',
        `${signed(rate.fractionalRate)} (satellite clock runs ${rate.fractionalRate >= 0 ? 'fast' : 'slow'} vs ${ref})`,
      ],
      ['  gravitational', signed(rate.gravitational)],
      ['  velocity', signed(rate.velocity)],
      ['time gained per day', `${signed(rate.microsecondsPerDay)} µs/day`],
      [
        'factory offset',
        `${signed(rate.factoryOffset)} (set the oscillator ${rate.factoryOffset < 0 ? 'low' : 'high'} on the ground)`,
      ],
    ];
    if (shifted && nominal !== undefined) {
      rows.push(['nominal frequency', `${nominal} Hz`]);
      rows.push(['frequency to set', `${Number(shifted.offsetFrequencyHz.toPrecision(16))} Hz`]);
      rows.push(['offset', `${signed(shifted.offsetHz)} Hz`]);
    }
    const width = outputWidth(args);
    io.out(keyValueTable(rows, width));
    io.out(wrapLines(`\n${FLIGHT_CAUTION}\n`, width));
    return EXIT_OK;
  },
};
