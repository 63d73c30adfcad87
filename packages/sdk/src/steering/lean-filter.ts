/**
 * A lean 3-state clock Kalman filter for the closed-loop Monte Carlo: the same equations as
 * `ClockKalmanFilter` (clock-model/kalman.ts) — time update s⁻ = Φs, P⁻ = ΦPΦᵀ + Q(τ)
 * (Zucca & Tavella 2005, physics-refs §11; Kalman 1960 [M]), measurement update of the phase
 * with K = P⁻Hᵀ/S, S = P⁻₁₁ + R, P = (I − KH)P⁻(I − KH)ᵀ + KRKᵀ (Joseph form) — written out
 * element by element on named fields, with Φ and Q cached per interval, without input validation,
 * outlier gate or jump detector. The closed-loop tests hold it equal to ClockKalmanFilter.
 *
 * @internal
 */
import { type ClockState, type DiffusionCoefficients, type Matrix3, processNoise, transition } from './clock-math.js';

/**
 * The filter above. The covariance is held as nine named fields `pij` (row i, column j; 0 phase,
 * 1 frequency, 2 drift), all nine kept because the Joseph form is symmetric only to rounding; the
 * products are written out in the order of the row-by-row loops they replace, so the estimates are
 * unchanged to the last bit.
 */
export class LeanClockFilter {
  t: number;
  /** Mean [x, y, d]. */
  readonly s: ClockState;
  private p00: number;
  private p01: number;
  private p02: number;
  private p10: number;
  private p11: number;
  private p12: number;
  private p20: number;
  private p21: number;
  private p22: number;
  private readonly _q: DiffusionCoefficients;
  private readonly _cache = new Map<number, { phi: Matrix3; q: Matrix3 }>();

  constructor(t: number, state: Readonly<ClockState>, covariance: Readonly<Matrix3>, q: DiffusionCoefficients) {
    this.t = t;
    this._q = q;
    this.s = [state[0], state[1], state[2]];
    [[this.p00, this.p01, this.p02], [this.p10, this.p11, this.p12], [this.p20, this.p21, this.p22]] = covariance;
  }

  /** Time update to t: s⁻ = Φs, P⁻ = ΦPΦᵀ + Q(τ), τ = t − this.t (nothing when τ ≤ 0). */
  predict(t: number): void {
    const tau = t - this.t;
    if (!(tau > 0)) return;
    let c = this._cache.get(tau);
    if (!c) {
      c = { phi: transition(tau), q: processNoise(tau, this._q) };
      this._cache.set(tau, c);
    }
    const { phi, q } = c;
    const [f0, f1, f2] = phi;
    const s = this.s;
    const [s0, s1, s2] = s;
    s[0] = f0[0] * s0 + f0[1] * s1 + f0[2] * s2;
    s[1] = f1[0] * s0 + f1[1] * s1 + f1[2] * s2;
    s[2] = f2[0] * s0 + f2[1] * s1 + f2[2] * s2;
    // a = Φ P
    const a00 = f0[0] * this.p00 + f0[1] * this.p10 + f0[2] * this.p20;
    const a01 = f0[0] * this.p01 + f0[1] * this.p11 + f0[2] * this.p21;
    const a02 = f0[0] * this.p02 + f0[1] * this.p12 + f0[2] * this.p22;
    const a10 = f1[0] * this.p00 + f1[1] * this.p10 + f1[2] * this.p20;
    const a11 = f1[0] * this.p01 + f1[1] * this.p11 + f1[2] * this.p21;
    const a12 = f1[0] * this.p02 + f1[1] * this.p12 + f1[2] * this.p22;
    const a20 = f2[0] * this.p00 + f2[1] * this.p10 + f2[2] * this.p20;
    const a21 = f2[0] * this.p01 + f2[1] * this.p11 + f2[2] * this.p21;
    const a22 = f2[0] * this.p02 + f2[1] * this.p12 + f2[2] * this.p22;
    // P⁻ = a Φᵀ + Q
    this.p00 = a00 * f0[0] + a01 * f0[1] + a02 * f0[2] + q[0][0];
    this.p01 = a00 * f1[0] + a01 * f1[1] + a02 * f1[2] + q[0][1];
    this.p02 = a00 * f2[0] + a01 * f2[1] + a02 * f2[2] + q[0][2];
    this.p10 = a10 * f0[0] + a11 * f0[1] + a12 * f0[2] + q[1][0];
    this.p11 = a10 * f1[0] + a11 * f1[1] + a12 * f1[2] + q[1][1];
    this.p12 = a10 * f2[0] + a11 * f2[1] + a12 * f2[2] + q[1][2];
    this.p20 = a20 * f0[0] + a21 * f0[1] + a22 * f0[2] + q[2][0];
    this.p21 = a20 * f1[0] + a21 * f1[1] + a22 * f1[2] + q[2][1];
    this.p22 = a20 * f2[0] + a21 * f2[1] + a22 * f2[2] + q[2][2];
    this.t = t;
  }

  applyStep(dx: number, dy: number): void {
    this.s[0] += dx;
    this.s[1] += dy;
  }

  /** Measurement update with a phase measurement z (s) of variance r (s²). */
  update(z: number, r: number): void {
    const sInn = this.p00 + r;
    const nu = z - this.s[0];
    const k0 = this.p00 / sInn;
    const k1 = this.p10 / sInn;
    const k2 = this.p20 / sInn;
    this.s[0] += k0 * nu;
    this.s[1] += k1 * nu;
    this.s[2] += k2 * nu;
    // Joseph form with H = [1, 0, 0]: (I − KH) P (I − KH)ᵀ + K R Kᵀ; first a = (I − KH) P.
    const a00 = this.p00 - k0 * this.p00;
    const a01 = this.p01 - k0 * this.p01;
    const a02 = this.p02 - k0 * this.p02;
    const a10 = this.p10 - k1 * this.p00;
    const a11 = this.p11 - k1 * this.p01;
    const a12 = this.p12 - k1 * this.p02;
    const a20 = this.p20 - k2 * this.p00;
    const a21 = this.p21 - k2 * this.p01;
    const a22 = this.p22 - k2 * this.p02;
    this.p00 = a00 - a00 * k0 + k0 * r * k0;
    this.p01 = a01 - a00 * k1 + k0 * r * k1;
    this.p02 = a02 - a00 * k2 + k0 * r * k2;
    this.p10 = a10 - a10 * k0 + k1 * r * k0;
    this.p11 = a11 - a10 * k1 + k1 * r * k1;
    this.p12 = a12 - a10 * k2 + k1 * r * k2;
    this.p20 = a20 - a20 * k0 + k2 * r * k0;
    this.p21 = a21 - a20 * k1 + k2 * r * k1;
    this.p22 = a22 - a20 * k2 + k2 * r * k2;
  }

  /** The covariance P as rows (a fresh matrix). */
  covariance(): Matrix3 {
    return [
      [this.p00, this.p01, this.p02],
      [this.p10, this.p11, this.p12],
      [this.p20, this.p21, this.p22],
    ];
  }
}
