/**
 * Hostile-input arbitraries for the public-API property test: arbitrary JSON, the special
 * numbers (NaN, ±Infinity, 1e300, −0, 2^53, ...), numeric arrays and typed arrays, functions,
 * objects keyed by the SDK's own field names, and valid example objects with one nested value
 * replaced or removed ("plausible but wrong"). Sizes are bounded so that no valid-looking input
 * asks for heavy work: arrays hold at most 48 items and ordinary integers stay within ±1000;
 * the only large numbers are the absurd ones (≥ 1e15), which every function must refuse or
 * handle in bounded time.
 */

import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { BUNDLED_LEAP_SECONDS, GPS_ICD, IERS_2010, Instant } from '../../src/index.js';

const SDK_SRC = fileURLToPath(new URL('../../src/', import.meta.url));
const EXAMPLES = fileURLToPath(new URL('../../examples/', import.meta.url));

/** Every property name declared in the SDK's interfaces (`name:` / `readonly name?:`), read from the sources. */
function sdkFieldNames(): string[] {
  const names = new Set<string>();
  const walk = (dir: string): void => {
    for (const entry of readdirSync(dir)) {
      const path = join(dir, entry);
      if (statSync(path).isDirectory()) walk(path);
      else if (path.endsWith('.ts')) {
        for (const m of readFileSync(path, 'utf8').matchAll(/^\s+(?:readonly\s+)?([a-zA-Z_]\w*)\??:\s/gm))
          names.add(m[1]!);
      }
    }
  };
  walk(SDK_SRC);
  return [...names].sort();
}

export const FIELD_NAMES: readonly string[] = sdkFieldNames();

/** Numbers no function may turn into NaN/Infinity without a typed error. */
const SPECIAL_NUMBERS = [
  NaN,
  Infinity,
  -Infinity,
  1e300,
  -1e300,
  1e20,
  -1e20,
  1e15,
  Number.MAX_VALUE,
  -Number.MAX_VALUE,
  Number.MIN_VALUE,
  -0,
  0,
  2 ** 53,
  -(2 ** 53),
  1e-300,
  1,
  -1,
  0.5,
  2,
  3,
  7,
];
/** Values of the right order for some field somewhere in the SDK (orbit radius, GM, Hz, s, rad, rates). */
const PLAUSIBLE_NUMBERS = [
  26_560_000,
  6_378_137,
  42_164_000,
  7_000_000,
  26_560,
  0.01,
  0.2,
  0.9,
  0.95,
  0.99,
  1e-3,
  1e-10,
  -4.4647e-10,
  1e-13,
  1e-16,
  1e-23,
  86_400,
  900,
  300,
  30,
  10,
  60,
  3600,
  604_800,
  10.23e6,
  1e8,
  3.986004418e14,
  7.292115e-5,
  Math.PI,
  1.0826e-3,
  48,
  32,
  16,
  1023,
  2048,
  2200,
  51_544,
  60_000,
  2026,
  12,
  31,
];
const PLAUSIBLE_STRINGS = [
  '',
  ' ',
  'tt',
  'tcg',
  'tai',
  'utc',
  'gps',
  'gpst',
  'galileo',
  'gst',
  'beidou',
  'bdt',
  'iers-2010',
  'gps-icd',
  'adev',
  'oadev',
  'mdev',
  'tdev',
  'hdev',
  'totdev',
  'point-mass',
  'j2',
  'deadband',
  'optimal',
  'phase',
  'frequency',
  'L1',
  'L1C/A',
  'E1',
  'G01',
  'E11',
  'C06',
  '2027-03-01T00:00:00Z',
  '2027-03-01T00:00:00',
  'NaN',
  '1e400',
  '-1e400',
  '0x10',
  '28794890104583',
  // Hostile reader text (huge gaps, endless lines) is the readers' own fuzz suite's subject; here text is short and plain.
  'not-a-name',
  '\u0000',
  'ℹ',
  '\n',
  '1\n2\n',
  '0 0\n1 0\n2 0\n',
  '  1.0  2.0\r',
  '%',
  '#',
  '∞',
];

