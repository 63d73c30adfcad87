/**
 * The periodic relativistic clock correction from precise orbits (SP3): Δt_r = −2 r·v/c² at
 * each epoch, with v from the file's velocity records or, when a satellite has none, from the
 * derivative of a Lagrange polynomial through the nearest positions.
 *
 * r·v is taken in the file's Earth-fixed frame: with v_inertial = v_fixed + ω × r and
 * (ω × r)·r = 0, r·v is the same in the rotating and the inertial frame (IERS Conventions 2010
 * §10.2 eq. 10.11 and text [V1]; the identity (ω × r)·r = 0 is elementary vector algebra).
 *
 * @module
 */

import { InvalidArgumentError } from '../errors.js';
import { requireInteger, requireVector3 } from '../internal/validate.js';
import { Instant } from '../time/instant.js';
import type { Seconds, Vector3 } from '../units.js';
import { applyDerivativeRow, DEFAULT_LAGRANGE_POINTS, derivativeRow } from './lagrange.js';
import { periodicCorrectionFromState } from './periodic.js';

export { DEFAULT_LAGRANGE_POINTS, lagrangeDerivativeAtNode, lagrangeInterpolate } from './lagrange.js';

/** Radius below which a "position" cannot be a satellite's, in metres (WGS 84 equatorial radius). */
const EARTH_RADIUS = 6_378_137;
/** Largest geocentric distance the relativity functions accept (internal/validate.ts `requireOrbitRadius`), in metres. */
const MAX_ORBIT_RADIUS = 1e10;

/**
 * One satellite's state at one epoch, as the precise-orbit correction consumes it (an SP3 satellite
 * record has this shape). Undefined vectors are missing values, never zero.
 */
export interface SatelliteState {
  /** Satellite identifier, e.g. `G05`. */
  readonly satellite: string;
  /** Position in an Earth-fixed frame, in metres; `undefined` when bad or absent. */
  readonly position: Vector3 | undefined;
  /** Velocity in the same frame, in m/s; `undefined` when absent (then the positions are differentiated). */
  readonly velocity: Vector3 | undefined;
}

/**
 * The states of several satellites at one epoch: the plain contract of {@link PreciseCorrectionStream}
 * (an SP3 epoch from `readSp3` has this shape; any other orbit source can build it).
 */
export interface StateEpoch {
  /** The epoch, an absolute instant. */
  readonly epoch: Instant;
  /** One state per satellite present at this epoch. */
  readonly records: readonly SatelliteState[];
  /** Satellites expected at this epoch without a record (each becomes a gap), when the source knows them. */
  readonly missingSatellites?: readonly string[];
}

/** One epoch's correction for one satellite. */
export interface PreciseCorrectionSample {
  readonly satellite: string;
  /** The epoch, an absolute instant. */
  readonly epoch: Instant;
  /** −2 r·v/c², in seconds. */
  readonly relativisticSeconds: Seconds;
  /** Where v came from: the state's velocity, or the Lagrange derivative of positions. */
  readonly velocitySource: 'file' | 'lagrange';
}

/** An epoch at which no correction could be formed for a satellite, and why. */
export interface PreciseCorrectionGap {
  readonly satellite: string;
  /** The epoch, an absolute instant. */
  readonly epoch: Instant;
  readonly reason: string;
}

/** Output of the precise-orbit correction stream. */
export type PreciseCorrectionResult =
  | { readonly kind: 'sample'; readonly sample: PreciseCorrectionSample }
  | { readonly kind: 'gap'; readonly gap: PreciseCorrectionGap };

/** Options of {@link PreciseCorrectionStream}. */
export interface PreciseCorrectionOptions {
  /** Nominal spacing of the epochs, in seconds (for SP3 the header's `##` line value); bounds the Lagrange window span. */
  readonly epochInterval: Seconds;
  /** Number of Lagrange nodes for positions without velocities, 2..16 (default 9: degree 8). */
  readonly lagrangePoints?: number;
  /** Only these satellites (default: all). */
  readonly satellites?: ReadonlySet<string>;
  /** Ignore the file's velocities and always differentiate positions (default false). */
  readonly alwaysInterpolate?: boolean;
}

