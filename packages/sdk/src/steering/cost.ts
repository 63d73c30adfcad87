/**
 * The expected steering cost that both planners are compared on:
 *
 *   J = (1/(b² H)) ∫₀^H E[x(t)²] dt + Σ_freq w_f (u/u_max)² + Σ_phase w_p (p/b)² + w_c · (number of commands)
 *
 * with E[x²] = m(t)² + σ(t)² (mean and open-loop variance of the steered offset), b the
 * tolerance, H the horizon, u_max the largest frequency step. This is the finite-horizon
 * quadratic cost of linear-quadratic-Gaussian steering (Koppang & Leland, IEEE Trans. UFFC
 * 46(3) 517–522, 1999, physics-refs §12 [V2 abstract]) plus a per-command charge of our own.
 * The integral is evaluated exactly: the noise-free phase is piecewise quadratic between jumps.
 *
 * @module
 */
import { frobenius3, phaseSquareIntegral, propagateMean, quadForm3 } from './clock-math.js';
import { type InternalCommand, stateJumps } from './predict.js';
import type { NormalizedScenario } from './scenario.js';

/** J split into its parts (all dimensionless). */
export interface CostBreakdown {
  /** (1/(b²H)) ∫ m² dt. */
  meanSquare: number;
  /** (1/(b²H)) ∫ σ² dt (the same for every schedule: commands do not change σ). */
  variance: number;
  /** Σ of the step and per-command charges. */
  control: number;
  total: number;
}

/** Expected cost J of a schedule (see the module comment). */
export function expectedCost(norm: NormalizedScenario, commands: readonly InternalCommand[]): CostBreakdown {
  const jumps = stateJumps(norm, commands);
  const h = norm.horizon;
  const scale = 1 / (norm.bound * norm.bound * h);
  let state: [number, number, number] = [...norm.state0];
  let t = 0;
  let meanSquare = 0;
  const advance = (to: number): void => {
    const delta = to - t;
    if (delta > 0) {
      // ∫₀^Δ (φ(s)·state)² ds, φ(s) = [1, s, s²/2].
      meanSquare += quadForm3(state, phaseSquareIntegral(delta));
      state = propagateMean(state, delta);
      t = to;
    }
  };
  for (const j of jumps) {
    if (j.t >= h) break;
    advance(j.t);
    state[0] += j.dx;
    state[1] += j.dy;
  }
  advance(h);
  const m = phaseSquareIntegral(h);
  const initial = frobenius3(norm.covariance0, m);
  const { q1, q2, q3 } = norm.noise;
  // ∫₀^H (q1 t + q2 t³/3 + q3 t⁵/20) dt, from the Q11 entry of Zucca & Tavella (2005).
  const noise = (q1 * h * h) / 2 + (q2 * h ** 4) / 12 + (q3 * h ** 6) / 120;
  let control = 0;
  for (const c of commands) {
    control += norm.weights.command;
    control +=
      c.kind === 'frequency'
        ? norm.weights.frequencyStep * (c.amount / norm.actuator.maxStep) ** 2
        : norm.weights.phaseStep * (c.amount / norm.bound) ** 2;
  }
  const meanPart = meanSquare * scale;
  const variance = (initial + noise) * scale;
  return { meanSquare: meanPart, variance, control, total: meanPart + variance + control };
}
