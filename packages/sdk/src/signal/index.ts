/** Signal-path terms a ground service removes before estimating a clock: Sagnac, Shapiro, light time. */
export { sagnacCorrection, sagnacDelayForArea, maximumSagnacCorrection } from './sagnac.js';
export { shapiroDelay, shapiroDelayBetween } from './shapiro.js';
export {
  type LightTimeOptions, type LightTimeSolution, type EarthFixedLightTimeSolution,
  solveLightTimeInertial, solveLightTimeEarthFixed,
} from './light-time.js';
