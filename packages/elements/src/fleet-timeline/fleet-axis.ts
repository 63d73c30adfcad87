/**
 * Calendar time axis of `<tauline-fleet-timeline>`: UTC tick positions and labels for chart times
 * (elapsed SI seconds since the fleet epoch) through the SDK's time scales, so a leap second inside
 * the horizon moves the ticks as the SDK says (no leap-second table of our own). Pure, no DOM.
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

/** Candidate steps, hours: sub-day steps divide 24 (common practice, no source); whole days beyond. */
const HOUR_STEPS = [1, 2, 3, 6, 12, 24, 48, 96, 168];

/** UTC reading of a chart time, `YYYY-MM-DD HH:MM UTC` (`:SS` when `seconds`). */
export function formatChartUtc(base: TimeBase, t: number, seconds = false): string {
  if (!Number.isFinite(t)) return '—';
  try {
    const c = base.timeScales.toCalendar(base.epoch.plus(t), 'UTC');
    const s = Math.floor(c.second + 1e-6);
    const hm = `${c.year}-${pad(c.month)}-${pad(c.day)} ${pad(c.hour)}:${pad(c.minute)}`;
    return seconds || s !== 0 ? `${hm}:${pad(s)} UTC` : `${hm} UTC`;
  } catch {
    return '—';
  }
}

/**
 * Ticks at whole UTC hours (1, 2, 3, 6 or 12 h) or at UTC midnights (every 1, 2, 4 or 7 days)
 * inside [t0, t1], about `count` of them. Labels: `MM-DD` for day steps; `HH:MM` for hour steps,
 * with the date under midnight.
 */
export function calendarTicks(base: TimeBase, t0: number, t1: number, count: number): CalendarTick[] {
  const { timeScales, epoch } = base;
  const spanHours = Math.max(0, t1 - t0) / 3600;
  const perTick = spanHours / Math.max(1, count);
  const stepHours = HOUR_STEPS.find((h) => h >= perTick) ?? 24 * Math.ceil(perTick / 24);
  const out: CalendarTick[] = [];
  let startMjd: number;
  try {
    startMjd = timeScales.toMjd(epoch.plus(t0), 'UTC').day;
  } catch {
    return out;
  }
  const dayStep = Math.max(1, Math.round(stepHours / 24));
  for (let mjd = startMjd; out.length < 400; mjd += 1) {
    if (stepHours >= 24 && mjd % dayStep !== 0) continue; // steps of days fall on whole multiples of the MJD
    const date = calendarDateFromMjd(mjd);
    const hours = stepHours >= 24 ? [0] : Array.from({ length: 24 / stepHours }, (_, k) => k * stepHours);
    let past = false;
    for (const hour of hours) {
      const at = timeScales.fromCalendar({ year: date.year, month: date.month, day: date.day, hour }, 'UTC');
      const t = at.secondsSince(epoch);
      if (t > t1) {
        past = true;
        break;
      }
      if (t < t0) continue;
      const ymd = `${date.year}-${pad(date.month)}-${pad(date.day)}`;
      if (stepHours >= 24) out.push({ value: t, label: `${pad(date.month)}-${pad(date.day)}`, sub: null });
      else out.push({ value: t, label: `${pad(hour)}:00`, sub: hour === 0 ? ymd : null });
    }
    if (past) break;
  }
  return out;
}
