/** Signal-path terms a ground service removes before estimating a clock: Sagnac, Shapiro, light time. */

export {
  type EarthFixedLightTimeSolution,
  type LightTimeOptions,
  type LightTimeSolution,
  solveLightTimeEarthFixed,
  solveLightTimeInertial,
} from './light-time.js';
export { maximumSagnacCorrection, sagnacCorrection, sagnacDelayForArea } from './sagnac.js';
export { shapiroDelay, shapiroDelayBetween } from './shapiro.js';