/** A position node: `t` in seconds since the stream's first epoch. */
interface Node {
  readonly t: number;
  readonly p: Vector3;
}
interface Target {
  readonly epoch: Instant;
  /** Seconds since the stream's first epoch. */
  readonly t: number;
  readonly p: Vector3 | undefined;
  readonly v: Vector3 | undefined;
  readonly missing?: string;
}

/** Throws unless `epoch` is a {@link StateEpoch} (an Instant, records with finite vectors). */
function requireStateEpoch(epoch: unknown): StateEpoch {
  const e = epoch as Partial<StateEpoch> | null;
  if (typeof e !== 'object' || e === null || !(e.epoch instanceof Instant) || !Array.isArray(e.records)) {
    throw new InvalidArgumentError(
      'epoch',
      epoch,
      'a state epoch { epoch: Instant, records } (an SP3 epoch as readSp3 yields)',
    );
  }
  e.records.forEach((r: unknown, i) => {
    const rec = r as Partial<SatelliteState> | null;
    if (typeof rec !== 'object' || rec === null || typeof rec.satellite !== 'string') {
      throw new InvalidArgumentError(
        `epoch.records[${i}]`,
        r,
        'a satellite record { satellite, position?, velocity? }',
      );
    }
    if (rec.position !== undefined) requireVector3(`epoch.records[${i}].position`, rec.position, 'm');
    if (rec.velocity !== undefined) requireVector3(`epoch.records[${i}].velocity`, rec.velocity, 'm/s');
  });
  return e as StateEpoch;
}

/**
 * Computes −2 r·v/c² epoch by epoch from a stream of state epochs (e.g. SP3 epochs), with bounded memory (per
 * satellite, the Lagrange window and the epochs still waiting for later positions).
 *
 * Velocity: the file's when present (unless `alwaysInterpolate`); otherwise the derivative at
 * the epoch of the Lagrange polynomial through the `lagrangePoints` valid positions nearest in
 * time (centred inside the file, one-sided at its ends). A window spanning more than
 * (lagrangePoints − 1 + 2)·epochInterval (more than two missing epochs) is refused, and the
 * epoch is reported as a gap with its reason, as are bad/absent positions.
 *
 * Accuracy of Δt_r with Lagrange velocities (measured in the tests on a two-body GPS-like orbit,
 * e = 0.02, 900 s spacing, positions rounded to 1 mm as in SP3): 9 nodes ≤ 5e-15 s with a centred
 * window, ≤ 5e-13 s near the file ends and data holes (one-sided windows); 5 nodes ≤ 3e-11 s
 * centred, ≤ 3e-10 s near ends. Use the file's velocities when it has them.
 *
 * @see IERS Conventions (2010) §10.2 eq. 10.11 [V1]; SP3-c/d [M]; Berrut & Trefethen (2004) [M].
 */
export class PreciseCorrectionStream {
  private readonly _points: number;
  private readonly _interval: number;
  private readonly _filter: ReadonlySet<string> | undefined;
  private readonly _alwaysInterpolate: boolean;
  private readonly _nodes = new Map<string, Node[]>();
  private readonly _queues = new Map<string, Target[]>();
  /** The first epoch pushed: node and target times are seconds since it (exact differences of instants). */
  private _origin: Instant | undefined;

  /** @throws {InvalidArgumentError} for a non-positive interval or a point count outside 2..16. */
  constructor(options: PreciseCorrectionOptions) {
    if (
      !(
        typeof options?.epochInterval === 'number' &&
        options.epochInterval > 0 &&
        Number.isFinite(options.epochInterval)
      )
    ) {
      throw new InvalidArgumentError('epochInterval', options?.epochInterval, 'a positive number of seconds');
    }
    this._interval = options.epochInterval;
    this._points = requireInteger('lagrangePoints', options.lagrangePoints ?? DEFAULT_LAGRANGE_POINTS, 2, 16);
    this._filter = options.satellites;
    this._alwaysInterpolate = options.alwaysInterpolate ?? false;
  }

