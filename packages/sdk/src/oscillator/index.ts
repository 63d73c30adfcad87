/** Oscillator frequency offsets and DDS tuning words. */
export { FLIGHT_CONFIGURATION_CAUTION } from '../caution.js';
export {
  DDS_MAX_BITS,
  DDS_MIN_BITS,
  fractionalResolution,
  nearestTuningWord,
  type TuningWord,
  tuningWordFrequency,
} from './dds.js';
export { type OffsetFrequency, offsetFrequency, requireFractionalOffset } from './offset.js';
