import { BUNDLED_LEAP_SECONDS, createTimeScales, type Instant } from '@tauline/sdk/time';

/** The invented epoch of t = 0 that the clock-model tests' series carry (its value does not enter the numerics). */
export const EPOCH: Instant = createTimeScales(BUNDLED_LEAP_SECONDS).parseIso('2027-02-08T06:00:00', 'GPS');
