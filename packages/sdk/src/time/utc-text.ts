/**
 * UTC text helpers shared by the scenario readers and the plan writers: the default time scales of
 * the bundled leap-second table, ISO 8601 UTC text in the reduced `hh:mm` form, and UTC text
 * to the millisecond with whole seconds printed without a fraction.
 *
 * @internal
 */

import type { Instant } from './instant.js';
import { BUNDLED_LEAP_SECONDS } from './leap-seconds.js';
import { createTimeScales } from './scales.js';
import type { TimeScales } from './scales-types.js';

let bundled: TimeScales | undefined;

/** The time scales of the bundled leap-second table (valid until 2027-06-28), built on first use. */
export function bundledTimeScales(): TimeScales {
  bundled ??= createTimeScales(BUNDLED_LEAP_SECONDS);
  return bundled;
}

/**
 * Parses ISO 8601 UTC text with a zone designator (`Z` or `±hh:mm`), also in the reduced form
 * `YYYY-MM-DDThh:mm` + zone (no seconds, ISO 8601 §4.2.2.3 [M]), read as `hh:mm:00`.
 * @throws as `TimeScales.parseIso(text, 'UTC')`.
 */
export function parseUtcText(ts: TimeScales, text: string): Instant {
  const m = /^(\d{4}-\d{2}-\d{2}T\d{2}:\d{2})(Z|[+-]\d{2}:\d{2})$/.exec(text);
  return ts.parseIso(m ? `${m[1]}:00${m[2]}` : text, 'UTC');
}

/**
 * ISO 8601 UTC text of an instant rounded to the millisecond: whole seconds as `2027-02-08T05:10:00Z`,
 * otherwise with milliseconds (`...:00.250Z`); `:60` inside a leap second.
 */
export function formatUtcMilliseconds(ts: TimeScales, instant: Instant): string {
  const text = ts.formatIso(instant, { fractionDigits: 3 });
  return text.endsWith('.000Z') ? `${text.slice(0, -5)}Z` : text;
}
