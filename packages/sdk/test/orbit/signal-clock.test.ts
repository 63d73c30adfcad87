import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { InvalidArgumentError } from '../../src/errors.js';
import { parseRinexNav } from '../../src/io/rinex-nav.js';
import { evaluateBroadcastEphemeris, type KeplerianBroadcastEphemeris } from '../../src/orbit/broadcast.js';
import {
  BROADCAST_SIGNALS,
  type BroadcastSignal,
  GALILEO_GAMMA_E1_E5A,
  GALILEO_GAMMA_E1_E5B,
  GPS_GAMMA_L1_L2,
  isBroadcastSignal,
  signalClockCorrection,
  signalClockSource,
  signalsOf,
} from '../../src/orbit/signal-clock.js';

const NAV = parseRinexNav(
  readFileSync(new URL('../../../../test/fixtures/rinex-nav/mixed-v305.rnx', import.meta.url), 'utf8'),
);
const record = (sat: string, message?: string) =>
  NAV.ephemerides.find((e) => e.satellite === sat && (message === undefined || e.message === message))!;

/** Carrier frequencies in MHz (IS-GPS-200 §3.3.1.1, Galileo OS SIS ICD §2.3 [M]): an independent route to the ratios. */
const MHZ = { L1: 1575.42, L2: 1227.6, E5a: 1176.45, E5b: 1207.14 };

describe('signal group-delay factors (IS-GPS-200 §20.3.3.3.3.2 [M]; Galileo OS SIS ICD §5.1.5 [M])', () => {
  it('GPS_GAMMA_L1_L2 equals (77/60)² = 5929/3600 and (1575.42 MHz / 1227.60 MHz)² to 1e-15', () => {
    expect(GPS_GAMMA_L1_L2).toBe(5929 / 3600); // one division of exact integers: the correctly rounded (77/60)²
    expect(Math.abs(GPS_GAMMA_L1_L2 - (MHZ.L1 / MHZ.L2) ** 2)).toBeLessThan(1e-15);
  });

  it('GALILEO_GAMMA_E1_E5A and GALILEO_GAMMA_E1_E5B equal (1575.42/1176.45)² and (1575.42/1207.14)² to 1e-15 ([C] 1.7932703213610586, 1.7032461936225223)', () => {
    expect(Math.abs(GALILEO_GAMMA_E1_E5A - (MHZ.L1 / MHZ.E5a) ** 2)).toBeLessThan(1e-15);
    expect(Math.abs(GALILEO_GAMMA_E1_E5B - (MHZ.L1 / MHZ.E5b) ** 2)).toBeLessThan(1e-15);
    // Exact rationals (154/115)² and (154/118)², correctly rounded (Python fractions [C]).
    expect(GALILEO_GAMMA_E1_E5A).toBe(1.7932703213610586);
    expect(GALILEO_GAMMA_E1_E5B).toBe(1.7032461936225223);
  });
});

