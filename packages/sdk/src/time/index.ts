/**
 * Time scales: split-precision instants on TAI; TT, UTC (explicit leap-second table), GPS,
 * Galileo and BeiDou system times, TCG; ISO 8601 text, MJD/JD, GNSS weeks.
 *
 * @module
 */

export type { CalendarDate } from './calendar.js';
export {
  calendarDateFromMjd,
  daysInMonth,
  isGregorianLeapYear,
  MAX_CALENDAR_YEAR,
  MAX_MJD,
  MIN_CALENDAR_YEAR,
  MIN_MJD,
  mjdFromCalendarDate,
} from './calendar.js';
export type { FileEpochFields, FileTimeScale, FormatFileEpochOptions, OrbitScale } from './file-epochs.js';
export {
  FILE_TIME_SYSTEM_CODES,
  fileTimeScale,
  formatFileEpoch,
  instantFromFileEpoch,
  instantFromScaleSeconds,
  scaleSecondsFromInstant,
} from './file-epochs.js';
export type { PreciseSeconds } from './instant.js';
export { INSTANT_EPOCH_MJD, Instant, MAX_ABS_TAI_SECONDS } from './instant.js';
export { instantFromTtSecondsSinceJ2000, J2000_EPOCH, ttSecondsSinceJ2000 } from './j2000.js';
export type { LeapSecondEntry, LeapSecondTable, LeapSecondTableSpec } from './leap-seconds.js';
export {
  BUNDLED_LEAP_SECONDS,
  defineLeapSecondTable,
  parseLeapSecondsList,
  UTC_LEAP_SECOND_ERA_START_MJD,
} from './leap-seconds.js';
export type { CalendarDateTime, CalendarDateTimeInput, FormatIsoOptions, SplitDays, TimeScales } from './scales.js';
export { createTimeScales } from './scales.js';
export type { TimeScale, UniformScale } from './uniform.js';
export {
  BDT_MINUS_TAI,
  GPS_MINUS_TAI,
  GST_MINUS_TAI,
  TCG_EPOCH_MJD_TAI,
  TCG_RATE_VS_TT,
  TIME_SCALES,
} from './uniform.js';
export type { WeekSeconds, WeekSystem } from './weeks.js';
export {
  BROADCAST_WEEK_BITS,
  instantFromWeekSeconds,
  resolveBroadcastWeek,
  resolveBroadcastWeekNear,
  WEEK_EPOCH_MJD,
  weekSecondsFromInstant,
} from './weeks.js';
