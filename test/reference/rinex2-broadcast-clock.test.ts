/**
 * IS-GPS-200 satellite clock correction from RINEX 2 navigation files, checked against values computed
 * independently with mpmath by test/fixtures/rinex-nav/reference_clock_v2.py [C] from the invented record
 * values of generate_v2.py. The script works in (week, seconds of week) with the ICD's ±302 400 s week
 * crossover rule, while Tauline works on absolute Instants (t − t_oe as a difference of instants): the two agree
 * only if the reader resolved
 * weeks, two-digit years and fit intervals correctly. Algorithm: IS-GPS-200 §20.3.3.3.3.1 and Table 20-IV [M]
 * (physics-refs §3, first sentences [V2]); file layout: RINEX 2.11 Table A4 [V1].
 */

import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseRinexNav } from '../../packages/sdk/src/io/rinex-nav.js';
import { evaluateBroadcastEphemeris, selectEphemeris } from '../../packages/sdk/src/orbit/broadcast.js';
import type { Instant } from '../../packages/sdk/src/time/instant.js';
import { BUNDLED_LEAP_SECONDS } from '../../packages/sdk/src/time/leap-seconds.js';
import { createTimeScales } from '../../packages/sdk/src/time/scales.js';

const SECOND = 1;
const fixture = (name: string) => readFileSync(new URL(`../fixtures/rinex-nav/${name}`, import.meta.url), 'utf8');

/** Printed by `python3 reference_clock_v2.py` (mpmath, 40 digits) [C]: [satellite, GPST, Δt_r (s), Δt_sv (s)]. */
const V211: readonly [string, string, number, number][] = [
  ['G14', '2024-01-06T23:00:00', 1.461050530502934e-8, 3.512358746703572e-4],
  ['G03', '2024-01-06T23:00:00', 1.424021847851336e-9, -4.214897419969416e-5],
  ['G14', '2024-01-06T23:30:00', 9.706894544706796e-9, 3.512186928811229e-4],
  ['G03', '2024-01-06T23:30:00', -1.17627048890599e-9, -4.215362085510991e-5],
  ['G14', '2024-01-07T00:00:00', 4.120629104665388e-9, 3.51200828437209e-4],
  ['G27', '2024-01-07T00:00:00', -3.340042203087919e-8, -1.872898681111083e-4],
  ['G03', '2024-01-07T00:00:00', -3.694915987771836e-9, -4.215818586368777e-5],
  ['G14', '2024-01-07T00:30:00', -1.756116779930993e-9, 3.511826735128505e-4],
  ['G27', '2024-01-07T00:30:00', -3.343387834764854e-8, -1.873260966143847e-4],
  ['G03', '2024-01-07T00:30:00', -5.957304135878305e-9, -4.216249461491487e-5],
  ['G14', '2024-01-07T01:00:00', -7.509016232150785e-9, 3.511646424349243e-4],
  ['G27', '2024-01-07T01:00:00', -3.118852560604275e-8, -1.873485355162834e-4],
  ['G03', '2024-01-07T01:00:00', -7.807207477700518e-9, -4.216639088133569e-5],
  ['G27', '2024-01-07T01:30:00', -2.684034074178466e-8, -1.873573607937401e-4],
  ['G03', '2024-01-07T01:30:00', -9.117801918685273e-9, -4.216974783885567e-5],
  ['G27', '2024-01-07T02:00:00', -2.069992261605715e-8, -1.873528830456161e-4],
  ['G03', '2024-01-07T02:00:00', -9.80036055294153e-9, -4.217247676056893e-5],
  ['G27', '2024-01-07T02:30:00', -1.3188146455644e-8, -1.87335523147138e-4],
  ['G27', '2024-01-07T03:00:00', -4.807539244284688e-9, -1.873057836252897e-4],
  ['G27', '2024-01-07T03:30:00', 3.88884984918022e-9, -1.8726421752924e-4],
  ['G27', '2024-01-07T04:00:00', 1.232983952740062e-8, -1.872113960402862e-4],
];
/** Same script, gps-v210.rnx (two-digit years 99 and 00; G21 with its week written modulo 1024 and fit interval 0) [C]. */
const V210: readonly [string, string, number, number][] = [
  ['G03', '1999-12-31T22:30:00', -1.846181685309497e-8, 2.118451228103839e-4],
  ['G03', '2000-01-01T00:30:00', -1.246319602994371e-8, 2.11875336004207e-4],
  ['G21', '2000-01-01T23:00:00', -1.3290674153088e-8, -6.068610355913088e-6],
  ['G21', '2000-01-02T01:00:00', 3.302225925945887e-8, -6.022297422500541e-6],
];
/** Tolerances: Δt_r and Δt_sv to 1e-18 s (1 as): float64 rounding of ~1e-4 s values is ~1e-20 s. */
const TOLERANCE = 1e-18 * SECOND;

