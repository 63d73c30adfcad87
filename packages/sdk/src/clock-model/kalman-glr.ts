/**
 * Generalised-likelihood-ratio (GLR) detector of phase jumps, frequency jumps and single-sample
 * outliers on the innovations of the clock Kalman filter, after Willsky & Jones, "A generalized
 * likelihood ratio approach to the detection and estimation of jumps in linear systems", IEEE Trans.
 * Autom. Control 21(1), 108–112 (1976) [M].
 *
 * For each candidate epoch θ (one per measurement update, the last `window` of them) and each kind
 * (phase step: unit step of x at θ; frequency step: unit step of y at θ; outlier: unit impulse on the
 * measurement at θ only) the innovation signature G_k = H b_k is tracked, where b is the effect of a unit
 * event on the prediction error: b ← Φ b at each time update, G = H b (G = 1 for the outlier at θ itself),
 * b ← b − K G at each measurement update with the gain K actually applied. With d = Σ G ν/S and
 * C = Σ G²/S over the innovations ν (variance S) since θ, the ML size is ν̂ = d/C (σ = 1/√C) and the
 * log-likelihood ratio is l = d²/C, which is χ²(1) under "no event" when the innovations are white.
 *
 * @internal
 * @module
 */

/** Kind index: phase step, frequency step, outlier (measurement impulse). */
export const PHASE = 0;
export const FREQUENCY = 1;
export const OUTLIER = 2;

/** Columns per candidate: b for the three kinds (3 × 3), then d (3), then C (3). */
const STRIDE = 15;
const D = 9;
const C = 12;

/** Required lead of the winning jump kind in l over the other kind: 2 ln 100 (odds 100:1); our own choice. */
export const KIND_MARGIN = 2 * Math.log(100);

/** A decision of the detector. */
export interface GlrDecision {
  /** 0 phase step, 1 frequency step, 2 outlier. */
  readonly kind: number;
  /** Update index of the candidate epoch θ. */
  readonly updateIndex: number;
  /** Epoch of θ, in seconds. */
  readonly epoch: number;
  /** ML size ν̂ = d/C (s for phase and outlier, dimensionless for frequency). */
  readonly size: number;
  /** σ of ν̂ = 1/√C. */
  readonly sizeStd: number;
  /** l = d²/C. */
  readonly statistic: number;
}

/**
 * Candidate store and decision rules; the filter core drives it. A numeric kernel run at every update:
 * candidates live in flat typed arrays (one STRIDE of `_rows` per ring slot), and every `]!` read is at a
 * slot < window (ring arithmetic modulo `window`) or at an offset < STRIDE within a slot, or at `input[0 … 4]`.
 */
export class GlrDetector {
  readonly window: number;
  readonly minEpochs: number;
  readonly jumps: boolean;
  readonly outliers: boolean;
  readonly jumpThreshold: number;
  readonly outlierThreshold: number;
  private readonly _rows: Float64Array;
  private readonly _count: Int32Array;
  private readonly _index: Float64Array;
  private readonly _epoch: Float64Array;
  private _head = 0;
  private _size = 0;

  constructor(
    window: number,
    minEpochs: number,
    jumps: boolean,
    outliers: boolean,
    jumpThreshold: number,
    outlierThreshold: number,
  ) {
    this.window = window;
    this.minEpochs = minEpochs;
    this.jumps = jumps;
    this.outliers = outliers;
    this.jumpThreshold = jumpThreshold;
    this.outlierThreshold = outlierThreshold;
    this._rows = new Float64Array(window * STRIDE);
    this._count = new Int32Array(window);
    this._index = new Float64Array(window);
    this._epoch = new Float64Array(window);
  }

  /** Forgets every candidate. */
  clear(): void {
    this._head = 0;
    this._size = 0;
    this._above = false;
  }

  /** Update index of the oldest candidate, or -1 when there is none. */
  oldest(): number {
    return this._size === 0 ? -1 : this._index[this._head]!;
  }

  /** Opens a candidate at update `updateIndex` (epoch in s), dropping the oldest when the window is full. */
  add(updateIndex: number, epoch: number): void {
    if (this._size === this.window) {
      this._head = (this._head + 1) % this.window;
      this._size -= 1;
    }
    const slot = (this._head + this._size) % this.window;
    this._size += 1;
    const r = this._rows;
    const o = slot * STRIDE;
    r.fill(0, o, o + STRIDE);
    r[o] = 1; // phase: unit step of x
    r[o + 4] = 1; // frequency: unit step of y (b index 3 + 1)
    this._count[slot] = 0;
    this._index[slot] = updateIndex;
    this._epoch[slot] = epoch;
  }

  /**
   * Inputs of {@link GlrDetector.propagate} (τ in [0]) and {@link GlrDetector.accumulate} (ν, S, K₀, K₁, K₂ in
   * [0] … [4]), written by the caller: passing doubles through a typed array avoids boxing them per call.
   */
  readonly input = new Float64Array(5);

  /** Time update of every signature by τ = input[0]: b ← Φ(τ) b, Φ = [[1, τ, τ²/2], [0, 1, τ], [0, 0, 1]]. */
  propagate(): void {
    const tau = this.input[0]!;
    const h = 0.5 * tau * tau;
    const r = this._rows;
    const w = this.window;
    for (let n = 0, s = this._head; n < this._size; n++) {
      const o = s * STRIDE;
      for (let k = o; k < o + 9; k += 3) {
        const b1 = r[k + 1]!;
        const b2 = r[k + 2]!;
        r[k] = r[k]! + tau * b1 + h * b2;
        r[k + 1] = b1 + tau * b2;
      }
      if (++s === w) s = 0;
    }
  }

