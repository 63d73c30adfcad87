/**
 * Minimal ISO 8601 UTC handling for steering scenarios: parse a timestamp to milliseconds
 * since 1970-01-01T00:00:00Z and format it back. Scheduling needs whole-second precision at
 * best, so one float64 of milliseconds (resolution ~0.2 µs today) is ample here; clock
 * *offsets* never pass through this file.
 *
 * Leap seconds: differences between two UTC stamps are taken on the POSIX scale, i.e. a leap
 * second inside a plan's horizon is not counted (an error of 1 s in a schedule of days, below
 * any command-spacing limit). Stamps at second 60 are rejected.
 *
 * @internal
 */
import { InvalidArgumentError } from '../errors.js';

const ISO_UTC = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2})(\.\d{1,9})?)?(Z|[+-]\d{2}:\d{2})$/;

/**
 * Parses an ISO 8601 date-time with an explicit zone (`Z` or `±hh:mm`) into milliseconds
 * since the Unix epoch.
 *
 * @param field  Field path used in the error (e.g. `contacts[2].end`).
 * @param text   The timestamp, e.g. `2031-04-01T06:00:00Z`.
 * @throws {InvalidArgumentError} if the text is not such a timestamp or names an impossible date.
 */
export function parseIsoUtcMs(field: string, text: unknown): number {
  const expected = 'an ISO 8601 UTC date-time with a zone, e.g. "2031-04-01T06:00:00Z"';
  if (typeof text !== 'string') throw new InvalidArgumentError(field, text, expected);
  const m = ISO_UTC.exec(text);
  if (!m) throw new InvalidArgumentError(field, text, expected);
  const [year, month, day, hour, minute] = [m[1], m[2], m[3], m[4], m[5]].map(Number) as [number, number, number, number, number];
  const second = m[6] === undefined ? 0 : Number(m[6]);
  const fraction = m[7] === undefined ? 0 : Number(m[7]);
  let ms = Date.UTC(year, month - 1, day, hour, minute, second) + fraction * 1000;
  const check = new Date(Date.UTC(year, month - 1, day, hour, minute, second));
  if (month < 1 || month > 12 || hour > 23 || minute > 59 || second > 59 || check.getUTCDate() !== day ||
      check.getUTCMonth() !== month - 1) {
    throw new InvalidArgumentError(field, text, `${expected} naming a real date and time (second 60 is not accepted)`);
  }
  const zone = m[8] as string;
  if (zone !== 'Z') {
    const sign = zone[0] === '-' ? -1 : 1;
    const zh = Number(zone.slice(1, 3));
    const zm = Number(zone.slice(4, 6));
    if (zh > 23 || zm > 59) throw new InvalidArgumentError(field, text, expected);
    ms -= sign * (zh * 60 + zm) * 60_000;
  }
  return ms;
}

/**
 * Formats milliseconds since the Unix epoch as ISO 8601 UTC: whole seconds when the value is
 * a whole second (after rounding to the millisecond), otherwise with milliseconds.
 */
export function formatIsoUtc(ms: number): string {
  const rounded = Math.round(ms);
  const iso = new Date(rounded).toISOString();
  return rounded % 1000 === 0 ? `${iso.slice(0, 19)}Z` : iso;
}
