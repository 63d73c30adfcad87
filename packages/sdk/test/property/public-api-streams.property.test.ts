/**
 * The exports with a different contract from plain functions, under hostile arguments: every class
 * (constructor, static methods, and the methods of a valid instance) and every generator or async
 * reader (drained to the end). The same rule as for plain functions: finite numbers or a TaulineError,
 * never an untyped error, never a hang. fast-check, fixed seed in the test names.
 */
import fc from 'fast-check';
import { describe, it } from 'vitest';
import { argsArb, valueArb } from './arbitraries.js';
import { nonFinitePath, type PublicExport, publicExports, untypedError } from './public-surface.js';
import { INSTANCES, VALID_STREAM_CALLS } from './valid-calls.js';

const SEED = 20261203;
const RUNS = 40;
const HANG_MS = 2000;
/** Items read from one generator before stopping (a hostile source must not make the check itself unbounded). */
const MAX_ITEMS = 10_000;

const EXPORTS = await publicExports();
/** Error classes take any message parts by design (constructing one never fails); they are not called here. */
const ERROR_CLASSES = new Set([
  'TaulineError',
  'InvalidArgumentError',
  'OutOfDomainError',
  'ConvergenceError',
  'ParseError',
]);
/** Constructors private in TypeScript (not public API): Instant is built through its static factories. */
const PRIVATE_CONSTRUCTORS = new Set(['Instant']);
/** Methods private in TypeScript without the `_` prefix (not public API). */
const PRIVATE_METHODS = new Set(['ClockKalmanFilter#runDetector']);

function check(outcome: { value?: unknown; error?: unknown }, started: number, allowNaN = false): void {
  const problem =
    'error' in outcome ? untypedError(outcome.error) : nonFinitePath(outcome.value, allowNaN ? /= NaN$/ : undefined);
  if (problem) throw new Error(problem);
  const elapsed = performance.now() - started;
  if (elapsed > HANG_MS) throw new Error(`took ${elapsed.toFixed(0)} ms (hang bound ${HANG_MS} ms)`);
}

function callSync(fn: () => unknown): { value?: unknown; error?: unknown } {
  try {
    return { value: fn() };
  } catch (error) {
    return { error };
  }
}

/** The callable members of an object or class (own and prototype), without the constructor. */
function methodsOf(target: object): string[] {
  const names = new Set<string>();
  for (
    let o: object | null = target;
    o && o !== Object.prototype && o !== Function.prototype;
    o = Object.getPrototypeOf(o)
  ) {
    for (const name of Object.getOwnPropertyNames(o)) {
      if (name === 'constructor' || name === 'prototype' || name.startsWith('_')) continue;
      const d = Object.getOwnPropertyDescriptor(o, name);
      if (d && typeof d.value === 'function') names.add(name);
    }
  }
  return [...names].sort();
}

const classes = EXPORTS.filter((e) => e.kind === 'class' && !ERROR_CLASSES.has(e.name));
const constructible = classes.filter((e) => !PRIVATE_CONSTRUCTORS.has(e.name));

