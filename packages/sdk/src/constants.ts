/**
 * Physical constants and named constant sets. Each value carries its unit in the type
 * and its source in the doc comment. Provenance tags follow the project's reference
 * sheet: [V1] read in the primary text, [V2] secondary source, [M] from memory,
 * [C] computed from the others.
 *
 * @module
 */

import { InvalidArgumentError } from './errors.js';
import {
  CONSTANT_SET_RANGES,
  requireConstantSet,
  requireInRange,
  requireOptions,
  requirePositive,
} from './internal/validate.js';
import type {
  CubicMetresPerSecondSquared,
  Dimensionless,
  Metres,
  MetresPerSecond,
  RadiansPerSecond,
  Seconds,
  SquareMetresPerSecondSquared,
} from './units.js';

/** Speed of light in vacuum, exact by the SI definition of the metre (BIPM; IERS Conventions 2010 Table 1.1) [V1]. */
export const SPEED_OF_LIGHT: MetresPerSecond = 299_792_458;

/** c², in m²/s² [C]. */
export const SPEED_OF_LIGHT_SQUARED = SPEED_OF_LIGHT * SPEED_OF_LIGHT;

/** L_G = 1 − dTT/dTCG, defining constant (IAU 2000 Resolution B1.9; IERS Conventions 2010 §10.1) [V1]. */
export const L_G: Dimensionless = 6.969290134e-10;

/** L_B = 1 − dTDB/dTCB, defining constant (IAU 2006 Resolution B3; IERS Conventions 2010 §10.1) [V1]. */
export const L_B: Dimensionless = 1.550519768e-8;

/** TT − TAI, in seconds, exact by definition (IERS Conventions 2010 §10.1) [V1]. */
export const TT_MINUS_TAI: Seconds = 32.184;

/** Seconds in one day of 86 400 SI seconds (the day of the Julian calendar and of MJD/JD counts; definition, common practice). */
export const SECONDS_PER_DAY: Seconds = 86_400;

/** Geoid potential W₀, in m²/s² (IERS Conventions 2010 Table 1.1 [V2]; GB/T 39787-2021 Table 2 [V1]). */
export const GEOID_POTENTIAL_W0: SquareMetresPerSecondSquared = 62_636_856.0;

/** Which kind of system the set belongs to; informational. */
export type ConstantSetKind = 'conventions' | 'interface-spec' | 'user';

/**
 * A coherent set of the constants that the clock formulas use. Pass the same set to every
 * call of one computation: mixing the GM of one interface specification with the F of
 * another changes results in the 8th digit.
 */
export interface ConstantSet {
  /** Short identifier used by the CLI and in files, e.g. `iers-2010`. */
  readonly name: string;
  /** One-line human description. */
  readonly description: string;
  readonly kind: ConstantSetKind;
  /** Geocentric gravitational constant GM, in m³/s². */
  readonly gm: CubicMetresPerSecondSquared;
  /** Earth rotation rate used with this set, in rad/s. */
  readonly earthRotationRate: RadiansPerSecond;
  /** Equatorial radius of the reference ellipsoid / gravity model, in metres. */
  readonly equatorialRadius: Metres;
  /** Second zonal harmonic J2 (unnormalised), dimensionless. */
  readonly j2: Dimensionless;
  /** Flattening of the reference ellipsoid, dimensionless. */
  readonly flattening: Dimensionless;
  /** L_G = W₀/c² used to refer rates to TT (the geoid), dimensionless. */
  readonly lG: Dimensionless;
  /**
   * Relativistic constant F = −2√GM/c², in s/√m. Interface specifications print it; it
   * is derived here from `gm` so that it can never disagree with it.
   */
  readonly relativisticF: number;
  /** Value of π that the set's orbit algorithm fixes (IS-GPS-200 fixes 3.1415926535898 [M]). */
  readonly pi: number;
  /** Source of each value, keyed by field name, with provenance tag. */
  readonly sources: Readonly<Record<string, string>>;
}

