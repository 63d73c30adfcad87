/**
 * Validation of a launch-review file (already JSON-parsed). Every error names the field
 * by its path, e.g. `spacecraft[2].orbit.semiMajorAxis`, with the value and the range.
 *
 * @module
 */

import { CONSTANT_SETS } from '../constants.js';
import { InvalidArgumentError } from '../errors.js';
import {
  rejectUnknownKeys,
  requireEccentricity,
  requireFinite,
  requireFrequency,
  requireInRange,
  requireInteger,
  requireOrbitRadius,
  requirePositive,
  requireRecord,
} from '../internal/validate.js';
import type { ConfiguredOffset, ReviewInput, ReviewLimits, ReviewSpacecraft } from './types.js';

/** Nominal-frequency sanity range: 1 kHz .. 100 GHz covers every clock and carrier in use. */
export function requireNominalFrequency(path: string, v: unknown): number {
  const f = requireFinite(path, v, 'a frequency in Hz between 1e3 and 1e11');
  if (f < 1e3 || f > 1e11) {
    const hint =
      f > 0 && f < 1e3 ? `${f} Hz is implausibly low; was it given in MHz (${f} MHz = ${f * 1e6} Hz)?` : undefined;
    throw new InvalidArgumentError(path, v, 'a frequency in Hz between 1e3 and 1e11', hint);
  }
  return f;
}

function parseLimits(path: string, o: Record<string, unknown>): ReviewLimits {
  const limits: { -readonly [K in keyof ReviewLimits]: ReviewLimits[K] } = {};
  if (o.tolerance !== undefined) {
    const t = requireRecord(`${path}tolerance`, o.tolerance);
    const frac = requirePositive(`${path}tolerance.fractional`, t.fractional);
    if (frac >= 1e-6) {
      throw new InvalidArgumentError(
        `${path}tolerance.fractional`,
        frac,
        'a fractional frequency below 1e-6 (e.g. 1e-12)',
        'a tolerance this large accepts any offset; is it in parts per million rather than a fraction?',
      );
    }
    limits.tolerance = { fractional: frac };
  }
  if (o.constants !== undefined) {
    const name = o.constants;
    if (typeof name !== 'string' || !Object.hasOwn(CONSTANT_SETS, name.toLowerCase())) {
      throw new InvalidArgumentError(`${path}constants`, name, `one of ${Object.keys(CONSTANT_SETS).join(', ')}`);
    }
    limits.constants = name.toLowerCase();
  }
  if (o.reference !== undefined) {
    const r = o.reference;
    if (r !== 'tt' && r !== 'tcg') throw new InvalidArgumentError(`${path}reference`, r, '"tt" or "tcg"');
    limits.reference = r;
  }
  if (o.actuator !== undefined) {
    const a = requireRecord(`${path}actuator`, o.actuator);
    limits.actuator = { rangeFractional: requirePositive(`${path}actuator.rangeFractional`, a.rangeFractional) };
  }
  if (o.phaseToleranceSeconds !== undefined) {
    limits.phaseToleranceSeconds = requirePositive(`${path}phaseToleranceSeconds`, o.phaseToleranceSeconds, 's');
  }
  return limits;
}

/** Validates a configured offset (exactly one form) against the nominal frequency; `path` names it in errors. */
export function parseConfigured(path: string, v: unknown, nominal: number): ConfiguredOffset {
  const o = requireRecord(path, v);
  const forms = ['offsetFrequencyHz', 'offsetHz', 'fractionalOffset', 'tuningWord'].filter((k) => o[k] !== undefined);
  const [form] = forms;
  if (forms.length !== 1 || form === undefined) {
    throw new InvalidArgumentError(
      path,
      v,
      'an object with exactly one of offsetFrequencyHz, offsetHz, fractionalOffset, tuningWord',
    );
  }
  rejectUnknownKeys(path, o, [form]);
  if (form === 'offsetFrequencyHz') {
    const f = requireFinite(`${path}.offsetFrequencyHz`, o[form], 'the configured output frequency in Hz');
    if (Math.abs(f - nominal) > 1e-3 * nominal) {
      throw new InvalidArgumentError(
        `${path}.offsetFrequencyHz`,
        f,
        `the configured output frequency in Hz, within 0.1 % of the nominal ${nominal} Hz`,
        Math.abs(f) < 1e-3 * nominal
          ? 'this looks like a difference from nominal: give it as "offsetHz" instead'
          : undefined,
      );
    }
    return { offsetFrequencyHz: f };
  }
  if (form === 'offsetHz') {
    const d = requireFinite(`${path}.offsetHz`, o[form], 'the configured frequency minus nominal, in Hz');
    if (Math.abs(d) > 1e-3 * nominal) {
      throw new InvalidArgumentError(
        `${path}.offsetHz`,
        d,
        `a difference from nominal smaller than 0.1 % of ${nominal} Hz`,
        Math.abs(d - nominal) < 1e-3 * nominal
          ? 'this looks like the output frequency itself: give it as "offsetFrequencyHz"'
          : undefined,
      );
    }
    return { offsetHz: d };
  }
  if (form === 'fractionalOffset') {
    return { fractionalOffset: requireInRange(`${path}.fractionalOffset`, o[form], -1e-3, 1e-3) };
  }
  const t = requireRecord(`${path}.tuningWord`, o[form]);
  rejectUnknownKeys(`${path}.tuningWord`, t, ['word', 'clockHz', 'bits']);
  const bits = requireInteger(`${path}.tuningWord.bits`, t.bits, 8, 64);
  const clockHz = requireFrequency(`${path}.tuningWord.clockHz`, t.clockHz);
  const word = t.word;
  let big: bigint;
  try {
    if (typeof word === 'number') {
      if (!Number.isSafeInteger(word)) throw new Error('unsafe');
      big = BigInt(word);
    } else if (typeof word === 'string' && /^(0x[0-9a-fA-F]+|\d+)$/.test(word.trim())) {
      big = BigInt(word.trim());
    } else throw new Error('format');
  } catch {
    throw new InvalidArgumentError(
      `${path}.tuningWord.word`,
      word,
      'a non-negative integer (a decimal or 0x-hex string for words beyond 2^53)',
    );
  }
  if (big < 0n || big >= 1n << BigInt(bits)) {
    throw new InvalidArgumentError(`${path}.tuningWord.word`, word, `an integer in [0, 2^${bits})`);
  }
  return { tuningWord: { word: big.toString(), clockHz, bits } };
}

