/**
 * UTC readings through one leap-second table: the day lengths, the TAI − UTC value in force, and
 * labels (day, second of day, fraction) of instants on any scale. The parts of
 * `createTimeScales(table)` that depend on the table.
 *
 * @internal
 */
import { OutOfDomainError } from '../errors.js';
import { at } from '../internal/checked.js';
import { civilFromDays, isoDateOfMjd, MAX_MJD, MIN_MJD } from './calendar.js';
import { INSTANT_EPOCH_MJD, Instant } from './instant.js';
import type { LeapSecondEntry, LeapSecondTable } from './leap-seconds.js';
import type { CalendarDateTime, SplitDays } from './scales-types.js';
import { floorDivMod, normalize } from './split.js';
import { instantFromUniformOrTcgLabel, type Label, labelOnUniformOrTcg, type TimeScale } from './uniform.js';

/** A validated leap-second table with the lookups every UTC conversion needs. */
export class UtcTable {
  readonly leapSeconds: LeapSecondTable;
  readonly entries: readonly LeapSecondEntry[];
  /** MJD of the first UTC day the table covers. */
  readonly firstMjd: number;
  /** First UTC day (MJD) the table does not cover. */
  readonly validUntilMjd: number;
  /** TAI seconds (SDK epoch) from which UTC readings exist. */
  readonly validFromTai: number;
  /** TAI seconds (SDK epoch) of the first instant the table does not cover. */
  readonly validUntilTai: number;
  /** TAI seconds (SDK epoch) at which each entry takes effect. */
  private readonly entryStartTai: readonly number[];
  private readonly validFromText: string;
  private readonly validToText: string;

  /** @param leapSeconds A table already checked by `defineLeapSecondTable` (at least one entry). */
  constructor(leapSeconds: LeapSecondTable) {
    this.leapSeconds = leapSeconds;
    this.entries = leapSeconds.entries;
    const [first] = this.entries;
    const last = this.entries.at(-1);
    if (first === undefined || last === undefined) throw new RangeError('a leap-second table has at least one entry');
    this.firstMjd = first.mjd;
    this.validUntilMjd = leapSeconds.validUntilMjd;
    this.entryStartTai = this.entries.map((e) => (e.mjd - INSTANT_EPOCH_MJD) * 86_400 + e.taiMinusUtc);
    this.validFromTai = (first.mjd - INSTANT_EPOCH_MJD) * 86_400 + first.taiMinusUtc;
    this.validUntilTai = (this.validUntilMjd - INSTANT_EPOCH_MJD) * 86_400 + last.taiMinusUtc;
    this.validFromText = `${isoDateOfMjd(this.firstMjd)}T00:00:00Z`;
    this.validToText = `${isoDateOfMjd(this.validUntilMjd)}T00:00:00Z (exclusive)`;
  }

  /** The error for a UTC reading before the table (`early`) or after its validity. */
  outOfDomain(argument: string, received: unknown, early: boolean): OutOfDomainError {
    return new OutOfDomainError(
      argument,
      received,
      this.validFromText,
      this.validToText,
      early
        ? 'UTC before 1972 had fractional TAI − UTC offsets and frequency steps ("rubber seconds"), which are not modelled; use TAI, TT or a GNSS scale'
        : `the leap-second table "${this.leapSeconds.source}" is only known complete until ${isoDateOfMjd(this.validUntilMjd)}; ` +
            'pass a current table: createTimeScales(parseLeapSecondsList(text)) or defineLeapSecondTable({...})',
    );
  }

  /** TAI − UTC of entry `i` (an index the caller found in the table), in seconds. */
  offsetOfEntry(i: number): number {
    const entry = this.entries[i];
    if (entry === undefined) throw new RangeError(`no leap-second entry ${i}`);
    return entry.taiMinusUtc;
  }

  /** Index of the entry in force on UTC day `mjd` (caller checked the range). */
  entryIndexOnDay(mjd: number): number {
    let i = this.entries.length - 1;
    while (i > 0 && at(this.entries, i, 'entries').mjd > mjd) i--;
    return i;
  }

  /** Length in seconds of UTC day `mjd`: 86400 ± 1 when the next day starts a new table entry. */
  utcDayLength(mjd: number): number {
    const i = this.entryIndexOnDay(mjd);
    const next = this.entries[i + 1];
    return next && next.mjd === mjd + 1 ? 86_400 + next.taiMinusUtc - this.offsetOfEntry(i) : 86_400;
  }

  /** Throws unless UTC day `mjd` lies inside the table. */
  requireUtcDay(argument: string, received: unknown, mjd: number): void {
    if (mjd < this.firstMjd) throw this.outOfDomain(argument, received, true);
    if (mjd >= this.validUntilMjd) throw this.outOfDomain(argument, received, false);
  }

