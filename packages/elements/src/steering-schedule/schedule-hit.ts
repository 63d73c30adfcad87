/**
 * Pointer hit testing and the accessible name of `<tauline-steering-schedule>`: pure functions of the
 * plan view, the scales and the drawn markers (no element state), so the element only wires them up.
 *
 * @module
 */

import { formatChartUtc } from '../internal/calendar-axis.js';
import { closestIndex } from '../internal/decimate.js';
import { formatOffsetAuto } from '../internal/format.js';
import type { PlanView } from './plan-data.js';
import type { CommandMarker, ScheduleHover, ScheduleScales } from './schedule-draw.js';

/** The command whose marker is nearest to (x, y) within 11 px, or −1. */
export function hitMarker(markers: readonly CommandMarker[], x: number, y: number): number {
  let best = -1,
    bestD = 11 * 11;
  for (const m of markers) {
    const dd = (m.x - x) ** 2 + (m.y - y) ** 2;
    if (dd < bestD) {
      bestD = dd;
      best = m.c;
    }
  }
  return best;
}

/**
 * What the pointer at (x, y) hovers: null outside the frame, a command marker when one is within
 * reach, else the nearest sample; undefined when there is no sample to show (keep the hover as is).
 */
export function hoverAt(
  x: number,
  y: number,
  d: PlanView,
  sc: ScheduleScales,
  markers: readonly CommandMarker[],
): ScheduleHover | null | undefined {
  const { frame } = sc;
  const inside = x >= frame.left && x <= frame.left + frame.width && y >= frame.top && y <= frame.top + frame.height;
  if (!inside) return null;
  const c = hitMarker(markers, x, y);
  if (c >= 0) return { kind: 'command', c, px: x };
  const i = closestIndex(d.t, sc.sx.invert(x));
  const t = d.t[i];
  return t === undefined ? undefined : { kind: 'sample', i, px: sc.sx.map(t) };
}

/** Whether two hovers point at the same sample or command (the read-out need not change). */
export function sameHover(a: ScheduleHover | null, b: ScheduleHover | null): boolean {
  if (a === null || b === null) return a === b;
  if (a.kind === 'command') return b.kind === 'command' && a.c === b.c;
  return b.kind === 'sample' && a.i === b.i;
}

/** Accessible name of the plot, from the data: span, commands, largest steered |offset| `worst` (s), tolerance. */
export function scheduleLabel(d: PlanView | null, worst: number): string {
  const first = d?.t[0],
    last = d?.t[d.t.length - 1];
  if (!d || first === undefined || last === undefined) return 'Steering schedule plot: no data';
  const freq = d.commands.filter((c) => c.kind === 'frequency').length;
  const phase = d.commands.length - freq;
  const span = `${formatChartUtc(d, first)} to ${formatChartUtc(d, last)}`;
  const tol = d.tolerance !== null ? ` against a tolerance of ±${formatOffsetAuto(d.tolerance, 3)}` : '';
  return (
    `Predicted clock offset from ${span}; ${d.commands.length} command${d.commands.length === 1 ? '' : 's'} ` +
    `(${freq} frequency, ${phase} phase); largest steered |offset| ${formatOffsetAuto(worst, 3)}${tol}; ` +
    `plan ${d.feasible ? 'feasible' : 'not feasible'}`
  );
}