describe(`exported classes under arbitrary arguments (fast-check seed ${SEED})`, () => {
  it.each(constructible.map((e) => [e.name, e] as [string, PublicExport]))(
    'new %s(arbitrary arguments) builds an object or throws a TaulineError',
    (_name, e) => {
      const C = e.value as new (...args: unknown[]) => unknown;
      fc.assert(
        fc.property(argsArb(C.length), (args) => {
          const started = performance.now();
          // The instance's internal state is not a result (e.g. a -Infinity "no epoch yet" sentinel): only the type is checked.
          const built = callSync(() => new C(...args));
          check('error' in built ? built : { value: typeof built.value === 'object' ? null : Number.NaN }, started);
        }),
        { seed: SEED, numRuns: RUNS, includeErrorInReport: true },
      );
    },
  );

  const statics = classes.flatMap((e) =>
    methodsOf(e.value as object).map((m) => [`${e.name}.${m}`, e.value, m] as [string, unknown, string]),
  );
  it.each(statics)('%s(arbitrary arguments) returns finite numbers or throws a TaulineError', (_label, C, method) => {
    const fn = (C as Record<string, (...a: unknown[]) => unknown>)[method]!;
    fc.assert(
      fc.property(argsArb(fn.length), (args) => {
        const started = performance.now();
        check(
          callSync(() => fn.apply(C, args)),
          started,
        );
      }),
      { seed: SEED, numRuns: RUNS, includeErrorInReport: true },
    );
  });

  const instanceMethods = Object.entries(INSTANCES).flatMap(([name, make]) =>
    methodsOf(make())
      .filter((m) => !PRIVATE_METHODS.has(`${name}#${m}`))
      .map((m) => [`${name}#${m}`, make, m] as [string, () => object, string]),
  );
  it.each(instanceMethods)(
    '%s(arbitrary arguments) on a valid instance returns finite numbers or throws a TaulineError',
    (_label, make, method) => {
      fc.assert(
        fc.property(argsArb(2), (args) => {
          const target = make() as Record<string, (...a: unknown[]) => unknown>;
          const started = performance.now();
          check(
            callSync(() => target[method]!(...args)),
            started,
          );
        }),
        { seed: SEED, numRuns: RUNS, includeErrorInReport: true },
      );
    },
  );
});

/** Drains a generator, async generator or promise; returns what it produced or the error it threw. */
async function drain(start: () => unknown): Promise<{ value?: unknown; error?: unknown }> {
  try {
    const produced = start();
    if (produced instanceof Promise) return { value: await produced };
    const items: unknown[] = [];
    const iterator = produced as AsyncIterator<unknown> | Iterator<unknown>;
    for (let k = 0; k < MAX_ITEMS; k++) {
      const step = await iterator.next();
      if (step.done) break;
      items.push(step.value);
    }
    return { value: items };
  } catch (error) {
    return { error };
  }
}

/** An async chunk stream of arbitrary values (a reader must refuse a non-text chunk with a typed error). */
const asyncSourceArb = fc.array(fc.oneof(fc.string({ maxLength: 40 }), valueArb), { maxLength: 4 }).map((chunks) => ({
  async *[Symbol.asyncIterator]() {
    yield* chunks;
  },
}));

const streams = EXPORTS.filter(
  (e) => e.kind === 'generator' || e.kind === 'async-generator' || e.kind === 'async-function',
);
/** Readers whose results hold NaN for a documented missing sample (phase text gaps and `NaN` sample events; RinexClockSeries.phase "NaN for every missing epoch"). */
const NAN_ALLOWED = new Set(['readPhaseText', 'readPhaseTextSeries', 'readRinexClockSeries']);

describe(`generator and async exports under arbitrary arguments, drained (fast-check seed ${SEED})`, () => {
  it.each(streams.map((e) => [e.name, e] as [string, PublicExport]))(
    '%s(arbitrary sources and options) yields finite numbers or throws a TaulineError',
    async (name, e) => {
      const fn = e.value as (...args: unknown[]) => unknown;
      const valid = VALID_STREAM_CALLS[name];
      const args = fc.oneof(
        argsArb(fn.length),
        fc.tuple(asyncSourceArb, fc.oneof(valueArb, fc.constant(undefined))).map(([s, o]) => [s, o]),
        ...(valid
          ? [
              fc.tuple(fc.nat(), valueArb).map(([i, v]) => {
                const a = valid();
                a[i % a.length] = v;
                return a;
              }),
            ]
          : []),
      );
      await fc.assert(
        fc.asyncProperty(args, async (a) => {
          const started = performance.now();
          check(await drain(() => fn(...a)), started, NAN_ALLOWED.has(name));
        }),
        { seed: SEED, numRuns: RUNS, includeErrorInReport: true },
      );
    },
  );
});
