/**
 * Field formats of the RINEX clock reader (see `rinex-clock.ts` for the format sources and column layouts).
 *
 * @module
 */
import type { EpochFields } from './line-reader.js';

/** Exponent-form real as written by E19.12 / D19.12 (a two- or three-digit exponent is part of the field). */
export const E_FORMAT = /^[+-]?(\d+\.\d*|\.\d+)[EeDd][+-]\d{2,3}$/;
/** Last column (1-based) of each value field: record line (2 values), continuation line (4 values). */
export const VALUE_ENDS = {
  A4: { record: [59, 79], continuation: [19, 39, 59, 79] },
  A9: { record: [64, 85], continuation: [22, 43, 64, 85] },
} as const;
export const VALUE_NAMES = [
  'clock bias (s)',
  'bias sigma (s)',
  'clock rate',
  'rate sigma',
  'clock acceleration (1/s)',
  'acceleration sigma (1/s)',
];

/** F10.6 seconds field (blank-padded). */
export const SECOND = /^ *\d+(\.\d*)?$/;

/** Value of an unsigned I-format field in columns a+1..b (leading blanks allowed), or NaN. */
export function unsignedField(t: string, a: number, b: number): number {
  if (t.length < b) return Number.NaN;
  let i = a;
  while (i < b && t.charCodeAt(i) === 32) i++;
  if (i === b) return Number.NaN;
  let v = 0;
  for (; i < b; i++) {
    const c = t.charCodeAt(i) - 48;
    if (c < 0 || c > 9) return Number.NaN;
    v = v * 10 + c;
  }
  return v;
}

/** A date every month has (day 1-28) and an ordinary time of day: valid without the calendar (the others go to validEpochFields). */
export function plainEpoch(f: EpochFields): boolean {
  return f.month >= 1 && f.month <= 12 && f.day >= 1 && f.day <= 28 && f.hour <= 23 && f.minute <= 59 && f.second < 60;
}