  /** Feeds one epoch (epochs in increasing time). Returns the results completed. */
  push(stateEpoch: StateEpoch): PreciseCorrectionResult[] {
    const epoch = requireStateEpoch(stateEpoch);
    this._origin ??= epoch.epoch;
    const t = epoch.epoch.secondsSince(this._origin);
    const out: PreciseCorrectionResult[] = [];
    const present = new Set<string>();
    for (const rec of epoch.records) {
      if (this._filter && !this._filter.has(rec.satellite)) continue;
      present.add(rec.satellite);
      let p = rec.position;
      let missing: string | undefined;
      if (p === undefined) missing = 'position missing (bad/absent marker 0.000000)';
      else if (Math.hypot(p[0], p[1], p[2]) <= EARTH_RADIUS) {
        missing = 'position inside the Earth (not a satellite position)';
        p = undefined;
      } else if (Math.hypot(p[0], p[1], p[2]) > MAX_ORBIT_RADIUS) {
        missing = `position farther than ${MAX_ORBIT_RADIUS} m from the geocentre (outside the range of the clock-rate model)`;
        p = undefined;
      }
      if (p) this._nodesOf(rec.satellite).push({ t, p });
      const v = this._alwaysInterpolate ? undefined : rec.velocity;
      this._queueOf(rec.satellite).push({ epoch: epoch.epoch, t, p, v, ...(missing ? { missing } : {}) });
    }
    // Satellites listed in the file's header without a record at this epoch (the reader's list), and any
    // satellite seen before that has none: each is a gap at this epoch, never skipped.
    const absent = new Set<string>();
    for (const sat of epoch.missingSatellites ?? [])
      if (!present.has(sat) && (!this._filter || this._filter.has(sat))) absent.add(sat);
    for (const sat of this._queues.keys()) if (!present.has(sat)) absent.add(sat);
    for (const sat of absent) {
      this._queueOf(sat).push({
        epoch: epoch.epoch,
        t,
        p: undefined,
        v: undefined,
        missing: 'no record at this epoch',
      });
    }
    for (const sat of this._queues.keys()) this._drain(sat, t, false, out);
    return out;
  }

  /** Ends the stream; resolves every waiting epoch with the positions available. */
  finish(): PreciseCorrectionResult[] {
    const out: PreciseCorrectionResult[] = [];
    for (const sat of this._queues.keys()) this._drain(sat, Infinity, true, out);
    return out;
  }

  private _nodesOf(sat: string): Node[] {
    let n = this._nodes.get(sat);
    if (!n) this._nodes.set(sat, (n = []));
    return n;
  }

  private _queueOf(sat: string): Target[] {
    let q = this._queues.get(sat);
    if (!q) this._queues.set(sat, (q = []));
    return q;
  }

  private _maxSpan(): number {
    return (this._points - 1 + 2) * this._interval * (1 + 1e-9);
  }