export const leafArb: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 4, arbitrary: fc.constantFrom<unknown>(null, undefined, ...SPECIAL_NUMBERS) },
  { weight: 3, arbitrary: fc.constantFrom<unknown>(...PLAUSIBLE_NUMBERS) },
  { weight: 2, arbitrary: fc.double() },
  { weight: 2, arbitrary: fc.integer({ min: -1000, max: 1000 }) },
  { weight: 2, arbitrary: fc.constantFrom<unknown>(...PLAUSIBLE_STRINGS) },
  { weight: 1, arbitrary: fc.string({ maxLength: 12 }) },
  { weight: 1, arbitrary: fc.boolean() },
  { weight: 1, arbitrary: fc.bigInt({ min: -(2n ** 70n), max: 2n ** 70n }) },
);

const numberArb = fc.oneof(
  fc.constantFrom(...SPECIAL_NUMBERS, ...PLAUSIBLE_NUMBERS),
  fc.double({ min: -1e3, max: 1e3, noNaN: true }),
  fc.double({ min: -1e-8, max: 1e-8, noNaN: true }),
  fc.integer({ min: -1000, max: 1000 }),
);
/** Numeric series: short, sometimes sorted (times), sometimes a typed array. */
const seriesArb: fc.Arbitrary<unknown> = fc.oneof(
  fc.array(numberArb, { maxLength: 48 }),
  fc.array(fc.double({ min: -1e-6, max: 1e-6, noNaN: true }), { minLength: 2, maxLength: 48 }),
  fc.array(fc.integer({ min: 0, max: 1000 }), { maxLength: 48 }).map((a) => a.sort((x, y) => x - y)),
  fc.array(numberArb, { maxLength: 48 }).map((a) => Float64Array.from(a)),
  fc.array(numberArb, { minLength: 3, maxLength: 3 }),
);

/** Valid example objects, cloned then damaged at one nested place by `mutatedArb`. */
function seeds(): unknown[] {
  const examples: unknown[] = [];
  for (const folder of ['review', 'steering']) {
    for (const file of readdirSync(join(EXAMPLES, folder))) {
      if (file.endsWith('.json')) examples.push(JSON.parse(readFileSync(join(EXAMPLES, folder, file), 'utf8')));
    }
  }
  const elements = {
    semiMajorAxis: 26_560_000,
    eccentricity: 0.01,
    inclination: 0.96,
    raan: 1,
    argumentOfPerigee: 0.5,
    meanAnomaly: 2,
  };
  const state = { position: [26_560_000, 0, 0], velocity: [0, 3874, 0] };
  const phase = Array.from({ length: 40 }, (_, i) => 1e-9 * Math.sin(i) + 1e-11 * i);
  return [
    ...examples,
    { ...IERS_2010, sources: { ...IERS_2010.sources } },
    { ...GPS_ICD, sources: { ...GPS_ICD.sources } },
    { name: 'user', gm: 3.986e14 },
    elements,
    state,
    { ...state, t: 0 },
    { elements, t: 0 },
    { phase, tau0: 1 },
    { data: phase, tau0: 1, kind: 'phase' },
    { frequency: phase, tau0: 30 },
    { times: phase.map((_, i) => i * 30), phase },
    { q1: 1e-23, q2: 1e-32, q3: 0 },
    {
      q: { q1: 1e-23, q2: 1e-32, q3: 0 },
      initial: {
        state: [0, 0],
        covariance: [
          [1e-18, 0],
          [0, 1e-24],
        ],
      },
    },
    { n: 32, tau0: 1, seed: 1, q: { q1: 1e-23, q2: 1e-32, q3: 0 } },
    { word: '28794890104583', clockHz: 100_000_000, bits: 48 },
    { clockHz: 1e8, bits: 32, targetHz: 10.23e6 },
    { entries: BUNDLED_LEAP_SECONDS.entries.map((e) => ({ ...e })), validUntilMjd: BUNDLED_LEAP_SECONDS.validUntilMjd },
    { week: 2200, secondsOfWeek: 1000, system: 'gps' },
    { year: 2027, month: 3, day: 1, hour: 0, minute: 0, second: 0 },
    { epochInterval: 900, lagrangePoints: 9 },
    { monteCarloRuns: 20, marginalFraction: 0.1, seed: 1 },
    { runs: 4, seed: 1 },
    { latitude: 0.8, longitude: 0.1, height: 100 },
  ];
}
export const SEEDS: readonly unknown[] = seeds();

