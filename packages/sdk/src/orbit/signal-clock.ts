/**
 * Single-frequency satellite clock corrections from a broadcast record: the full clock
 * correction Δt_sv of {@link evaluateBroadcastEphemeris} less the broadcast group delay of the
 * chosen signal, as each interface specification tells a single-frequency user to apply it.
 *
 * The broadcast clock parameters already refer to the system's reference combination, so the
 * ionosphere-free dual-frequency user applies Δt_sv itself, with no group delay:
 * GPS LNAV L1/L2 P(Y) (IS-GPS-200 §20.3.3.3.3.3 [M]), Galileo I/NAV E1/E5b and F/NAV E1/E5a
 * (Galileo OS SIS ICD §5.1.5 [M]). BeiDou D1/D2 is different: its clock parameters refer to the
 * B3I signal (BDS-SIS-ICD B1I §5.2.4.10 [M]), so Δt_sv without a group delay is the B3I
 * single-frequency correction, not an ionosphere-free combination; {@link signalClockCorrection}
 * says so in its `note` for `iono-free` on a BeiDou record.
 *
 * @module
 */

import { InvalidArgumentError } from '../errors.js';
import { requireFinite } from '../internal/validate.js';
import type { Seconds } from '../units.js';
import type { KeplerianBroadcastEphemeris, KeplerianSystem } from './broadcast.js';

/**
 * Signals with a single-frequency clock correction: GPS L1 C/A, L1 P(Y), L2 P(Y); Galileo E1,
 * E5a, E5b; BeiDou B1I, B2I, B3I; and `iono-free` for the dual-frequency combination (no group delay).
 */
export type BroadcastSignal = 'L1CA' | 'L1P' | 'L2P' | 'E1' | 'E5a' | 'E5b' | 'B1I' | 'B2I' | 'B3I' | 'iono-free';

/** Every {@link BroadcastSignal}, in the order printed by help texts. */
export const BROADCAST_SIGNALS: readonly BroadcastSignal[] = Object.freeze([
  'L1CA',
  'L1P',
  'L2P',
  'E1',
  'E5a',
  'E5b',
  'B1I',
  'B2I',
  'B3I',
  'iono-free',
] as const);

/** Names of the broadcast group-delay fields, as `readRinexNav` stores them in `groupDelays`. */
export type GroupDelayField = 'TGD' | 'BGD_E5a_E1' | 'BGD_E5b_E1' | 'TGD1' | 'TGD2';

/** Carrier frequencies as multiples of the 10.23 MHz fundamental (GPS L1 = 154 f0, L2 = 120 f0, IS-GPS-200 §3.3.1.1 [M]). */
const MULTIPLE_L1_E1 = 154;
const MULTIPLE_L2 = 120;
/** Galileo E5a = 115 f0 (1176.45 MHz), E5b = 118 f0 (1207.14 MHz) (Galileo OS SIS ICD §2.3 [M]). */
const MULTIPLE_E5A = 115;
const MULTIPLE_E5B = 118;

/** (p/q)² as one division of exact integer squares, so the result is the correctly rounded double. */
function ratioSquared(p: number, q: number): number {
  return (p * p) / (q * q);
}

/**
 * γ = (f_L1/f_L2)² = (77/60)² = (154/120)², the L1/L2 group-delay ratio of IS-GPS-200 §20.3.3.3.3.2 [M]
 * (≈ 1.646944444444444).
 */
export const GPS_GAMMA_L1_L2 = ratioSquared(MULTIPLE_L1_E1, MULTIPLE_L2);
/** (f_E1/f_E5a)² = (154/115)², Galileo OS SIS ICD §5.1.5 [M] (≈ 1.793270321361059). */
export const GALILEO_GAMMA_E1_E5A = ratioSquared(MULTIPLE_L1_E1, MULTIPLE_E5A);
/** (f_E1/f_E5b)² = (154/118)² = (77/59)², Galileo OS SIS ICD §5.1.5 [M] (≈ 1.703246193622522). */
export const GALILEO_GAMMA_E1_E5B = ratioSquared(MULTIPLE_L1_E1, MULTIPLE_E5B);