const TS = createTimeScales(BUNDLED_LEAP_SECONDS);

/** A GPST reading as an instant (the time module's ISO reader). */
function gpst(iso: string): Instant {
  return TS.parseIso(iso, 'GPS');
}

function evaluate(text: string, table: readonly [string, string, number, number][]): number {
  const file = parseRinexNav(text);
  let worst = 0;
  for (const [sat, iso, dtr, dtsv] of table) {
    const t = gpst(iso);
    const eph = selectEphemeris(
      file.ephemerides.filter((e) => e.satellite === sat),
      t,
    );
    expect(eph, `${sat} ${iso}`).toBeDefined();
    const ev = evaluateBroadcastEphemeris(eph!, t);
    worst = Math.max(worst, Math.abs(ev.relativisticSeconds - dtr), Math.abs(ev.clockCorrectionSeconds - dtsv));
    expect(Math.abs(ev.relativisticSeconds - dtr), `${sat} ${iso} Δt_r`).toBeLessThan(TOLERANCE);
    expect(Math.abs(ev.clockCorrectionSeconds - dtsv), `${sat} ${iso} Δt_sv`).toBeLessThan(TOLERANCE);
  }
  return worst;
}

describe('IS-GPS-200 §20.3.3.3.3.1 clock correction from RINEX 2 files: reference_clock_v2.py (mpmath) [C]', () => {
  it('evaluateBroadcastEphemeris(record of gps-v211.rnx, t) matches the script across the week 2295/2296 crossover to 1e-18 s', () => {
    const worst = evaluate(fixture('gps-v211.rnx'), V211);
    expect(worst).toBeLessThan(TOLERANCE);
  });

  it('selectEphemeris(gps-v211.rnx records, t) covers exactly the samples the script covers: G14 ends at 01:00, G27 starts at 00:00 and ends at 04:00 (fit intervals 6 h and 4 h)', () => {
    const file = parseRinexNav(fixture('gps-v211.rnx'));
    const covered: string[] = [];
    for (let k = 0; k <= 11; k++) {
      const t = gpst('2024-01-06T23:00:00').plus(1800 * k);
      for (const sat of ['G14', 'G27', 'G03']) {
        if (
          selectEphemeris(
            file.ephemerides.filter((e) => e.satellite === sat),
            t,
          )
        )
          covered.push(`${sat}@${k}`);
      }
    }
    const expected = V211.map(([sat, iso]) => `${sat}@${gpst(iso).secondsSince(gpst('2024-01-06T23:00:00')) / 1800}`);
    expect(covered.sort()).toEqual([...expected].sort());
  });

  it('evaluateBroadcastEphemeris(record of gps-v210.rnx, t) matches the script for years 99 and 00 and a week written modulo 1024 to 1e-18 s', () => {
    expect(evaluate(fixture('gps-v210.rnx'), V210)).toBeLessThan(TOLERANCE);
  });

  it('parseRinexNav(gps-v304-equivalent.rnx) gives the same records as its RINEX 2.11 twin, so the same corrections', () => {
    const strip = ({ line: _l, sourceName: _s, ...rest }: ReturnType<typeof parseRinexNav>['ephemerides'][number]) =>
      rest;
    expect(parseRinexNav(fixture('gps-v304-equivalent.rnx')).ephemerides.map(strip)).toEqual(
      parseRinexNav(fixture('gps-v211.rnx')).ephemerides.map(strip),
    );
    expect(evaluate(fixture('gps-v304-equivalent.rnx'), V211)).toBeLessThan(TOLERANCE);
  });
});
