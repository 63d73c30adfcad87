/**
 * Calendar time axis shared by the time charts (`<tauline-steering-schedule>`, `<tauline-fleet-timeline>`):
 * UTC tick positions and labels for chart times (elapsed SI seconds since an epoch) through the SDK's time
 * scales, so a leap second inside the horizon moves the ticks as the SDK says (no leap-second table and no
 * `Date` arithmetic of our own). Pure, no DOM.
 *
 * @module
 */

import type { Instant, TimeScales } from '@tauline/sdk/time';
import { calendarDateFromMjd } from '@tauline/sdk/time';

/** The epoch and time scales the chart times count from. */
export interface TimeBase {
  epoch: Instant;
  timeScales: TimeScales;
}

/** A tick: chart time (s since the epoch) and its label (optional second line). */
export interface CalendarTick {
  value: number;
  label: string;
  sub: string | null;
}

const pad = (n: number): string => String(n).padStart(2, '0');

const DAY = 86400;

/**
 * Candidate tick steps of the steering schedule, seconds: sub-day steps divide a UTC day, longer steps are
 * whole days (common practice, no source).
 */
export const SCHEDULE_STEPS_SECONDS: readonly number[] = [
  1,
  2,
  5,
  10,
  15,
  30,
  60,
  120,
  300,
  600,
  900,
  1800,
  3600,
  7200,
  10800,
  21600,
  43200,
  DAY,
  2 * DAY,
  7 * DAY,
  14 * DAY,
  30 * DAY,
  90 * DAY,
  365 * DAY,
];

/** Candidate tick steps of the fleet timeline, seconds: 1, 2, 3, 6, 12 h, then 1, 2, 4, 7 days (common practice, no source). */
export const FLEET_STEPS_SECONDS: readonly number[] = [1, 2, 3, 6, 12, 24, 48, 96, 168].map((h) => h * 3600);

/** At most this many ticks, whatever the span (a guard; the step keeps the count near the one asked). */
const MAX_TICKS = 1000;

/**
 * UTC reading of a chart time to the nearest second, `YYYY-MM-DD HH:MM UTC` (`:SS` when `seconds` or not on a
 * whole minute), from the SDK's ISO 8601 text (`formatIso`, which carries into minutes and days and reads an
 * inserted leap second as 23:59:60). `—` for a time that is not finite or outside the time scales' table.
 */
export function formatChartUtc(base: TimeBase, t: number, seconds = false): string {
  if (!Number.isFinite(t)) return '—';
  let text: string;
  try {
    text = base.timeScales.formatIso(base.epoch.plus(t), { fractionDigits: 0 }); // YYYY-MM-DDThh:mm:ssZ
  } catch {
    return '—';
  }
  const hm = text.slice(0, 16).replace('T', ' '),
    s = text.slice(17, 19);
  return seconds || s !== '00' ? `${hm}:${s} UTC` : `${hm} UTC`;
}

/** The chart time of 00:00 UTC on the day `mjd` (UTC modified Julian day). */
function midnight(base: TimeBase, mjd: number): number {
  const { year, month, day } = calendarDateFromMjd(mjd);
  return base.timeScales.fromCalendar({ year, month, day, hour: 0 }, 'UTC').secondsSince(base.epoch);
}

/** `HH:MM` (`HH:MM:SS` for steps under a minute) of a second of the UTC day; 86 400 reads 23:59:60 (leap second). */
function clockLabel(secondOfDay: number, stepSeconds: number): string {
  const h = Math.min(23, Math.floor(secondOfDay / 3600));
  const m = Math.min(59, Math.floor((secondOfDay - h * 3600) / 60));
  const s = Math.round(secondOfDay - h * 3600 - m * 60);
  return stepSeconds < 60 ? `${pad(h)}:${pad(m)}:${pad(s)}` : `${pad(h)}:${pad(m)}`;
}

/**
 * Ticks inside [t0, t1] (chart seconds), about `count` of them, at the first of `steps` (seconds) giving at
 * most (t1 − t0)/count per interval (whole days beyond the last). A sub-day step counts from each UTC
 * midnight, so the ticks sit on round UTC clock times (a leap second, 23:59:60, gets a tick at the 1 s step);
 * a step of n days falls on UTC midnights whose MJD is a multiple of n. Labels: `MM-DD` for day steps;
 * `HH:MM` (`HH:MM:SS` under a minute) otherwise, with the date `YYYY-MM-DD` under midnight. Empty when
 * the span is not finite or lies outside the time scales' table.
 */
export function calendarTicks(
  base: TimeBase,
  t0: number,
  t1: number,
  count: number,
  steps: readonly number[] = SCHEDULE_STEPS_SECONDS,
): CalendarTick[] {
  const lo = Math.min(t0, t1),
    hi = Math.max(t0, t1);
  const out: CalendarTick[] = [];
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) return out;
  const perTick = (hi - lo) / Math.max(1, count);
  const step = steps.find((s) => s >= perTick) ?? DAY * Math.ceil(perTick / DAY);
  try {
    const startMjd = base.timeScales.toMjd(base.epoch.plus(lo), 'UTC').day;
    if (step >= DAY) dayTicks(base, startMjd, lo, hi, Math.round(step / DAY), out);
    else clockTicks(base, startMjd, lo, hi, step, out);
  } catch {
    // Outside the time scales' table: the ticks found so far (none when the span starts outside).
  }
  return out;
}

/** Midnight ticks every `dayStep` days (MJD a multiple of `dayStep`) inside [lo, hi]. */
function dayTicks(base: TimeBase, startMjd: number, lo: number, hi: number, dayStep: number, out: CalendarTick[]) {
  for (let mjd = Math.ceil(startMjd / dayStep) * dayStep; out.length < MAX_TICKS; mjd += dayStep) {
    const t = midnight(base, mjd);
    if (t > hi) return;
    if (t < lo) continue;
    const { month, day } = calendarDateFromMjd(mjd);
    out.push({ value: t, label: `${pad(month)}-${pad(day)}`, sub: null });
  }
}

/** Ticks every `step` seconds (a divisor of a day) from each UTC midnight, inside [lo, hi]. */
function clockTicks(base: TimeBase, startMjd: number, lo: number, hi: number, step: number, out: CalendarTick[]) {
  let dayStart = midnight(base, startMjd);
  for (let mjd = startMjd; dayStart <= hi && out.length < MAX_TICKS; mjd += 1) {
    const next = midnight(base, mjd + 1); // 86 400 s later, or 86 401 s across an inserted leap second
    for (let k = Math.max(0, Math.ceil((lo - dayStart) / step)); out.length < MAX_TICKS; k += 1) {
      const secondOfDay = k * step;
      const t = dayStart + secondOfDay;
      // Second 86 400 of a day is an inserted leap second (23:59:60): a tick only at the 1 s step, where it is one.
      if (t >= next || t > hi || (secondOfDay >= DAY && step > 1)) break;
      const { year, month, day } = calendarDateFromMjd(mjd);
      const sub = secondOfDay === 0 ? `${year}-${pad(month)}-${pad(day)}` : null;
      out.push({ value: t, label: clockLabel(secondOfDay, step), sub });
    }
    dayStart = next;
  }
}