/**
 * Options of every function that uses a constant set: the set is passed by name in the trailing options object,
 * `{ constants: GPS_ICD }`, never positionally (DEVELOPERS.md, "one options convention"); IERS 2010 when omitted.
 */
export interface ConstantsOptions {
  /** Constant set (GM, F, J2, a_e, L_G, …); default {@link IERS_2010}. */
  readonly constants?: ConstantSet;
}

/** F = −2√GM / c², in s/√m (IS-GPS-200 §20.3.3.3.3.1 [M]; IERS Conventions 2010 eq. 10.10 [V1]). */
export function relativisticConstantF(gm: CubicMetresPerSecondSquared): number {
  requirePositive('gm', gm, 'm³/s²');
  return (-2 * Math.sqrt(gm)) / SPEED_OF_LIGHT_SQUARED;
}

function freeze(set: Omit<ConstantSet, 'relativisticF'>): ConstantSet {
  return Object.freeze({
    ...set,
    relativisticF: relativisticConstantF(set.gm),
    sources: Object.freeze({ ...set.sources }),
  });
}

/** IERS Conventions (2010), IERS Technical Note 36: the TCG-compatible geodetic constants. */
export const IERS_2010: ConstantSet = freeze({
  name: 'iers-2010',
  description: 'IERS Conventions (2010), TN 36, Table 1.1 (TT-compatible GM and geoid)',
  kind: 'conventions',
  gm: 3.986004418e14,
  earthRotationRate: 7.292115e-5,
  equatorialRadius: 6_378_136.6,
  j2: 1.0826359e-3,
  flattening: 1 / 298.25642,
  lG: L_G,
  pi: Math.PI,
  sources: {
    gm: 'IERS Conventions 2010 Table 1.1 [V2]; GB/T 39787-2021 §4.2.2 [V1]',
    earthRotationRate: 'IERS Conventions 2010 Table 1.1 nominal ω [M]; same value GB/T 39787-2021 §4.2.2 [V1]',
    equatorialRadius: 'IERS Conventions 2010 Table 1.1 [V2]',
    j2: 'IERS Conventions 2010 Table 1.1 [V2]',
    flattening: 'IERS Conventions 2010 Table 1.1, 1/f = 298.25642 [M]',
    lG: 'IERS Conventions 2010 §10.1 (IAU 2000 Res. B1.9) [V1]',
  },
});

/** The GPS interface-specification set (IS-GPS-200: original WGS 84 / GRS 80 GM). */
export const GPS_ICD: ConstantSet = freeze({
  name: 'gps-icd',
  description: 'GPS interface specification (IS-GPS-200 Table 20-IV; WGS 84 G873 Earth rotation)',
  kind: 'interface-spec',
  gm: 3.986005e14,
  earthRotationRate: 7.2921151467e-5,
  equatorialRadius: 6_378_137.0,
  j2: 1.0826359e-3,
  flattening: 1 / 298.257223563,
  lG: L_G,
  pi: 3.1415926535898,
  sources: {
    gm: 'IS-GPS-200 Table 20-IV [M]; GRS 80 defining GM [V2]; reproduces F = −4.442807633e-10 [C]',
    earthRotationRate: 'Ashby 2003 Living Reviews §2 (WGS-84 G873) [V1]; IS-GPS-200 Table 20-IV [M]',
    equatorialRadius: 'WGS 84 / GRS 80 semi-major axis [V2]',
    j2: 'IERS Conventions 2010 Table 1.1 [V2] (the interface spec gives no J2 for the clock term)',
    flattening: 'WGS 84 defining 1/f = 298.257223563 [M]',
    lG: 'IERS Conventions 2010 §10.1 [V1]',
    pi: 'IS-GPS-200 fixed value of π for orbit computations [M]',
  },
});

