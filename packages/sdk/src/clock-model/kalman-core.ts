/**
 * Allocation-free core of the clock Kalman filter: state and covariance as plain numbers (the 2-state
 * model runs as the 3-state one with a zero drift row and column, which stays exactly zero), the time
 * and measurement updates unrolled, a steady-state shortcut, and a short history of measurements and
 * posteriors so that the estimate can be recomputed after the GLR detector declares an outlier or a
 * jump at an earlier epoch.
 *
 * @internal
 * @module
 */
import { at } from '../internal/checked.js';
import { FREQUENCY, type GlrDecision, type GlrDetector, PHASE } from './kalman-glr.js';
import { FrozenUpdate, type StatePrediction, UpperTriangle } from './kalman-state.js';
import type { ClockState3, Covariance3 } from './kalman-types.js';

/** Relative change of the prior covariance below which the Riccati recursion counts as converged. */
export const STEADY_TOLERANCE = 1e-12;

/** Variance factor of the jump component at a declared jump epoch (a practically flat prior; see `replay`). */
const DIFFUSE = 1e8;

/** History flag: the measurement was declared an outlier and is left out. */
const SKIP = 1;

/** A known deterministic step applied between updates. */
interface KnownStep {
  after: number;
  t: number;
  dx: number;
  dy: number;
  dd: number;
}
/** A declared jump, applied at its epoch when the history is replayed. */
interface JumpEvent {
  update: number;
  kind: number;
  size: number;
  variance: number;
}

/** Posterior callback: update index, the core (state, covariance, `nu`, `s`), whether the measurement was left out. */
export type PosteriorListener = (update: number, core: FilterCore, leftOut: boolean) => void;

/** Events declared during one measurement update. */
export interface CoreEvents {
  jumps: GlrDecision[];
  outliers: GlrDecision[];
}

export class FilterCore {
  // Numeric fields start as doubles (NaN) so that V8 keeps them unboxed-in-place: a field declared
  // without a value starts as undefined and every later store would allocate a new heap number.
  readonly q1: number = Number.NaN;
  readonly q2: number = Number.NaN;
  readonly q3: number = Number.NaN;
  t = Number.NaN;
  x0 = Number.NaN;
  x1 = Number.NaN;
  x2 = Number.NaN;
  p00 = Number.NaN;
  p01 = Number.NaN;
  p02 = Number.NaN;
  p11 = Number.NaN;
  p12 = Number.NaN;
  p22 = Number.NaN;
  /** Updates done (the next update index). */
  updates = 0;
  /** Gate on NIS above which a measurement is held out pending the outlier decision. */
  readonly holdGate: number = Number.NaN;
  readonly detector: GlrDetector | undefined;
  listener: PosteriorListener | undefined;
  // Steady state: last τ, R and prior; when frozen, the prior, gain, S and posterior are reused.
  private _steady = false;
  private _tau = Number.NaN;
  private _r = Number.NaN;
  private readonly _prior = new UpperTriangle();
  private readonly _frozen = new FrozenUpdate();
  private _priorFromSteady = false;
  /** True while P is the frozen steady-state posterior (no time update since). */
  private _atPost = false;
  /** Innovation (s) and its variance (s²) of the last measurement update. */
  nu = Number.NaN;
  s = Number.NaN;
  /** Innovation and its variance of the last live (not replayed) update, in s and s². */
  liveNu = Number.NaN;
  liveS = Number.NaN;
  // History ring of measurements and posteriors, for replay.
  private readonly _cap: number;
  private readonly _ht: Float64Array;
  private readonly _hz: Float64Array;
  private readonly _hr: Float64Array;
  private readonly _hflag: Uint8Array;
  private readonly _hpost: Float64Array;
  private _steps: KnownStep[] = [];
  private _jumps: JumpEvent[] = [];
  /** Updates up to this index have had their outlier decision. */
  private _decided = -1;
  /** Candidates are opened only at updates ≥ this index (set after a declared jump). */
  private _barrier = 0;
  /** Updates held out by the gate whose outlier decision is pending. */
  private readonly _held = new Set<number>();
  /** The last prior repeated the one before (same τ): steady state once R repeats too. */
  private _candidate = false;