/** Every path (list of keys) to a value inside a plain JSON-like tree. */
function pathsOf(
  value: unknown,
  prefix: (string | number)[] = [],
  out: (string | number)[][] = [],
): (string | number)[][] {
  out.push(prefix);
  if (Array.isArray(value)) value.forEach((v, i) => pathsOf(v, [...prefix, i], out));
  else if (value !== null && typeof value === 'object' && Object.getPrototypeOf(value) === Object.prototype) {
    for (const [k, v] of Object.entries(value)) pathsOf(v, [...prefix, k], out);
  }
  return out;
}

function clone(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(clone);
  if (value !== null && typeof value === 'object' && Object.getPrototypeOf(value) === Object.prototype) {
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, clone(v)]));
  }
  return value;
}

/** A seed with one nested value replaced by `replacement`, or deleted when `remove` (the root is kept). */
function mutate(seed: unknown, pick: number, replacement: unknown, remove: boolean): unknown {
  const copy = clone(seed);
  const paths = pathsOf(copy);
  const path = paths[pick % paths.length]!;
  if (path.length === 0) return copy;
  let parent = copy as Record<string | number, unknown>;
  for (const key of path.slice(0, -1)) parent = parent[key] as Record<string | number, unknown>;
  const last = path[path.length - 1]!;
  if (remove && !Array.isArray(parent)) delete parent[last];
  else parent[last] = replacement;
  return copy;
}

const mutatedArb = (valueArb: fc.Arbitrary<unknown>): fc.Arbitrary<unknown> =>
  fc
    .tuple(fc.constantFrom(...SEEDS), fc.nat(), fc.oneof(leafArb, valueArb), fc.boolean(), fc.nat(4))
    .map(([seed, pick, replacement, remove, more]) => {
      let out = mutate(seed, pick, replacement, remove);
      for (let i = 0; i < more - 2; i++) out = mutate(out, pick * (i + 7), replacement, !remove);
      return out;
    });

/** Plausible instances: instants near the epoch and far from it. */
const instanceArb: fc.Arbitrary<unknown> = fc.oneof(
  fc.integer({ min: -1e9, max: 1e9 }).map((s) => Instant.fromTaiSeconds(s)),
  fc.constantFrom(
    Instant.fromTaiSeconds(1e12),
    Instant.fromTaiSeconds(-1e12),
    new Set(['G01', 'E11']),
    new Map(),
    new Date(0),
  ),
);

/** Any argument: leaves, series, JSON, SDK-shaped objects, damaged seeds, instances and functions. */
export const valueArb: fc.Arbitrary<unknown> = fc.letrec<{ value: unknown }>((tie) => ({
  value: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    { weight: 5, arbitrary: leafArb },
    { weight: 3, arbitrary: seriesArb },
    { weight: 2, arbitrary: fc.jsonValue({ maxDepth: 3 }) },
    { weight: 3, arbitrary: fc.dictionary(fc.constantFrom(...FIELD_NAMES), tie('value'), { maxKeys: 6 }) },
    { weight: 1, arbitrary: fc.array(tie('value'), { maxLength: 6 }) },
    { weight: 4, arbitrary: mutatedArb(leafArb) },
    { weight: 1, arbitrary: instanceArb },
    { weight: 1, arbitrary: fc.func(fc.oneof(leafArb, seriesArb)) },
  ),
})).value;

/** An argument list of 0..(arity + 1) values. */
export const argsArb = (arity: number): fc.Arbitrary<unknown[]> =>
  fc.array(valueArb, { minLength: 0, maxLength: Math.max(arity, 1) + 1 });