/** The Galileo interface-specification set (OS SIS ICD: GM 3.986004418e14). */
export const GALILEO_ICD: ConstantSet = freeze({
  name: 'galileo-icd',
  description: 'Galileo OS SIS ICD (GM = 3.986004418e14, Ω = 7.2921151467e-5)',
  kind: 'interface-spec',
  gm: 3.986004418e14,
  earthRotationRate: 7.2921151467e-5,
  equatorialRadius: 6_378_137.0,
  j2: 1.0826359e-3,
  flattening: 1 / 298.257222101,
  lG: L_G,
  pi: 3.1415926535898,
  sources: {
    gm: 'Galileo OS SIS ICD [M]; same value as IERS 2010 [V2]; F = −4.442807309e-10 [C]',
    earthRotationRate: 'Galileo OS SIS ICD [M]',
    equatorialRadius: 'GTRF / GRS 80 semi-major axis [M]',
    j2: 'IERS Conventions 2010 Table 1.1 [V2]',
    flattening: 'GRS 80 1/f = 298.257222101 [M]',
    lG: 'IERS Conventions 2010 §10.1 [V1]',
    pi: 'Galileo OS SIS ICD fixed π [M]',
  },
});

/** The BeiDou interface-specification set (BDS-SIS-ICD; BDCS / CGCS2000 constants). */
export const BEIDOU_ICD: ConstantSet = freeze({
  name: 'beidou-icd',
  description: 'BeiDou BDS-SIS-ICD (CGCS2000: GM = 3.986004418e14, Ω = 7.292115e-5)',
  kind: 'interface-spec',
  gm: 3.986004418e14,
  earthRotationRate: 7.292115e-5,
  equatorialRadius: 6_378_137.0,
  j2: 1.0826359e-3,
  flattening: 1 / 298.257222101,
  lG: L_G,
  pi: 3.1415926535898,
  sources: {
    gm: 'GB/T 39787-2021 §4.2.2 [V1]; BDS-SIS-ICD [M]',
    earthRotationRate: 'GB/T 39787-2021 §4.2.2 "ω = 7 292 115.0×10⁻¹¹ rad/s" [V1]',
    equatorialRadius: 'GB/T 39787-2021 [V1]',
    j2: 'IERS Conventions 2010 Table 1.1 [V2]',
    flattening: 'CGCS2000 1/f = 298.257222101 [M]',
    lG: 'IERS Conventions 2010 §10.1 [V1]',
    pi: 'BDS-SIS-ICD fixed π [M]',
  },
});

/** Every built-in set, keyed by `name`. */
export const CONSTANT_SETS: Readonly<Record<string, ConstantSet>> = Object.freeze({
  [IERS_2010.name]: IERS_2010,
  [GPS_ICD.name]: GPS_ICD,
  [GALILEO_ICD.name]: GALILEO_ICD,
  [BEIDOU_ICD.name]: BEIDOU_ICD,
});

/** The set used when none is named: IERS Conventions (2010). */
export const DEFAULT_CONSTANT_SET = IERS_2010;

/**
 * Looks up a built-in set by name (case-insensitive).
 * @throws {InvalidArgumentError} naming the known sets when `name` is unknown.
 */
export function constantSet(name: string): ConstantSet {
  const found =
    typeof name === 'string' && Object.hasOwn(CONSTANT_SETS, name.toLowerCase())
      ? CONSTANT_SETS[name.toLowerCase()]
      : undefined;
  if (!found) throw new InvalidArgumentError('constants', name, `one of ${Object.keys(CONSTANT_SETS).join(', ')}`);
  return found;
}

/** Fields of a user-defined set; omitted fields are taken from `base` (default IERS 2010). */
export interface ConstantSetOverrides {
  name: string;
  description?: string;
  gm?: CubicMetresPerSecondSquared;
  earthRotationRate?: RadiansPerSecond;
  equatorialRadius?: Metres;
  j2?: Dimensionless;
  flattening?: Dimensionless;
  lG?: Dimensionless;
  pi?: number;
  /** Source of each overridden value; a missing entry is recorded as "user-supplied, no source". */
  sources?: Record<string, string>;
}

