/**
 * Plausibility hints for flag values that are valid but look like a unit mistake. The rule, the same in
 * every command: a value that cannot be right is refused (exit 2, with a hint, e.g. a semi-major axis in
 * kilometres lies inside the Earth); a value that can be right but is unusual for its unit (a mean anomaly
 * of 90 rad, a nominal frequency of 10.23 Hz) is used as given, and one warning line on standard error
 * says what it looks like. Standard output (table or JSON) is unchanged by a warning.
 */
import type { Io } from './framework.js';

/** Writes one `tauline <command>: warning: …` line on standard error. */
export function warn(io: Io, command: string, text: string): void {
  io.err(`tauline ${command}: warning: ${text}\n`);
}

/**
 * A mean anomaly more than one turn (2π rad) but at most 360 looks like degrees. Larger values are
 * common as M0 + n·t in radians and are not flagged.
 */
export function angleHint(flag: string, radians: number): string | undefined {
  const a = Math.abs(radians);
  if (!(a > 2 * Math.PI && a <= 360)) return undefined;
  return `${flag} ${radians} rad is more than one turn (2π ≈ 6.283 rad); if it is in degrees, give ${Number(((radians * Math.PI) / 180).toPrecision(10))} rad`;
}

/** Lowest oscillator frequency taken without a hint, in Hz: frequency standards run at kHz to GHz (common practice, no source). */
export const LOWEST_PLAUSIBLE_FREQUENCY_HZ = 1000;

/** A nominal frequency below 1 kHz looks like MHz given as Hz (10.23 for 10.23 MHz). */
export function frequencyHint(flag: string, hertz: number): string | undefined {
  if (!(hertz > 0 && hertz < LOWEST_PLAUSIBLE_FREQUENCY_HZ)) return undefined;
  return `${flag} ${hertz} Hz is below 1 kHz; if it is in MHz, give ${Number((hertz * 1e6).toPrecision(12))} Hz`;
}

/**
 * An orbital speed under 1 % of the circular speed √(GM/r) at that radius looks like km/s given as m/s
 * (a state that falls almost straight down is valid but rarely meant). Circular speed v = √(GM/r): the
 * vis-viva equation v² = GM(2/r − 1/a) of the two-body problem with a = r (from memory [M]).
 */
export function speedHint(flag: string, speed: number, radius: number, gm: number): string | undefined {
  const circular = Math.sqrt(gm / radius);
  if (!(radius > 0 && speed < 0.01 * circular)) return undefined;
  return (
    `${flag} ${Number(speed.toPrecision(6))} m/s is under 1 % of the circular speed at r = ${radius} m ` +
    `(${circular.toFixed(1)} m/s); if the velocity is in km/s, multiply it by 1000`
  );
}

/** Largest phase-noise σ taken without a hint, in seconds (phase measurement noise is ps to ns; common practice, no source). */
export const LARGEST_PLAUSIBLE_PHASE_SIGMA = 1e-6;

/** A phase measurement σ of a microsecond or more looks like nanoseconds given as seconds. */
export function phaseSigmaHint(flag: string, seconds: number): string | undefined {
  if (!(seconds >= LARGEST_PLAUSIBLE_PHASE_SIGMA)) return undefined;
  return `${flag} ${seconds} s is 1 µs or more, large for phase measurement noise; if it is in nanoseconds, give ${Number((seconds * 1e-9).toPrecision(10))} s`;
}