/**
 * Largest accepted |group delay|, in seconds: 1 µs. The broadcast fields span about ±60 ns (GPS
 * T_GD), ±120 ns (Galileo BGD) and ±51 ns (BeiDou TGD) by their bit widths and scale factors [M];
 * the bound only catches values given in nanoseconds (plausibility bound, our own choice).
 */
const MAX_GROUP_DELAY: Seconds = 1e-6;

/** What a signal needs: its system, group-delay field (none for a reference signal), factor and source. */
interface SignalRule {
  readonly system: KeplerianSystem | 'any';
  readonly field?: GroupDelayField | 'galileo-e1';
  readonly factor: number;
  readonly source: string;
}

const RULES: Readonly<Record<BroadcastSignal, SignalRule>> = {
  L1CA: { system: 'G', field: 'TGD', factor: 1, source: 'IS-GPS-200 §20.3.3.3.3.2 [M]: (Δt_sv)_L1 = Δt_sv − T_GD' },
  L1P: { system: 'G', field: 'TGD', factor: 1, source: 'IS-GPS-200 §20.3.3.3.3.2 [M]: (Δt_sv)_L1 = Δt_sv − T_GD' },
  L2P: {
    system: 'G',
    field: 'TGD',
    factor: GPS_GAMMA_L1_L2,
    source: 'IS-GPS-200 §20.3.3.3.3.2 [M]: (Δt_sv)_L2 = Δt_sv − γ T_GD, γ = (77/60)²',
  },
  E1: {
    system: 'E',
    field: 'galileo-e1',
    factor: 1,
    source: 'Galileo OS SIS ICD §5.1.5 [M]: Δt_E1 = Δt − BGD(E1,E5a) (F/NAV) or Δt − BGD(E1,E5b) (I/NAV)',
  },
  E5a: {
    system: 'E',
    field: 'BGD_E5a_E1',
    factor: GALILEO_GAMMA_E1_E5A,
    source: 'Galileo OS SIS ICD §5.1.5 [M]: Δt_E5a = Δt − (f_E1/f_E5a)² BGD(E1,E5a)',
  },
  E5b: {
    system: 'E',
    field: 'BGD_E5b_E1',
    factor: GALILEO_GAMMA_E1_E5B,
    source: 'Galileo OS SIS ICD §5.1.5 [M]: Δt_E5b = Δt − (f_E1/f_E5b)² BGD(E1,E5b)',
  },
  B1I: { system: 'C', field: 'TGD1', factor: 1, source: 'BDS-SIS-ICD B1I §5.2.4.10 [M]: Δt_B1I = Δt − TGD1' },
  B2I: { system: 'C', field: 'TGD2', factor: 1, source: 'BDS-SIS-ICD B1I §5.2.4.10 [M]: Δt_B2I = Δt − TGD2' },
  B3I: {
    system: 'C',
    factor: 0,
    source: 'BDS-SIS-ICD B1I §5.2.4.10 [M]: the clock parameters refer to B3I, no group delay',
  },
  'iono-free': {
    system: 'any',
    factor: 0,
    source:
      'IS-GPS-200 §20.3.3.3.3.3 [M], Galileo OS SIS ICD §5.1.5 [M]: the dual-frequency user applies Δt_sv with no group delay',
  },
};

const SYSTEM_NAMES: Readonly<Record<KeplerianSystem, string>> = { G: 'GPS', E: 'Galileo', C: 'BeiDou' };