  /**
   * Measurement update of every candidate with innovation ν (s), its variance S (s²) and the gain applied
   * (0 if not applied), read from `input`. Also records whether any step hypothesis old enough to be declared has l above
   * the jump threshold (d² > threshold·C), so that {@link GlrDetector.testJump} can return at once otherwise.
   */
  accumulate(): void {
    const inp = this.input;
    const nu = inp[0]!;
    const s = inp[1]!;
    const k0 = inp[2]!;
    const k1 = inp[3]!;
    const k2 = inp[4]!;
    const r = this._rows;
    const w = nu / s;
    const is = 1 / s;
    const win = this.window;
    const thr = this.jumpThreshold;
    let above = false;
    const m = this.minEpochs;
    const cnt = this._count;
    for (let n = 0, slot = this._head; n < this._size; n++) {
      const o = slot * STRIDE;
      const count = cnt[slot]! + 1;
      cnt[slot] = count;
      // Phase step (b at o … o+2) and frequency step (o+3 … o+5): G = H b.
      const gp = r[o]!;
      const gf = r[o + 3]!;
      // The outlier moves only its own measurement: G = 1 there, and b (0 before) then carries −K.
      const go = count === 1 ? 1 : r[o + 6]!;
      const dp = r[o + D]! + gp * w;
      const df = r[o + D + 1]! + gf * w;
      const cp = r[o + C]! + gp * gp * is;
      const cf = r[o + C + 1]! + gf * gf * is;
      r[o + D] = dp;
      r[o + D + 1] = df;
      r[o + D + 2] = r[o + D + 2]! + go * w;
      r[o + C] = cp;
      r[o + C + 1] = cf;
      r[o + C + 2] = r[o + C + 2]! + go * go * is;
      r[o] = gp - k0 * gp;
      r[o + 1] = r[o + 1]! - k1 * gp;
      r[o + 2] = r[o + 2]! - k2 * gp;
      r[o + 3] = gf - k0 * gf;
      r[o + 4] = r[o + 4]! - k1 * gf;
      r[o + 5] = r[o + 5]! - k2 * gf;
      r[o + 6] = r[o + 6]! - k0 * go;
      r[o + 7] = r[o + 7]! - k1 * go;
      r[o + 8] = r[o + 8]! - k2 * go;
      if (count >= m && (dp * dp > thr * cp || df * df > thr * cf)) above = true;
      if (++slot === win) slot = 0;
    }
    this._above = above;
  }

  /** Some eligible step hypothesis is above the jump threshold after the last accumulate. */
  private _above = false;

  private _statistic(o: number, kind: number): number {
    const c = this._rows[o + C + kind]!;
    if (!(c > 0)) return 0;
    const d = this._rows[o + D + kind]!;
    return (d * d) / c;
  }

  private _decision(slot: number, kind: number): GlrDecision {
    const o = slot * STRIDE;
    const c = this._rows[o + C + kind]!;
    const d = this._rows[o + D + kind]!;
    return {
      kind,
      updateIndex: this._index[slot]!,
      epoch: this._epoch[slot]!,
      size: d / c,
      sizeStd: 1 / Math.sqrt(c),
      statistic: (d * d) / c,
    };
  }

  /**
   * Outlier test of the candidate opened at update `updateIndex` (done once, `minEpochs − 1` updates
   * later): an outlier when its l exceeds the outlier threshold and neither step kind at the same
   * epoch explains the same innovations better.
   */
  testOutlier(updateIndex: number): GlrDecision | undefined {
    if (!this.outliers) return undefined;
    for (let n = 0, slot = this._head; n < this._size; n++, slot = slot + 1 === this.window ? 0 : slot + 1) {
      if (this._index[slot] !== updateIndex) continue;
      const o = slot * STRIDE;
      const lo = this._statistic(o, OUTLIER);
      if (lo <= this.outlierThreshold) return undefined;
      if (this.jumps && (this._statistic(o, PHASE) > lo || this._statistic(o, FREQUENCY) > lo)) return undefined;
      return this._decision(slot, OUTLIER);
    }
    return undefined;
  }

  /**
   * Jump test at the current update: the best step hypothesis with at least `minEpochs` innovations is
   * declared when its l exceeds the jump threshold, no hypothesis of any kind (younger ones and outliers
   * included) has a larger l, and the best hypothesis of the other step kind trails by KIND_MARGIN.
   */
  testJump(): GlrDecision | undefined {
    if (!this.jumps || !this._above) return undefined;
    let bestAll = 0;
    let bestPhase = 0;
    let bestFrequency = 0;
    let best = -1;
    let bestSlotKind = 0;
    let bestL = 0;
    for (let n = 0, slot = this._head; n < this._size; n++, slot = slot + 1 === this.window ? 0 : slot + 1) {
      const o = slot * STRIDE;
      const eligible = this._count[slot]! >= this.minEpochs;
      for (let kind = 0; kind < 3; kind++) {
        if (kind === OUTLIER && !this.outliers) continue;
        const l = this._statistic(o, kind);
        if (l > bestAll) bestAll = l;
        if (kind === OUTLIER) continue;
        if (kind === PHASE && l > bestPhase) bestPhase = l;
        if (kind === FREQUENCY && l > bestFrequency) bestFrequency = l;
        if (eligible && l > bestL) {
          bestL = l;
          best = slot;
          bestSlotKind = kind;
        }
      }
    }
    if (best < 0 || bestL <= this.jumpThreshold || bestL < bestAll) return undefined;
    if (bestL - (bestSlotKind === PHASE ? bestFrequency : bestPhase) < KIND_MARGIN) return undefined;
    return this._decision(best, bestSlotKind);
  }
}