/** Options of {@link defineConstantSet}. */
export interface DefineConstantSetOptions {
  /** The set that omitted fields are taken from; default {@link IERS_2010}. */
  readonly base?: ConstantSet;
}

/**
 * The base set of {@link defineConstantSet}'s options: `options.base` checked, or IERS 2010. A set passed where the
 * options go (the old positional `defineConstantSet(overrides, base)`) is refused with a hint, never ignored.
 */
function baseOf(options: DefineConstantSetOptions | undefined): ConstantSet {
  if (typeof options === 'object' && options !== null && 'gm' in options && 'relativisticF' in options) {
    throw new InvalidArgumentError(
      'options',
      options,
      'an object of named options such as { base } (or omitted)',
      'a base set goes in the options: { base: set }',
    );
  }
  const { base } = requireOptions('options', options);
  return base === undefined ? IERS_2010 : requireConstantSet('options.base', base);
}

/**
 * Builds a user-defined constant set, validated field by field. F is recomputed from GM.
 * @param overrides The set's name and the fields that differ from the base set.
 * @param options `base`: the set that omitted fields are taken from (default IERS 2010).
 * @throws {InvalidArgumentError} for a value outside the plausible range of its field, or a base set passed
 *   positionally (write `{ base: set }`).
 */
export function defineConstantSet(overrides: ConstantSetOverrides, options?: DefineConstantSetOptions): ConstantSet {
  if (typeof overrides !== 'object' || overrides === null) {
    throw new InvalidArgumentError('overrides', overrides, 'an object { name, gm?, earthRotationRate?, ... }');
  }
  if (typeof overrides.name !== 'string' || overrides.name.trim() === '') {
    throw new InvalidArgumentError('name', overrides?.name, 'a non-empty string');
  }
  const base = baseOf(options);
  const gm = overrides.gm ?? base.gm;
  for (const [field, range] of Object.entries(CONSTANT_SET_RANGES)) {
    requireInRange(
      field,
      overrides[field as keyof typeof CONSTANT_SET_RANGES] ?? base[field as keyof typeof CONSTANT_SET_RANGES],
      range.min,
      range.max,
      { unit: range.unit },
    );
  }
  if (overrides.description !== undefined && typeof overrides.description !== 'string') {
    throw new InvalidArgumentError('description', overrides.description, 'a string');
  }
  if (overrides.sources !== undefined && (typeof overrides.sources !== 'object' || overrides.sources === null)) {
    throw new InvalidArgumentError('sources', overrides.sources, 'an object of source texts keyed by field name');
  }
  for (const [key, text] of Object.entries(overrides.sources ?? {})) {
    if (typeof text !== 'string')
      throw new InvalidArgumentError(`sources.${key}`, text, 'a string naming the source of the value');
  }
  const sources: Record<string, string> = { ...base.sources };
  for (const key of ['gm', 'earthRotationRate', 'equatorialRadius', 'j2', 'flattening', 'lG', 'pi'] as const) {
    if (overrides[key] !== undefined) sources[key] = overrides.sources?.[key] ?? 'user-supplied, no source';
  }
  return freeze({
    name: overrides.name,
    description: overrides.description ?? `user-defined set based on ${base.name}`,
    kind: 'user',
    gm,
    earthRotationRate: overrides.earthRotationRate ?? base.earthRotationRate,
    equatorialRadius: overrides.equatorialRadius ?? base.equatorialRadius,
    j2: overrides.j2 ?? base.j2,
    flattening: overrides.flattening ?? base.flattening,
    lG: overrides.lG ?? base.lG,
    pi: overrides.pi ?? base.pi,
    sources,
  });
}
