/**
 * The clock filter's posterior as a public {@link ClockEstimate}, shared by the step-by-step filter and the batch run.
 *
 * @internal
 * @module
 */
import type { FilterCore } from './kalman-core.js';
import type { ClockEstimate } from './kalman-types.js';

/** The filter's posterior mean and covariance as a {@link ClockEstimate} (2 or 3 states). */
export function estimateOf(c: FilterCore, states: 2 | 3): ClockEstimate {
  if (states === 2) {
    return {
      t: c.t,
      state: [c.x0, c.x1],
      covariance: [
        [c.p00, c.p01],
        [c.p01, c.p11],
      ],
    };
  }
  return {
    t: c.t,
    state: [c.x0, c.x1, c.x2],
    covariance: [
      [c.p00, c.p01, c.p02],
      [c.p01, c.p11, c.p12],
      [c.p02, c.p12, c.p22],
    ],
  };
}