describe('signalClockCorrection on the fixture records (test/fixtures/rinex-nav/generate.py values)', () => {
  const dt = 1.0e-4; // any Δt_sv; the group delays come from the records
  const check = (
    sat: string,
    message: string | undefined,
    signal: BroadcastSignal,
    field: string | null,
    gd: number | null,
    factor: number,
  ) => {
    const r = signalClockCorrection(record(sat, message), dt, signal);
    expect(r.groupDelayField).toBe(field);
    expect(r.groupDelaySeconds).toBe(gd);
    expect(r.factor).toBe(factor);
    expect(r.clockCorrectionSeconds).toBe(dt - factor * (gd ?? 0));
    expect(r.source).toMatch(/\[M\]/);
  };

  it('signalClockCorrection(G05, Δt, L1CA | L1P | L2P) subtracts T_GD = −1e-8 s, T_GD and γ·T_GD (IS-GPS-200 §20.3.3.3.3.2 [M])', () => {
    check('G05', undefined, 'L1CA', 'TGD', -1e-8, 1);
    check('G05', undefined, 'L1P', 'TGD', -1e-8, 1);
    check('G05', undefined, 'L2P', 'TGD', -1e-8, GPS_GAMMA_L1_L2);
    expect(signalClockCorrection(record('G05'), dt, 'L2P').clockCorrectionSeconds).toBeCloseTo(
      dt + 1.6469444444444445e-8,
      20,
    );
  });

  it('signalClockCorrection(E11, Δt, E1) uses BGD(E1,E5b) = 1.4 ns for I/NAV and BGD(E1,E5a) = 1.2 ns for F/NAV (Galileo OS SIS ICD §5.1.5 [M])', () => {
    check('E11', 'INAV', 'E1', 'BGD_E5b_E1', 1.4e-9, 1);
    check('E11', 'FNAV', 'E1', 'BGD_E5a_E1', 1.2e-9, 1);
  });

  it('signalClockCorrection(E11, Δt, E5a | E5b) subtracts (f_E1/f_E5a)²·BGD(E1,E5a) and (f_E1/f_E5b)²·BGD(E1,E5b) (Galileo OS SIS ICD §5.1.5 [M])', () => {
    check('E11', 'INAV', 'E5a', 'BGD_E5a_E1', 1.2e-9, GALILEO_GAMMA_E1_E5A);
    check('E11', 'FNAV', 'E5a', 'BGD_E5a_E1', 1.2e-9, GALILEO_GAMMA_E1_E5A);
    check('E11', 'INAV', 'E5b', 'BGD_E5b_E1', 1.4e-9, GALILEO_GAMMA_E1_E5B);
  });

  it('signalClockCorrection(C08 | C03, Δt, B1I | B2I | B3I) subtracts TGD1 = 2.4 ns, TGD2 = −1.3 ns, nothing (BDS-SIS-ICD B1I §5.2.4.10 [M])', () => {
    for (const sat of ['C08', 'C03']) {
      check(sat, undefined, 'B1I', 'TGD1', 2.4e-9, 1);
      check(sat, undefined, 'B2I', 'TGD2', -1.3e-9, 1);
      check(sat, undefined, 'B3I', null, null, 0);
    }
  });

  it('signalClockCorrection(record, Δt, iono-free) returns Δt_sv itself for every system, with a B3I note for BeiDou only', () => {
    for (const [sat, msg] of [
      ['G05', undefined],
      ['E11', 'INAV'],
      ['E11', 'FNAV'],
      ['C08', undefined],
    ] as const) {
      const r = signalClockCorrection(record(sat, msg), dt, 'iono-free');
      expect(r.clockCorrectionSeconds).toBe(dt);
      expect(r.groupDelaySeconds).toBeNull();
      expect(r.note === undefined).toBe(sat !== 'C08');
    }
    expect(signalClockCorrection(record('C08'), dt, 'iono-free').note).toMatch(/B3I/);
  });

  it('signalClockCorrection applied to evaluateBroadcastEphemeris(G05, t_oe).clockCorrectionSeconds gives Δt_sv − T_GD', () => {
    const eph = record('G05');
    const ev = evaluateBroadcastEphemeris(eph, eph.toe);
    expect(signalClockCorrection(eph, ev.clockCorrectionSeconds, 'L1CA').clockCorrectionSeconds).toBe(
      ev.clockCorrectionSeconds + 1e-8,
    );
  });

  it("signalsOf(system) lists each system's signals and iono-free; isBroadcastSignal accepts exactly BROADCAST_SIGNALS", () => {
    expect(signalsOf('G')).toEqual(['L1CA', 'L1P', 'L2P', 'iono-free']);
    expect(signalsOf('E')).toEqual(['E1', 'E5a', 'E5b', 'iono-free']);
    expect(signalsOf('C')).toEqual(['B1I', 'B2I', 'B3I', 'iono-free']);
    for (const s of BROADCAST_SIGNALS) expect(isBroadcastSignal(s)).toBe(true);
    expect(isBroadcastSignal('l1ca')).toBe(false);
    expect(isBroadcastSignal(3)).toBe(false);
  });

  it('signalClockSource(signal) names the formula with its source and tag, as signalClockCorrection(...).source does', () => {
    expect(signalClockSource('L2P')).toMatch(/IS-GPS-200 §20\.3\.3\.3\.3\.2 \[M\].*γ = \(77\/60\)²/);
    expect(signalClockSource('E1')).toBe(signalClockCorrection(record('E11', 'INAV'), 1e-4, 'E1').source);
    expect(() => signalClockSource('X' as BroadcastSignal)).toThrow(/signal must be one of/);
  });
});