  constructor(
    q: { q1: number; q2: number; q3: number },
    t: number,
    mean: ClockState3,
    p: Covariance3,
    holdGate: number,
    detector: GlrDetector | undefined,
  ) {
    this.q1 = q.q1;
    this.q2 = q.q2;
    this.q3 = q.q3;
    this.t = t;
    [this.x0, this.x1, this.x2] = mean;
    this.p00 = p.p00;
    this.p01 = p.p01;
    this.p11 = p.p11;
    this.p02 = p.p02;
    this.p12 = p.p12;
    this.p22 = p.p22;
    this.holdGate = holdGate;
    this.detector = detector;
    this._cap = detector ? detector.window + 2 : 1;
    this._ht = new Float64Array(this._cap);
    this._hz = new Float64Array(this._cap);
    this._hr = new Float64Array(this._cap);
    this._hflag = new Uint8Array(this._cap);
    this._hpost = new Float64Array(this._cap * 9);
    this._store(-1, 0);
  }

  /**
   * Time update by τ = t − this.t: s ← Φs, P ← ΦPΦᵀ + Q(τ) with
   * Q11 = q1τ + q2τ³/3 + q3τ⁵/20, Q12 = q2τ²/2 + q3τ⁴/8, Q13 = q3τ³/6, Q22 = q2τ + q3τ³/3, Q23 = q3τ²/2, Q33 = q3τ
   * (Zucca & Tavella, IEEE Trans. UFFC 52(2), 289–296 (2005) [M citation]; Brown & Hwang, Introduction to
   * Random Signals and Applied Kalman Filtering, 4th ed. (2012), §9 clock model [M]; same Q as clockProcessNoise).
   */
  predictTo(t: number): void {
    const tau = t - this.t;
    if (!(tau > 0)) return;
    const h = 0.5 * tau * tau;
    this.x0 += tau * this.x1 + h * this.x2;
    this.x1 += tau * this.x2;
    this.t = t;
    if (this.detector) {
      this.detector.input[0] = tau;
      this.detector.propagate();
    }
    const fromPosterior = this._atPost;
    this._atPost = false;
    this._priorFromSteady = this._steady && fromPosterior && tau === this._tau;
    if (this._priorFromSteady) {
      const f = this._prior;
      this.p00 = f.p00;
      this.p01 = f.p01;
      this.p02 = f.p02;
      this.p11 = f.p11;
      this.p12 = f.p12;
      this.p22 = f.p22;
      return;
    }
    this._steady = false;
    this._covarianceUpdate(tau);
    if (fromPosterior) this._checkSteady(tau);
    else {
      this._candidate = false;
      this._tau = Number.NaN;
    }
  }

  /** P ← Φ(τ)PΦ(τ)ᵀ + Q(τ), unrolled. */
  private _covarianceUpdate(tau: number): void {
    const h = 0.5 * tau * tau;
    const { p00, p01, p02, p11, p12, p22, q1, q2, q3 } = this;
    // A = ΦP, then P' = AΦᵀ (upper triangle).
    const a00 = p00 + tau * p01 + h * p02;
    const a01 = p01 + tau * p11 + h * p12;
    const a02 = p02 + tau * p12 + h * p22;
    const a11 = p11 + tau * p12;
    const a12 = p12 + tau * p22;
    const t2 = tau * tau;
    const t3 = t2 * tau;
    this.p00 = a00 + tau * a01 + h * a02 + q1 * tau + (q2 * t3) / 3 + (q3 * t3 * t2) / 20;
    this.p01 = a01 + tau * a02 + (q2 * t2) / 2 + (q3 * t2 * t2) / 8;
    this.p02 = a02 + (q3 * t3) / 6;
    this.p11 = a11 + tau * a12 + q2 * tau + (q3 * t3) / 3;
    this.p12 = a12 + (q3 * t2) / 2;
    this.p22 = p22 + q3 * tau;
  }

