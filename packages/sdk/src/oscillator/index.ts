/** Oscillator frequency offsets and DDS tuning words. */
export { FLIGHT_CONFIGURATION_CAUTION } from '../caution.js';
export { type OffsetFrequency, offsetFrequency, requireFractionalOffset } from './offset.js';
export {
  type TuningWord, DDS_MIN_BITS, DDS_MAX_BITS, nearestTuningWord, tuningWordFrequency, fractionalResolution,
} from './dds.js';