/** Result of {@link signalClockCorrection}. */
export interface SignalClockCorrection {
  readonly signal: BroadcastSignal;
  /** Single-frequency clock correction for the signal, in seconds (Δt_sv less factor × group delay). */
  readonly clockCorrectionSeconds: Seconds;
  /** The broadcast group delay used, in seconds, as broadcast (before the factor); `null` when none applies. */
  readonly groupDelaySeconds: Seconds | null;
  /** Name of the group-delay field used (`TGD`, `BGD_E5a_E1`, `BGD_E5b_E1`, `TGD1`, `TGD2`), or `null`. */
  readonly groupDelayField: GroupDelayField | null;
  /** Factor applied to the group delay (1, γ = (77/60)², (f_E1/f_E5a)², (f_E1/f_E5b)², or 0). */
  readonly factor: number;
  /** The formula and its source, with the provenance tag. */
  readonly source: string;
  /** A caveat, when the value needs one (BeiDou `iono-free`), else `undefined`. */
  readonly note?: string;
}

/** Whether `value` names a {@link BroadcastSignal} (exact spelling). */
export function isBroadcastSignal(value: unknown): value is BroadcastSignal {
  return typeof value === 'string' && (BROADCAST_SIGNALS as readonly string[]).includes(value);
}

/**
 * Single-frequency clock correction of one signal from a broadcast record's full clock correction.
 *
 *   GPS (IS-GPS-200 §20.3.3.3.3.2 [M]):   L1 C/A, L1 P(Y): Δt_sv − T_GD;   L2 P(Y): Δt_sv − γ T_GD, γ = (77/60)².
 *   Galileo (OS SIS ICD §5.1.5 [M]):       E1: Δt − BGD(E1,E5a) for an F/NAV record, Δt − BGD(E1,E5b) for I/NAV;
 *                                          E5a: Δt − (f_E1/f_E5a)² BGD(E1,E5a);   E5b: Δt − (f_E1/f_E5b)² BGD(E1,E5b).
 *   BeiDou (BDS-SIS-ICD B1I §5.2.4.10 [M]): B1I: Δt − TGD1;  B2I: Δt − TGD2;  B3I: Δt (the reference signal).
 *   iono-free: Δt_sv, no group delay (the GPS L1/L2 P(Y), Galileo I/NAV E1/E5b and F/NAV E1/E5a
 *   dual-frequency user). For BeiDou this is the B3I correction and the result carries a `note`.
 *
 * The group delays come from `ephemeris.groupDelays` (RINEX fields TGD; BGD_E5a_E1, BGD_E5b_E1; TGD1,
 * TGD2 as `readRinexNav` stores them). An F/NAV record carries no BGD(E1,E5b) (the F/NAV message
 * broadcasts only BGD(E1,E5a), Galileo OS SIS ICD §4.2 [M]), so E5b from an F/NAV record is refused.
 * Accuracy: that of the broadcast values (group delays are quantised to 2⁻³¹ s GPS, 2⁻³² s
 * Galileo, 0.1 ns BeiDou [M]).
 *
 * @param ephemeris               The record Δt_sv was computed from (system, message, group delays).
 * @param clockCorrectionSeconds  Δt_sv = a_f0 + a_f1(t − t_oc) + a_f2(t − t_oc)² + Δt_r, in seconds
 *                                (`evaluateBroadcastEphemeris(...).clockCorrectionSeconds`).
 * @param signal                  The signal (see {@link BroadcastSignal}).
 * @returns The signal's correction (s), the group delay used (s, as broadcast), its field, factor and source.
 * @throws {InvalidArgumentError} for an unknown signal, a signal of another system than the record's,
 *   E5b from an F/NAV record, a missing or non-finite group delay (naming `ephemeris.groupDelays.<field>`),
 *   a group delay above 1 µs in magnitude (hint: nanoseconds?), or a non-finite `clockCorrectionSeconds`.
 * @see IS-GPS-200 §20.3.3.3.3.2 [M]; Galileo OS SIS ICD §5.1.5 [M]; BDS-SIS-ICD B1I §5.2.4.10 [M];
 *   physics-refs.md §3 check value (Δt_sv)_L1 = Δt_sv − T_GD [C].
 */