  /** Writes the prediction at `t` ≥ this.t into `out` without changing the filter. */
  peek(t: number, out: StatePrediction): void {
    const tau = t - this.t;
    const h = 0.5 * tau * tau;
    const { p00, p01, p02, p11, p12, p22 } = this;
    this._covarianceUpdate(tau);
    out.phase = this.x0 + tau * this.x1 + h * this.x2;
    out.frequency = this.x1 + tau * this.x2;
    out.drift = this.x2;
    out.phaseStd = Math.sqrt(this.p00);
    out.frequencyStd = Math.sqrt(this.p11);
    out.driftStd = Math.sqrt(this.p22);
    this.p00 = p00;
    this.p01 = p01;
    this.p02 = p02;
    this.p11 = p11;
    this.p12 = p12;
    this.p22 = p22;
  }

  /** Compares the new prior with the previous one (same τ): converged when every entry repeats to STEADY_TOLERANCE·√(PᵢᵢPⱼⱼ). */
  private _checkSteady(tau: number): void {
    const f = this._prior;
    const same =
      tau === this._tau &&
      close(this.p00, f.p00, this.p00, this.p00) &&
      close(this.p01, f.p01, this.p00, this.p11) &&
      close(this.p02, f.p02, this.p00, this.p22) &&
      close(this.p11, f.p11, this.p11, this.p11) &&
      close(this.p12, f.p12, this.p11, this.p22) &&
      close(this.p22, f.p22, this.p22, this.p22);
    f.p00 = this.p00;
    f.p01 = this.p01;
    f.p02 = this.p02;
    f.p11 = this.p11;
    f.p12 = this.p12;
    f.p22 = this.p22;
    this._tau = tau;
    this._candidate = same;
  }

  /**
   * Measurement update with phase z (s) of variance r (s²): ν = z − x̂⁻, S = P⁻₁₁ + R, K = P⁻Hᵀ/S,
   * s = s⁻ + Kν, P = (I − KH)P⁻(I − KH)ᵀ + KRKᵀ (Joseph form; Kalman 1960 [M], Bucy & Joseph 1968 [M]).
   * `mode`: 0 normal (held out when NIS > holdGate and the update is undecided), 1 forced use, 2 skip.
   * Returns true when the measurement was left out; sets `nu` and `s`.
   */
  private _measure(z: number, r: number, mode: number): boolean {
    const u = this.updates++;
    const s = this.p00 + r;
    const nu = z - this.x0;
    const leftOut = mode === 2 || (mode === 0 && (nu * nu) / s > this.holdGate);
    const det = this.detector;
    if (det && mode !== 2 && u >= this._barrier) det.add(u, this.t);
    let k0 = 0;
    let k1 = 0;
    let k2 = 0;
    if (!leftOut) {
      if (this._priorFromSteady && r === this._r) {
        const f = this._frozen;
        const post = f.posterior;
        k0 = f.k0;
        k1 = f.k1;
        k2 = f.k2;
        this.p00 = post.p00;
        this.p01 = post.p01;
        this.p02 = post.p02;
        this.p11 = post.p11;
        this.p12 = post.p12;
        this.p22 = post.p22;
        this._atPost = true;
      } else {
        const { p00, p01, p02, p11, p12, p22 } = this;
        k0 = p00 / s;
        k1 = p01 / s;
        k2 = p02 / s;
        // Joseph form with H = [1, 0, 0]: P⁺ᵢⱼ = Pᵢⱼ − KᵢP₀ⱼ − KⱼP₀ᵢ + KᵢKⱼS.
        this.p00 = p00 - 2 * k0 * p00 + k0 * k0 * s;
        this.p01 = p01 - k0 * p01 - k1 * p00 + k0 * k1 * s;
        this.p02 = p02 - k0 * p02 - k2 * p00 + k0 * k2 * s;
        this.p11 = p11 - 2 * k1 * p01 + k1 * k1 * s;
        this.p12 = p12 - k1 * p02 - k2 * p01 + k1 * k2 * s;
        this.p22 = p22 - 2 * k2 * p02 + k2 * k2 * s;
        this._steady = this._candidate && r === this._r;
        if (this._steady) {
          const f = this._frozen;
          const post = f.posterior;
          f.k0 = k0;
          f.k1 = k1;
          f.k2 = k2;
          f.s = s;
          post.p00 = this.p00;
          post.p01 = this.p01;
          post.p02 = this.p02;
          post.p11 = this.p11;
          post.p12 = this.p12;
          post.p22 = this.p22;
        }
        this._atPost = true;
        this._r = r;
      }
      this.x0 += k0 * nu;
      this.x1 += k1 * nu;
      this.x2 += k2 * nu;
    } else {
      this._steady = false;
      this._candidate = false;
      this._atPost = false;
      if (mode === 0) this._held.add(u);
    }
    this._priorFromSteady = false;
    this.nu = nu;
    this.s = s;
    if (det && mode !== 2) {
      const inp = det.input;
      inp[0] = nu;
      inp[1] = s;
      inp[2] = k0;
      inp[3] = k1;
      inp[4] = k2;
      det.accumulate();
    }
    if (det) {
      const i = this._slot(u);
      this._hz[i] = z;
      this._hr[i] = r;
      this._store(u, mode === 2 ? SKIP : 0);
    }
    if (this.listener) this.listener(u, this, leftOut);
    return leftOut;
  }

