/**
 * Named-field state of the clock Kalman core (kalman-core.ts): the covariance's upper triangle, the
 * frozen steady-state update and a state prediction. Fields start as doubles so that V8 keeps them
 * unboxed-in-place (as FilterCore's own fields do).
 *
 * @internal
 */

/** A mutable upper triangle of the 3×3 covariance; fields start as doubles, as FilterCore's do. */
export class UpperTriangle {
  p00 = Number.NaN;
  p01 = Number.NaN;
  p02 = Number.NaN;
  p11 = Number.NaN;
  p12 = Number.NaN;
  p22 = Number.NaN;
}

/** The steady-state measurement update, frozen once the filter has converged: gain, S and posterior. */
export class FrozenUpdate {
  k0 = Number.NaN;
  k1 = Number.NaN;
  k2 = Number.NaN;
  s = Number.NaN;
  readonly posterior = new UpperTriangle();
}

/** A prediction of the filter state, with the standard deviations of its components (written by `peek`). */
export interface StatePrediction {
  /** Phase x (s), fractional frequency y, drift d (1/s). */
  phase: number;
  frequency: number;
  drift: number;
  /** √P₁₁ (s), √P₂₂, √P₃₃ (1/s). */
  phaseStd: number;
  frequencyStd: number;
  driftStd: number;
}
