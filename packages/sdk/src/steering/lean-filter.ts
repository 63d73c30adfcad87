/**
 * A lean 3-state clock Kalman filter for the closed-loop Monte Carlo: the same equations as
 * `ClockKalmanFilter` (clock-model/kalman.ts) — time update s⁻ = Φs, P⁻ = ΦPΦᵀ + Q(τ)
 * (Zucca & Tavella 2005, physics-refs §11; Kalman 1960 [M]), measurement update of the phase
 * with K = P⁻Hᵀ/S, S = P⁻₁₁ + R, P = (I − KH)P⁻(I − KH)ᵀ + KRKᵀ (Joseph form) — written out on
 * flat arrays with Φ and Q cached per interval, without input validation, outlier gate or jump
 * detector. The closed-loop tests hold it equal to ClockKalmanFilter.
 *
 * @internal
 */
import { type DiffusionCoefficients, type Matrix3, processNoise, transition } from './clock-math.js';

export class LeanClockFilter {
  t: number;
  /** Mean [x, y, d]. */
  readonly s: [number, number, number] = [0, 0, 0];
  /** Covariance, row-major 3×3. */
  readonly p = new Float64Array(9);
  private readonly _q: DiffusionCoefficients;
  private readonly _cache = new Map<number, { phi: Matrix3; q: Matrix3 }>();
  private readonly _tmp = new Float64Array(9);

  constructor(t: number, state: readonly number[], covariance: Matrix3, q: DiffusionCoefficients) {
    this.t = t;
    this._q = q;
    for (let i = 0; i < 3; i++) {
      this.s[i] = state[i]!;
      for (let j = 0; j < 3; j++) this.p[3 * i + j] = covariance[i]![j]!;
    }
  }

  predict(t: number): void {
    const tau = t - this.t;
    if (!(tau > 0)) return;
    let c = this._cache.get(tau);
    if (!c) {
      c = { phi: transition(tau), q: processNoise(tau, this._q) };
      this._cache.set(tau, c);
    }
    const { phi, q } = c;
    const s = this.s;
    const s0 = s[0]!;
    const s1 = s[1]!;
    const s2 = s[2]!;
    s[0] = phi[0][0] * s0 + phi[0][1] * s1 + phi[0][2] * s2;
    s[1] = phi[1][0] * s0 + phi[1][1] * s1 + phi[1][2] * s2;
    s[2] = phi[2][0] * s0 + phi[2][1] * s1 + phi[2][2] * s2;
    const p = this.p;
    const a = this._tmp; // a = Φ P
    for (let i = 0; i < 3; i++) {
      for (let j = 0; j < 3; j++)
        a[3 * i + j] = phi[i]![0]! * p[j]! + phi[i]![1]! * p[3 + j]! + phi[i]![2]! * p[6 + j]!;
    }
    for (let i = 0; i < 3; i++) {
      for (let j = 0; j < 3; j++)
        p[3 * i + j] = a[3 * i]! * phi[j]![0]! + a[3 * i + 1]! * phi[j]![1]! + a[3 * i + 2]! * phi[j]![2]! + q[i]![j]!;
    }
    this.t = t;
  }

  applyStep(dx: number, dy: number): void {
    this.s[0] += dx;
    this.s[1] += dy;
  }

  update(z: number, r: number): void {
    const p = this.p;
    const sInn = p[0]! + r;
    const nu = z - this.s[0]!;
    const k0 = p[0]! / sInn;
    const k1 = p[3]! / sInn;
    const k2 = p[6]! / sInn;
    this.s[0] += k0 * nu;
    this.s[1] += k1 * nu;
    this.s[2] += k2 * nu;
    // Joseph form with H = [1, 0, 0]: (I − KH) P (I − KH)ᵀ + K R Kᵀ.
    const k = [k0, k1, k2];
    const a = this._tmp; // a = (I − KH) P
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) a[3 * i + j] = p[3 * i + j]! - k[i]! * p[j]!;
    for (let i = 0; i < 3; i++) {
      for (let j = 0; j < 3; j++) p[3 * i + j] = a[3 * i + j]! - a[3 * i]! * k[j]! + k[i]! * r * k[j]!;
    }
  }

  covariance(): Matrix3 {
    const p = this.p;
    return [
      [p[0]!, p[1]!, p[2]!],
      [p[3]!, p[4]!, p[5]!],
      [p[6]!, p[7]!, p[8]!],
    ];
  }
}