export function signalClockCorrection(
  ephemeris: KeplerianBroadcastEphemeris,
  clockCorrectionSeconds: Seconds,
  signal: BroadcastSignal,
): SignalClockCorrection {
  if (!isBroadcastSignal(signal)) {
    throw new InvalidArgumentError('signal', signal, `one of ${BROADCAST_SIGNALS.join(', ')}`);
  }
  if (ephemeris === null || typeof ephemeris !== 'object') {
    throw new InvalidArgumentError('ephemeris', ephemeris, 'a broadcast ephemeris record');
  }
  requireFinite('clockCorrectionSeconds', clockCorrectionSeconds, 'a finite clock correction Δt_sv in seconds');
  const rule = RULES[signal];
  const system = ephemeris.system;
  if (rule.system !== 'any' && rule.system !== system) {
    throw new InvalidArgumentError(
      'signal',
      signal,
      `a signal of the record's system (${SYSTEM_NAMES[system] ?? String(system)}: ${signalsOf(system).join(', ')}) or iono-free`,
      `${signal} is a ${SYSTEM_NAMES[rule.system]} signal; the record is ${String(ephemeris.satellite)}`,
    );
  }
  if (rule.field === undefined) {
    const note =
      system === 'C' && signal === 'iono-free'
        ? 'BeiDou D1/D2 clock parameters refer to B3I (BDS-SIS-ICD B1I §5.2.4.10 [M]): this is the B3I correction, not an ionosphere-free combination'
        : undefined;
    return {
      signal,
      clockCorrectionSeconds,
      groupDelaySeconds: null,
      groupDelayField: null,
      factor: 0,
      source: rule.source,
      ...(note !== undefined ? { note } : {}),
    };
  }
  let field: GroupDelayField;
  if (rule.field === 'galileo-e1') {
    field = ephemeris.message === 'FNAV' ? 'BGD_E5a_E1' : 'BGD_E5b_E1';
  } else {
    field = rule.field;
  }
  if (signal === 'E5b' && ephemeris.message === 'FNAV') {
    throw new InvalidArgumentError(
      'ephemeris.groupDelays.BGD_E5b_E1',
      ephemeris.groupDelays?.BGD_E5b_E1,
      'a BGD(E1,E5b) from an I/NAV record (the F/NAV message does not broadcast it)',
      'use an I/NAV record for E5b',
    );
  }
  const value = ephemeris.groupDelays?.[field];
  const name = `ephemeris.groupDelays.${field}`;
  if (value === undefined) {
    throw new InvalidArgumentError(name, value, `the broadcast ${field} in seconds (needed for ${signal})`);
  }
  requireFinite(name, value, `a finite broadcast ${field} in seconds`);
  if (Math.abs(value) > MAX_GROUP_DELAY) {
    throw new InvalidArgumentError(
      name,
      value,
      `a group delay in seconds, |value| ≤ ${MAX_GROUP_DELAY} s`,
      Math.abs(value) * 1e-9 <= MAX_GROUP_DELAY ? 'did you give nanoseconds?' : undefined,
    );
  }
  return {
    signal,
    // The formula of the signal's rule above (source in `rule.source`).
    clockCorrectionSeconds: clockCorrectionSeconds - rule.factor * value,
    groupDelaySeconds: value,
    groupDelayField: field,
    factor: rule.factor,
    source: rule.source,
  };
}

/**
 * The formula of a signal's clock correction and its published source, with the provenance tag
 * (the same text as {@link SignalClockCorrection.source}).
 * @throws {InvalidArgumentError} for an unknown signal.
 */
export function signalClockSource(signal: BroadcastSignal): string {
  if (!isBroadcastSignal(signal))
    throw new InvalidArgumentError('signal', signal, `one of ${BROADCAST_SIGNALS.join(', ')}`);
  return RULES[signal].source;
}

/** The signals accepted for a system's records, `iono-free` included. */
export function signalsOf(system: KeplerianSystem): BroadcastSignal[] {
  return BROADCAST_SIGNALS.filter((s) => RULES[s].system === system || RULES[s].system === 'any');
}