  /** Ring slot of update u (u ≥ −1). */
  private _slot(u: number): number {
    return (u + 1) % this._cap;
  }

  private _store(u: number, flag: number): void {
    const i = this._slot(u);
    this._ht[i] = this.t;
    this._hflag[i] = flag;
    const o = i * 9;
    const h = this._hpost;
    h[o] = this.x0;
    h[o + 1] = this.x1;
    h[o + 2] = this.x2;
    h[o + 3] = this.p00;
    h[o + 4] = this.p01;
    h[o + 5] = this.p02;
    h[o + 6] = this.p11;
    h[o + 7] = this.p12;
    h[o + 8] = this.p22;
  }

  /**
   * Measurement update followed by the detector's decisions at this update (outlier test of the update
   * `minEpochs − 1` back, then the jump test); a declaration recomputes the estimate from the history.
   */
  update(z: number, r: number, events: CoreEvents | undefined): boolean {
    const leftOut = this._measure(z, r, 0);
    this.liveNu = this.nu;
    this.liveS = this.s;
    if (this.detector) this._decide(events);
    return leftOut;
  }

  /** Runs the outlier decisions still pending (at the end of a record), with the innovations available. */
  flush(events: CoreEvents | undefined): void {
    const det = this.detector;
    if (!det) return;
    const last = this.updates - 1;
    for (let u = this._decided + 1; u <= last; u++) this._outlierDecision(u, last, events);
    this._decided = last;
  }

  private _decide(events: CoreEvents | undefined): void {
    const det = this.detector as GlrDetector;
    const k = this.updates - 1;
    const theta = k - (det.minEpochs - 1);
    for (let iter = 0; iter < 8; iter++) {
      if (theta > this._decided) {
        this._decided = theta;
        if (this._outlierDecision(theta, k, events)) continue;
      }
      const jump = det.testJump();
      if (!jump) return;
      if (events) events.jumps.push(jump);
      const variance = DIFFUSE * jump.sizeStd * jump.sizeStd;
      this._jumps.push({ update: jump.updateIndex, kind: jump.kind, size: jump.size, variance });
      this._barrier = jump.updateIndex + 1;
      this._replay(jump.updateIndex, k);
    }
  }