  /** Entry index in force at a TAI instant, with the UTC validity check. */
  entryIndexAtInstant(instant: Instant): number {
    if (instant.taiSeconds < this.validFromTai) throw this.outOfDomain('instant', instant.toString(), true);
    if (instant.taiSeconds >= this.validUntilTai) throw this.outOfDomain('instant', instant.toString(), false);
    let i = this.entries.length - 1;
    while (i > 0 && at(this.entryStartTai, i, 'entryStartTai') > instant.taiSeconds) i--;
    return i;
  }

  /** TAI − UTC in force at an instant, in seconds (the value before the step during 23:59:60). */
  taiMinusUtc(instant: Instant): number {
    return this.offsetOfEntry(this.entryIndexAtInstant(instant));
  }

  /** UTC = TAI − (TAI − UTC), the table value in force (IERS Bulletin C; ITU-R TF.460 [M]); 23:59:60 labels an inserted second. */
  utcLabel(instant: Instant): Label {
    const i = this.entryIndexAtInstant(instant);
    const naive = instant.taiSeconds - this.offsetOfEntry(i);
    const next = this.entries[i + 1];
    if (next) {
      const nextDayStart = (next.mjd - INSTANT_EPOCH_MJD) * 86_400;
      // Inside an inserted second: UTC reads 23:59:60 of the day before the step.
      if (naive >= nextDayStart)
        return { day: next.mjd - 1, secondOfDay: 86_400 + (naive - nextDayStart), fraction: instant.taiFraction };
    }
    const [days, secondOfDay] = floorDivMod(naive, 86_400);
    return { day: days + INSTANT_EPOCH_MJD, secondOfDay, fraction: instant.taiFraction };
  }

  /** The reading of an instant on `scale` as a label. */
  labelOf(instant: Instant, scale: TimeScale): Label {
    return scale === 'UTC' ? this.utcLabel(instant) : labelOnUniformOrTcg(instant, scale);
  }

  /** Length of day `mjd` on `scale`, in seconds (86 400 except UTC days with a leap second). */
  dayLengthOn(scale: TimeScale, mjd: number): number {
    return scale === 'UTC' ? this.utcDayLength(mjd) : 86_400;
  }

  /** Instant of a label; `secondOfDay` must already be checked against the day length. */
  instantOfLabel(scale: TimeScale, label: Label, argument: string, received: unknown): Instant {
    if (label.day < MIN_MJD || label.day > MAX_MJD) {
      throw new OutOfDomainError(argument, received, '0001-01-01', '9999-12-31', 'outside the four-digit calendar');
    }
    if (scale !== 'UTC') return instantFromUniformOrTcgLabel(scale, label.day, label.secondOfDay, label.fraction);
    this.requireUtcDay(argument, received, label.day);
    // TAI = UTC + (TAI − UTC) of the UTC day; second 86400 of a leap day lands 1 s before the next midnight's TAI.
    const offset = this.offsetOfEntry(this.entryIndexOnDay(label.day));
    return Instant.fromNormalized(
      (label.day - INSTANT_EPOCH_MJD) * 86_400 + label.secondOfDay + offset,
      label.fraction,
    );
  }

  /** The last UTC days (ISO dates) that end with an inserted leap second, for messages. */
  leapSecondDays(): string[] {
    const days: string[] = [];
    this.entries.forEach((entry, i) => {
      const before = this.entries[i - 1];
      if (before !== undefined && entry.taiMinusUtc > before.taiMinusUtc) days.push(isoDateOfMjd(entry.mjd - 1));
    });
    return days;
  }
}

/** Throws unless a label's day lies in years 1..9999. */
export function checkedCalendarLabel(label: Label, instant: Instant): Label {
  if (label.day < MIN_MJD || label.day > MAX_MJD) {
    throw new OutOfDomainError(
      'instant',
      instant.toString(),
      '0001-01-01',
      '9999-12-31',
      'outside the four-digit calendar',
    );
  }
  return label;
}

/** Calendar fields of a label; second 86 400 of a day (a leap second) reads 23:59:60. */
export function fieldsOfLabel(label: Label): CalendarDateTime {
  const { year, month, day } = civilFromDays(label.day - 40_587);
  let hour: number;
  let minute: number;
  let second: number;
  if (label.secondOfDay >= 86_400) {
    hour = 23;
    minute = 59;
    second = 60 + (label.secondOfDay - 86_400);
  } else {
    hour = Math.floor(label.secondOfDay / 3600);
    minute = Math.floor((label.secondOfDay - hour * 3600) / 60);
    second = label.secondOfDay - hour * 3600 - minute * 60;
  }
  // The double sum can round 59 + 0.999999999999999 up to 60; keep it below the next whole second.
  let secondWithFraction = second + label.fraction;
  if (secondWithFraction >= second + 1) secondWithFraction = (second + 1) * (1 - Number.EPSILON / 2);
  return Object.freeze({ year, month, day, hour, minute, second: secondWithFraction });
}

/** A day count as a normalised split (integer day, fraction in [0, 1)) plus their sum. */
export function splitDays(day: number, fraction: number): SplitDays {
  const split = normalize(day, fraction);
  return Object.freeze({ day: split.whole, fraction: split.fraction, value: split.whole + split.fraction });
}