  private _drain(sat: string, latest: number, final: boolean, out: PreciseCorrectionResult[]): void {
    const queue = this._queueOf(sat);
    const nodes = this._nodesOf(sat);
    const half = Math.floor((this._points - 1) / 2);
    for (let target = queue[0]; target !== undefined; target = queue[0]) {
      const position = target.p;
      if (target.missing !== undefined || position === undefined) {
        out.push({
          kind: 'gap',
          gap: { satellite: sat, epoch: target.epoch, reason: target.missing ?? 'position missing' },
        });
        queue.shift();
        continue;
      }
      if (target.v !== undefined) {
        out.push(this._sample(sat, target.epoch, position, target.v, 'file'));
        queue.shift();
        continue;
      }
      if (!final) {
        // Wait until the window is final: `half` nodes before (fewer at the file start means
        // more after) and the rest after, or until later data can no longer fit a window.
        const before = nodes.filter((n) => n.t < target.t).length;
        const later = nodes.filter((n) => n.t > target.t).length;
        const needed = this._points - 1 - Math.min(before, half);
        if (later < needed && latest - target.t <= this._maxSpan()) break;
      }
      const window = nearest(nodes, target.t, this._points);
      const span = Math.max(...window.map((n) => Math.abs(n.t - target.t)));
      if (window.length < this._points || span > this._maxSpan()) {
        out.push({
          kind: 'gap',
          gap: {
            satellite: sat,
            epoch: target.epoch,
            reason: `too few valid positions near this epoch for ${this._points}-point Lagrange velocity (no velocity record)`,
          },
        });
      } else {
        const times = window.map((n) => n.t - target.t);
        const i = times.indexOf(0);
        // One differentiation row (barycentric weights included) for x, y and z: it depends on the times only.
        const row = derivativeRow(times, i);
        const component = (c: 0 | 1 | 2) =>
          applyDerivativeRow(
            row,
            window.map((n) => n.p[c]),
            i,
          );
        const v: Vector3 = [component(0), component(1), component(2)];
        out.push(this._sample(sat, target.epoch, position, v, 'lagrange'));
      }
      queue.shift();
    }
    // Keep only the nodes a future target can use.
    const oldest = queue[0]?.t ?? latest;
    const keepFrom = oldest - 2 * this._maxSpan();
    const firstKept = nodes.findIndex((node) => !(node.t < keepFrom));
    const drop = firstKept < 0 ? nodes.length : firstKept;
    if (drop > 0) nodes.splice(0, drop);
  }

  private _sample(
    sat: string,
    epoch: Instant,
    position: Vector3,
    v: Vector3,
    source: 'file' | 'lagrange',
  ): PreciseCorrectionResult {
    return {
      kind: 'sample',
      sample: {
        satellite: sat,
        epoch,
        // IERS Conventions 2010 eq. 10.11 [V1]: Δt_r = −2 r·v/c².
        relativisticSeconds: periodicCorrectionFromState({ position, velocity: v }),
        velocitySource: source,
      },
    };
  }
}

function nearest(nodes: readonly Node[], t: number, count: number): Node[] {
  // Nodes are in increasing time: grow a window outwards from the node at t.
  let i = nodes.findIndex((n) => n.t === t);
  if (i < 0) return [];
  let lo = i;
  let hi = i;
  while (hi - lo + 1 < count) {
    const before = nodes[lo - 1];
    const after = nodes[hi + 1];
    if (before === undefined && after === undefined) break;
    if (before !== undefined && (after === undefined || t - before.t <= after.t - t)) lo--;
    else hi++;
  }
  i = lo;
  return nodes.slice(i, hi + 1);
}

/**
 * Computes −2 r·v/c² for every satellite and epoch of a state-epoch stream (e.g. SP3 epochs from `readSp3`) (see
 * {@link PreciseCorrectionStream} for the method and options).
 *
 * @param epochs   State epochs in time order (e.g. SP3 epochs from `readSp3`), sync or async.
 * @param options  Epoch interval, Lagrange points, satellite filter.
 * @returns An async generator of samples and gaps, per satellite in time order.
 * @throws {InvalidArgumentError} for bad options.
 * @see IERS Conventions (2010) §10.2 eq. 10.11 [V1].
 */
export async function* preciseRelativisticCorrections(
  epochs: Iterable<StateEpoch> | AsyncIterable<StateEpoch>,
  options: PreciseCorrectionOptions,
): AsyncGenerator<PreciseCorrectionResult> {
  const stream = new PreciseCorrectionStream(options);
  const iterable = epochs as Partial<AsyncIterable<StateEpoch> & Iterable<StateEpoch>> | null;
  if (
    typeof iterable !== 'object' ||
    iterable === null ||
    (typeof iterable[Symbol.asyncIterator] !== 'function' && typeof iterable[Symbol.iterator] !== 'function')
  ) {
    throw new InvalidArgumentError(
      'epochs',
      epochs,
      'an iterable or async iterable of state epochs { epoch: Instant, records } (e.g. SP3 epochs from readSp3)',
    );
  }
  for await (const epoch of epochs) yield* stream.push(epoch);
  yield* stream.finish();
}
