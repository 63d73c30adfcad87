/**
 * Scales (data → pixel) and tick generation for the canvas plots. Pure, no DOM.
 *
 * @module
 */

/** A monotonic mapping between a data domain and a pixel range, with its inverse. */
export interface Scale {
  readonly domain: readonly [number, number];
  readonly range: readonly [number, number];
  /** Data value → pixel. */
  map(value: number): number;
  /** Pixel → data value. */
  invert(pixel: number): number;
}

/** Linear scale: pixel = r0 + (v − d0)·(r1 − r0)/(d1 − d0). A zero-width domain maps to the range centre. */
export function linearScale(d0: number, d1: number, r0: number, r1: number): Scale {
  const span = d1 - d0;
  const k = span !== 0 ? (r1 - r0) / span : 0;
  return {
    domain: [d0, d1],
    range: [r0, r1],
    map: (v) => (span !== 0 ? r0 + (v - d0) * k : (r0 + r1) / 2),
    invert: (p) => (span !== 0 ? d0 + (p - r0) / k : d0),
  };
}

/** Base-10 logarithmic scale over a positive domain: pixel linear in log10(v). */
export function logScale(d0: number, d1: number, r0: number, r1: number): Scale {
  const l0 = Math.log10(d0),
    l1 = Math.log10(d1);
  const inner = linearScale(l0, l1, r0, r1);
  return {
    domain: [d0, d1],
    range: [r0, r1],
    map: (v) => inner.map(Math.log10(v)),
    invert: (p) => 10 ** inner.invert(p),
  };
}

/** The "nice" step (1, 2 or 5 × 10^k) giving about `count` intervals over [d0, d1]. */
export function niceStep(d0: number, d1: number, count: number): number {
  const span = Math.abs(d1 - d0);
  if (!(span > 0) || !Number.isFinite(span)) return 1;
  const raw = span / Math.max(1, count);
  const power = 10 ** Math.floor(Math.log10(raw));
  const f = raw / power;
  return (f < 1.5 ? 1 : f < 3 ? 2 : f < 7 ? 5 : 10) * power;
}

/** Tick values at multiples of a nice step inside [min(d0,d1), max(d0,d1)]. */
export function linearTicks(d0: number, d1: number, count: number): number[] {
  const lo = Math.min(d0, d1),
    hi = Math.max(d0, d1);
  const step = niceStep(lo, hi, count);
  const out: number[] = [];
  if (!(step > 0) || !Number.isFinite(lo) || !Number.isFinite(hi)) return out;
  const first = Math.ceil(lo / step);
  const last = Math.floor(hi / step);
  for (let i = first; i <= last && out.length < 1000; i++) out.push(i * step);
  return out;
}

/** Decade ticks (10^k) inside a positive domain; at least the two ends if no decade falls inside. */
export function logTicks(d0: number, d1: number): number[] {
  const lo = Math.min(d0, d1),
    hi = Math.max(d0, d1);
  if (!(lo > 0) || !Number.isFinite(hi)) return [];
  const out: number[] = [];
  for (let k = Math.ceil(Math.log10(lo) - 1e-9); k <= Math.floor(Math.log10(hi) + 1e-9) && out.length < 400; k++)
    out.push(10 ** k);
  return out;
}

/** Extends [lo, hi] by a fraction on both sides; a zero-width span gets a unit-relative margin. */
export function padDomain(lo: number, hi: number, fraction: number): [number, number] {
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) return [-1, 1];
  const span = hi - lo;
  if (span > 0) return [lo - span * fraction, hi + span * fraction];
  const m = Math.abs(lo) > 0 ? Math.abs(lo) * 0.1 : 1;
  return [lo - m, hi + m];
}
