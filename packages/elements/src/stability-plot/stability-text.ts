/**
 * Names, accessible label, legend markers and keyboard stepping of `<tauline-stability-plot>`: pure
 * functions of the series (no element state), so the element only wires them up.
 *
 * @module
 */
import { html, type TemplateResult } from 'lit';
import { formatDuration, formatFraction } from '../internal/format.js';
import type { StabilitySet } from './stability-data.js';
import type { PlotShape } from './stability-draw.js';
import { isTimeStatistic } from './stability-layout.js';

const LABELS: Record<string, string> = {
  adev: 'ADEV',
  oadev: 'Overlapping ADEV',
  mdev: 'MDEV',
  tdev: 'TDEV',
  ttotdev: 'TTOTDEV',
  hdev: 'HDEV',
  ohdev: 'Overlapping HDEV',
  totdev: 'TOTDEV',
};

/** Display name of a statistic: `Overlapping ADEV`, `TDEV`, or the name as given. */
export function statLabel(name: string): string {
  return LABELS[name] ?? name;
}

/** Short name for table rows: `OADEV`, `TDEV`, or the name as given. */
export function statCode(name: string): string {
  return LABELS[name] ? name.toUpperCase() : name;
}

type Series = StabilitySet['series'][number];

/** Accessible name of the plot from the series drawn: τ span, and each quantity with its unit and range. */
export function stabilityLabel(s: readonly Series[]): string {
  if (s.length === 0) return 'Stability plot: no data';
  let t0 = Infinity,
    t1 = -Infinity;
  for (const x of s) {
    const first = x.tau[0],
      last = x.tau[x.tau.length - 1];
    if (first !== undefined && last !== undefined) {
      t0 = Math.min(t0, first);
      t1 = Math.max(t1, last);
    }
  }
  const part = (group: readonly Series[], what: string, unit: string): string => {
    let d0 = Infinity,
      d1 = -Infinity;
    for (const x of group)
      for (const d of x.deviation) {
        if (d < d0) d0 = d;
        if (d > d1) d1 = d;
      }
    const names = group.map((x) => statLabel(x.statistic)).join(', ');
    return `${names} (${what}) from ${formatFraction(d0, 3)}${unit} to ${formatFraction(d1, 3)}${unit}`;
  };
  const freq = s.filter((x) => !isTimeStatistic(x.statistic)),
    time = s.filter((x) => isTimeStatistic(x.statistic));
  const parts: string[] = [];
  if (freq.length > 0) parts.push(part(freq, 'fractional frequency, dimensionless', ''));
  if (time.length > 0)
    parts.push(part(time, `time deviation in seconds${freq.length > 0 ? ', right axis' : ''}`, ' s'));
  return `Stability plot, log–log, τ from ${formatDuration(t0)} to ${formatDuration(t1)}: ${parts.join('; ')}`;
}

/** A legend marker (open shape, as on the canvas) in SVG. */
export function svgMarker(shape: PlotShape, color: string): TemplateResult {
  const r = 3.6;
  const d = new Map<PlotShape, string>([
    ['circle', ''],
    ['square', `M${-r * 0.8} ${-r * 0.8}h${r * 1.6}v${r * 1.6}h${-r * 1.6}z`],
    ['diamond', `M0 ${-r}L${r} 0L0 ${r}L${-r} 0z`],
    ['triangle-up', `M0 ${-r}L${r} ${r * 0.8}L${-r} ${r * 0.8}z`],
    ['triangle-down', `M0 ${r}L${r} ${-r * 0.8}L${-r} ${-r * 0.8}z`],
    ['cross', `M${-r} ${-r}L${r} ${r}M${r} ${-r}L${-r} ${r}`],
    ['plus', `M${-r} 0H${r}M0 ${-r}V${r}`],
  ]);
  return shape === 'circle'
    ? html`<svg><circle r=${r * 0.85} fill="var(--surface)" stroke=${color} stroke-width="1.5"></circle></svg>`
    : html`<svg><path d=${d.get(shape) ?? ''} fill="var(--surface)" stroke=${color} stroke-width="1.5"></path></svg>`;
}

/** A point of the plot: series index k (`s`) and point index `i`. */
export type PointRef = { s: number; i: number };

/** The keys {@link stepPoint} handles. */
export const STEP_KEYS: ReadonlySet<string> = new Set(['ArrowRight', 'ArrowLeft', 'ArrowDown', 'ArrowUp', 'Escape']);

/**
 * The point after a key: ←/→ step through a statistic's points (first: the first or last point of
 * the first drawn statistic), ↑/↓ switch statistic (same τ index where it exists), Escape clears.
 * `drawn`: the drawn series (index k, point count n) in order; `length(k)`: point count of series k.
 */
export function stepPoint(
  key: string,
  drawn: ReadonlyArray<{ k: number; n: number }>,
  cur: PointRef | null,
  length: (k: number) => number,
): PointRef | null {
  if (key === 'ArrowRight' || key === 'ArrowLeft') {
    const dir = key === 'ArrowRight' ? 1 : -1;
    const first = drawn[0];
    if (!cur) return first ? { s: first.k, i: dir > 0 ? 0 : first.n - 1 } : cur;
    return { s: cur.s, i: Math.min(length(cur.s) - 1, Math.max(0, cur.i + dir)) };
  }
  if (key === 'ArrowDown' || key === 'ArrowUp') {
    const dir = key === 'ArrowDown' ? 1 : -1;
    const at = cur ? drawn.findIndex((x) => x.k === cur.s) : -1;
    const target = drawn[Math.min(drawn.length - 1, Math.max(0, at < 0 ? 0 : at + dir))];
    return target ? { s: target.k, i: Math.min(target.n - 1, cur?.i ?? 0) } : cur;
  }
  return key === 'Escape' ? null : cur;
}
