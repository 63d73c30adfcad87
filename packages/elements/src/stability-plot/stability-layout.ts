/**
 * Scales of `<tauline-stability-plot>` as a pure function of the drawn series and the box size:
 * a log τ axis, a dimensionless σ_y axis (left) and a time-deviation axis in seconds (right when
 * both are drawn, else left). Used by the element to draw and hit-test, and by tests to find points.
 *
 * @module
 */
import type { Frame } from '../internal/canvas.js';
import { logScale, type Scale } from '../internal/scale.js';
import type { StabilitySeries } from './stability-data.js';
import { deviationExtent } from './stability-draw.js';

/**
 * Statistics whose deviation is a time deviation σ_x in seconds (W. J. Riley, NIST SP 1065
 * (2008), TDEV σ_x(τ) = (τ/√3)·MDEV(τ), physics-refs §10 [M for the section]; TTOTDEV is its total
 * variant). Every other statistic is a dimensionless fractional-frequency deviation σ_y.
 */
const TIME_STATISTICS: ReadonlySet<string> = new Set(['tdev', 'ttotdev']);

/** True when `statistic` is a time deviation in seconds rather than a dimensionless σ_y. */
export function isTimeStatistic(statistic: string): boolean {
  return TIME_STATISTICS.has(statistic.toLowerCase());
}

/** The plot's scales: τ, one y scale per quantity (null when absent), the frame, and the extents the ticks need. */
export interface StabilityScales {
  sx: Scale;
  /** Dimensionless σ_y axis (left), null when only time deviations are shown. */
  syFrequency: Scale | null;
  /** Time-deviation axis in seconds: right when σ_y is also shown, else left; null without TDEV. */
  syTime: Scale | null;
  frame: Frame;
  /** Deviation ranges (with the intervals when shown) behind the y scales. */
  frequencyExtent: [number, number] | null;
  timeExtent: [number, number] | null;
  /** The τ range of the data before padding (a single τ widened to [τ/3, 3τ]). */
  tauRange: [number, number];
}

/** The y scale of a statistic on `scales` (null when its quantity has none). */
export function scaleOf(scales: StabilityScales, statistic: string): Scale | null {
  return isTimeStatistic(statistic) ? scales.syTime : scales.syFrequency;
}

/**
 * Scales for the drawn (non-empty, not hidden) `series` in a box of `width` × `height` CSS px: τ
 * padded by 6 % of its decades, each deviation axis by 8 %; null when nothing can be drawn.
 */
export function stabilityScales(
  series: readonly StabilitySeries[],
  withIntervals: boolean,
  width: number,
  height: number,
): StabilityScales | null {
  const frequencyExtent = deviationExtent(
    series.filter((s) => !isTimeStatistic(s.statistic)),
    withIntervals,
  );
  const timeExtent = deviationExtent(
    series.filter((s) => isTimeStatistic(s.statistic)),
    withIntervals,
  );
  if (!frequencyExtent && !timeExtent) return null;
  const dual = frequencyExtent !== null && timeExtent !== null;
  // Left margin: rotated title (≈ 16 px) + gap + tick labels such as "1e−13" (≈ 40 px) + tick gap.
  const frame: Frame = {
    left: 70,
    top: 8,
    width: Math.max(10, width - (dual ? 140 : 82)),
    height: Math.max(10, height - 60),
  };
  let t0 = Infinity,
    t1 = -Infinity;
  for (const s of series) {
    const first = s.tau[0],
      last = s.tau[s.tau.length - 1];
    if (first !== undefined && last !== undefined) {
      t0 = Math.min(t0, first);
      t1 = Math.max(t1, last);
    }
  }
  if (!(t1 > t0)) {
    t0 /= 3;
    t1 *= 3;
  }
  const tauRange: [number, number] = [t0, t1];
  const padX = (Math.log10(t1) - Math.log10(t0)) * 0.06;
  const sx = logScale(t0 / 10 ** padX, t1 * 10 ** padX, frame.left, frame.left + frame.width);
  const yScale = (e: [number, number] | null): Scale | null => {
    if (!e) return null;
    const pad = (Math.log10(e[1]) - Math.log10(e[0])) * 0.08;
    return logScale(e[0] / 10 ** pad, e[1] * 10 ** pad, frame.top + frame.height, frame.top);
  };
  const syFrequency = yScale(frequencyExtent),
    syTime = yScale(timeExtent);
  return { sx, syFrequency, syTime, frame, frequencyExtent, timeExtent, tauRange };
}