describe('signalClockCorrection error paths', () => {
  const g05 = () => record('G05');
  const withDelays = (
    eph: KeplerianBroadcastEphemeris,
    groupDelays: Record<string, number> | undefined,
  ): KeplerianBroadcastEphemeris => {
    const { groupDelays: _unused, ...rest } = eph;
    return groupDelays === undefined ? rest : { ...rest, groupDelays };
  };

  it('signalClockCorrection(record, Δt, unknown signal) throws InvalidArgumentError naming signal and the accepted list', () => {
    expect(() => signalClockCorrection(g05(), 1e-4, 'L5' as BroadcastSignal)).toThrow(InvalidArgumentError);
    expect(() => signalClockCorrection(g05(), 1e-4, 'L5' as BroadcastSignal)).toThrow(
      /signal must be one of L1CA, .*iono-free; received "L5"/,
    );
  });

  it("signalClockCorrection(GPS record, Δt, E1) throws naming the record's system and its signals", () => {
    expect(() => signalClockCorrection(g05(), 1e-4, 'E1')).toThrow(
      /GPS: L1CA, L1P, L2P, iono-free.*E1 is a Galileo signal; the record is G05/,
    );
    expect(() => signalClockCorrection(record('C08'), 1e-4, 'L2P')).toThrow(/BeiDou: B1I, B2I, B3I/);
  });

  it('signalClockCorrection(record without the group delay, Δt, L1CA) throws naming ephemeris.groupDelays.TGD', () => {
    expect(() => signalClockCorrection(withDelays(g05(), undefined), 1e-4, 'L1CA')).toThrow(
      /ephemeris\.groupDelays\.TGD must be the broadcast TGD in seconds \(needed for L1CA\); received nothing/,
    );
    expect(() => signalClockCorrection(withDelays(record('C08'), { TGD1: 1e-9 }), 1e-4, 'B2I')).toThrow(
      /ephemeris\.groupDelays\.TGD2/,
    );
    expect(() => signalClockCorrection(withDelays(record('E11', 'INAV'), { BGD_E5a_E1: 1e-9 }), 1e-4, 'E1')).toThrow(
      /ephemeris\.groupDelays\.BGD_E5b_E1/,
    );
    // The record without the group delays still gives the iono-free value.
    expect(signalClockCorrection(withDelays(g05(), undefined), 1e-4, 'iono-free').clockCorrectionSeconds).toBe(1e-4);
  });

  it('signalClockCorrection(F/NAV record, Δt, E5b) throws: F/NAV does not broadcast BGD(E1,E5b)', () => {
    expect(() => signalClockCorrection(record('E11', 'FNAV'), 1e-4, 'E5b')).toThrow(
      /ephemeris\.groupDelays\.BGD_E5b_E1 must be a BGD\(E1,E5b\) from an I\/NAV record/,
    );
  });

  it('signalClockCorrection rejects a non-finite group delay, one in nanoseconds (with a hint), a non-finite Δt_sv and a non-object record', () => {
    expect(() => signalClockCorrection(withDelays(g05(), { TGD: Number.NaN }), 1e-4, 'L1CA')).toThrow(
      /ephemeris\.groupDelays\.TGD must be a finite broadcast TGD in seconds; received NaN/,
    );
    expect(() => signalClockCorrection(withDelays(g05(), { TGD: -10 }), 1e-4, 'L1CA')).toThrow(
      /\|value\| ≤ 0\.000001 s; received -10\. did you give nanoseconds\?/,
    );
    expect(() => signalClockCorrection(withDelays(g05(), { TGD: 1e12 }), 1e-4, 'L1CA')).toThrow(
      /received 1000000000000$/,
    );
    expect(() => signalClockCorrection(g05(), Number.POSITIVE_INFINITY, 'L1CA')).toThrow(
      /clockCorrectionSeconds must be a finite/,
    );
    expect(() => signalClockCorrection(null as unknown as KeplerianBroadcastEphemeris, 1e-4, 'L1CA')).toThrow(
      /ephemeris must be a broadcast ephemeris record/,
    );
  });
});