  /** Outlier decision for update θ at update k; replays when it changes what the filter used. Returns true if it replayed. */
  private _outlierDecision(theta: number, k: number, events: CoreEvents | undefined): boolean {
    if (theta < 0 || theta < k - this._cap + 2) return false;
    const det = this.detector as GlrDetector;
    const i = this._slot(theta);
    const out = this._hflag[i] === SKIP ? undefined : det.testOutlier(theta);
    const held = this._wasHeld(theta);
    if (out) {
      if (events) events.outliers.push(out);
      this._hflag[i] = SKIP;
      this._replay(Math.max(det.oldest(), 0, k - this._cap + 2), k);
      return true;
    }
    if (held) {
      this._replay(Math.max(Math.min(det.oldest(), theta), 0, k - this._cap + 2), k);
      return true;
    }
    return false;
  }

  private _wasHeld(u: number): boolean {
    const h = this._held.has(u);
    this._held.delete(u);
    return h;
  }

  /**
   * Recomputes updates `from` … `to` from the posterior of update `from − 1`, applying known steps,
   * declared jumps (mean += ν̂ at the jump epoch, variance of that component += DIFFUSE·σ²(ν̂): the jump
   * is re-estimated by the filter from the data after it, as Willsky & Jones's correction s += ν̂b,
   * P += bbᵀ/C does) and skipping declared outliers. Detector candidates are rebuilt; no decisions.
   */
  private _replay(from: number, to: number): void {
    const src = this._slot(from - 1) * 9;
    const h = this._hpost;
    this.t = at(this._ht, this._slot(from - 1), 'history epochs');
    // Slot `src` of the posterior ring: x0, x1, x2, p00, p01, p02, p11, p12, p22.
    const stored = (k: number): number => at(h, src + k, 'history posteriors');
    this.x0 = stored(0);
    this.x1 = stored(1);
    this.x2 = stored(2);
    this.p00 = stored(3);
    this.p01 = stored(4);
    this.p02 = stored(5);
    this.p11 = stored(6);
    this.p12 = stored(7);
    this.p22 = stored(8);
    this._steady = false;
    this._candidate = false;
    this._atPost = false;
    this._tau = Number.NaN;
    this._held.clear();
    if (this.detector) this.detector.clear();
    this.updates = from;
    const oldestKept = to - this._cap + 2;
    this._steps = this._steps.filter((st) => st.after >= oldestKept - 1);
    this._jumps = this._jumps.filter((j) => j.update >= oldestKept);
    for (let u = from; u <= to; u++) {
      const i = this._slot(u);
      this._applySteps(u - 1);
      this.predictTo(at(this._ht, i, 'history epochs'));
      for (const j of this._jumps) if (j.update === u) this._applyJump(j);
      const mode = this._hflag[i] === SKIP ? 2 : u > this._decided ? 0 : 1;
      this._measure(at(this._hz, i, 'history phases'), at(this._hr, i, 'history variances'), mode);
    }
  }

  private _applySteps(after: number): void {
    for (const st of this._steps) {
      if (st.after !== after) continue;
      this.predictTo(st.t);
      this.x0 += st.dx;
      this.x1 += st.dy;
      this.x2 += st.dd;
    }
  }

  private _applyJump(j: JumpEvent): void {
    if (j.kind === PHASE) {
      this.x0 += j.size;
      this.p00 += j.variance;
    } else if (j.kind === FREQUENCY) {
      this.x1 += j.size;
      this.p11 += j.variance;
    }
    this._steady = false;
    this._candidate = false;
    this._atPost = false;
  }

  /** Adds a known step at the current epoch (mean only) and remembers it for replays. */
  addStep(dx: number, dy: number, dd: number): void {
    this.x0 += dx;
    this.x1 += dy;
    this.x2 += dd;
    if (this.detector) this._steps.push({ after: this.updates - 1, t: this.t, dx, dy, dd });
  }
}

/** |a − b| ≤ STEADY_TOLERANCE·√(|pᵢᵢ pⱼⱼ|). */
function close(a: number, b: number, pii: number, pjj: number): boolean {
  return Math.abs(a - b) <= STEADY_TOLERANCE * Math.sqrt(Math.abs(pii * pjj));
}