function parseSemiMajorAxisKind(
  path: string,
  o: Record<string, unknown>,
): { semiMajorAxisKind?: 'mean' | 'osculating'; argumentOfLatitude?: number } {
  const kind = o.semiMajorAxisKind;
  if (kind === undefined) return {};
  if (kind !== 'mean' && kind !== 'osculating')
    throw new InvalidArgumentError(`${path}.semiMajorAxisKind`, kind, '"mean" or "osculating"');
  if (kind === 'mean') return { semiMajorAxisKind: kind };
  return {
    semiMajorAxisKind: kind,
    argumentOfLatitude: requireFinite(
      `${path}.argumentOfLatitude`,
      o.argumentOfLatitude,
      'the argument of latitude (radians) where the osculating semi-major axis was taken',
    ),
  };
}

/**
 * Validates an already-parsed review document and returns it typed. Unknown extra fields
 * are kept (they document the spacecraft); known fields are checked for type and range.
 * @throws {InvalidArgumentError} naming the first offending field by its path.
 */
export function parseReviewInput(document: unknown): ReviewInput {
  const root = requireRecord('review', document);
  const top = parseLimits('', root);
  const topNominal =
    root.nominalFrequencyHz === undefined
      ? undefined
      : requireNominalFrequency('nominalFrequencyHz', root.nominalFrequencyHz);
  if (root.title !== undefined && typeof root.title !== 'string')
    throw new InvalidArgumentError('title', root.title, 'a string');
  const list = root.spacecraft;
  if (!Array.isArray(list) || list.length === 0)
    throw new InvalidArgumentError('spacecraft', list, 'a non-empty array of spacecraft objects');
  const ids = new Set<string>();
  const spacecraft: ReviewSpacecraft[] = list.map((item, i) => {
    const p = `spacecraft[${i}]`;
    const o = requireRecord(p, item);
    const id = o.id;
    if (typeof id !== 'string' || id.trim() === '') throw new InvalidArgumentError(`${p}.id`, id, 'a non-empty string');
    if (ids.has(id)) throw new InvalidArgumentError(`${p}.id`, id, 'an id not used by another spacecraft in the file');
    ids.add(id);
    const nominal =
      o.nominalFrequencyHz === undefined
        ? (topNominal ?? requireNominalFrequency(`${p}.nominalFrequencyHz`, undefined))
        : requireNominalFrequency(`${p}.nominalFrequencyHz`, o.nominalFrequencyHz);
    const orbitObj = requireRecord(`${p}.orbit`, o.orbit);
    const orbit = {
      semiMajorAxis: requireOrbitRadius(`${p}.orbit.semiMajorAxis`, orbitObj.semiMajorAxis),
      eccentricity:
        orbitObj.eccentricity === undefined ? 0 : requireEccentricity(`${p}.orbit.eccentricity`, orbitObj.eccentricity),
      inclination:
        orbitObj.inclination === undefined
          ? 0
          : requireInRange(`${p}.orbit.inclination`, orbitObj.inclination, 0, Math.PI, {
              unit: 'rad (a value above π is probably degrees)',
            }),
      ...parseSemiMajorAxisKind(`${p}.orbit`, orbitObj),
    };
    let dispersion: { semiMajorAxisSigma: number } | undefined;
    if (o.dispersion !== undefined) {
      const d = requireRecord(`${p}.dispersion`, o.dispersion);
      const s = requireFinite(
        `${p}.dispersion.semiMajorAxisSigma`,
        d.semiMajorAxisSigma,
        'a 1σ semi-major-axis dispersion in metres, ≥ 0 and below 1e6',
      );
      if (s < 0 || s >= 1e6)
        throw new InvalidArgumentError(
          `${p}.dispersion.semiMajorAxisSigma`,
          s,
          'a 1σ semi-major-axis dispersion in metres, ≥ 0 and below 1e6',
        );
      dispersion = { semiMajorAxisSigma: s };
    }
    const limits = parseLimits(`${p}.`, o);
    return {
      ...o,
      id,
      nominalFrequencyHz: nominal,
      configured: parseConfigured(`${p}.configured`, o.configured, nominal),
      orbit,
      ...(dispersion ? { dispersion } : {}),
      ...limits,
    } as ReviewSpacecraft;
  });
  return {
    ...root,
    ...top,
    ...(topNominal !== undefined ? { nominalFrequencyHz: topNominal } : {}),
    spacecraft,
  } as ReviewInput;
}
