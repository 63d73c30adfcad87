import { expect } from '@open-wc/testing';
import { BUNDLED_LEAP_SECONDS, createTimeScales } from '@tauline/sdk/time';
import { calendarTicks, FLEET_STEPS_SECONDS, formatChartUtc } from '../../src/internal/calendar-axis.js';

// The leap second inserted at the end of 2016-12-31: TAI − UTC 36 s → 37 s (IERS Bulletin C 52, from memory [M]).
// Expected chart times are hand arithmetic on whole hours plus that one second [C]; steps dividing a day and
// ticks on round UTC clock times are common practice, no source.
const timeScales = createTimeScales(BUNDLED_LEAP_SECONDS);
const base = (iso: string) => ({ epoch: timeScales.parseIso(iso), timeScales });
const labels = (ticks: ReturnType<typeof calendarTicks>) => ticks.map((t) => `${t.label}${t.sub ? ` ${t.sub}` : ''}`);

describe('internal/calendar-axis', () => {
  it('calendarTicks(base, t0, t1, n, FLEET_STEPS_SECONDS) puts midnights at UTC midnights through the SDK leap-second table (2017-01-01 is 86 401 s after 2016-12-31)', () => {
    const b = base('2016-12-31T00:00:00Z');
    const ticks = calendarTicks(b, 0, 3 * 86400 + 1, 4, FLEET_STEPS_SECONDS);
    expect(ticks.map((t) => t.value)).to.deep.equal([0, 86401, 2 * 86400 + 1, 3 * 86400 + 1]);
    expect(ticks.map((t) => t.label)).to.deep.equal(['12-31', '01-01', '01-02', '01-03']);
    const hours = calendarTicks(b, 86400 - 7200, 86401 + 7200, 5, FLEET_STEPS_SECONDS);
    expect(labels(hours)).to.deep.equal(['22:00', '23:00', '00:00 2017-01-01', '01:00', '02:00']);
  });

  it('calendarTicks(base, t0, t1, n) falls on round UTC clock times from an epoch off the hour (6 h step over a day)', () => {
    // 5 h 53 min to the first 06:00 = 21 180 s, then every 21 600 s (no leap second in 2026) [C].
    const inside = calendarTicks(base('2026-04-02T00:07:00Z'), 0, 86400, 6);
    expect(inside.map((t) => t.value)).to.deep.equal([21_180, 42_780, 64_380, 85_980]);
    expect(labels(inside)).to.deep.equal(['06:00', '12:00', '18:00', '00:00 2026-04-03']);
  });

  it('calendarTicks(base, t0, t1, n) labels the inserted second 23:59:60 with a 1 s step and counts the next day from the true midnight', () => {
    const ticks = calendarTicks(base('2016-12-31T23:59:58Z'), 0, 4, 4);
    expect(ticks.map((t) => t.value)).to.deep.equal([0, 1, 2, 3, 4]);
    expect(labels(ticks)).to.deep.equal(['23:59:58', '23:59:59', '23:59:60', '00:00:00 2017-01-01', '00:00:01']);
  });

  it('calendarTicks(base, t0, t1, n) steps whole days on MJD multiples across the leap second (2-day step)', () => {
    // MJD 57 754 is 2017-01-01, so 2016-12-30 is MJD 57 752, also even [C].
    const ticks = calendarTicks(base('2016-12-30T00:00:00Z'), 0, 8 * 86400 + 1, 5);
    expect(ticks.map((t) => t.value)).to.deep.equal([0, 2 * 86400 + 1, 4 * 86400 + 1, 6 * 86400 + 1, 8 * 86400 + 1]);
    expect(labels(ticks)).to.deep.equal(['12-30', '01-01', '01-03', '01-05', '01-07']);
  });

  it('calendarTicks(base, t0, t1, n) is empty for a span that is not finite', () => {
    expect(calendarTicks(base('2016-12-31T00:00:00Z'), 0, Number.NaN, 4)).to.deep.equal([]);
    expect(calendarTicks(base('2016-12-31T00:00:00Z'), 0, Number.POSITIVE_INFINITY, 4)).to.deep.equal([]);
  });

  it('formatChartUtc(base, t) rounds to the nearest second and carries into the minute and the day (never :60 outside a leap second)', () => {
    const b = base('2026-04-02T23:59:00Z');
    expect(formatChartUtc(b, 59.9999999)).to.equal('2026-04-03 00:00 UTC');
    expect(formatChartUtc(b, 29.4, true)).to.equal('2026-04-02 23:59:29 UTC');
    expect(formatChartUtc(b, 29.6)).to.equal('2026-04-02 23:59:30 UTC');
    expect(formatChartUtc(b, Number.NaN)).to.equal('—');
    // After the bundled table's end (2027-06-28): no guess.
    expect(formatChartUtc(b, 2 * 365 * 86400)).to.equal('—');
  });

  it('formatChartUtc(base, t) reads the inserted second as 23:59:60 and the midnight after it as 00:00', () => {
    const b = base('2016-12-31T23:59:59Z');
    expect(formatChartUtc(b, 1)).to.equal('2016-12-31 23:59:60 UTC');
    expect(formatChartUtc(b, 2)).to.equal('2017-01-01 00:00 UTC');
    expect(formatChartUtc(b, 2, true)).to.equal('2017-01-01 00:00:00 UTC');
  });
});
