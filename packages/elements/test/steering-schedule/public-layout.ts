// Where the element drew things, recomputed from its public surface only (its plan, scenario, attributes,
// public `view` and the plot box's size) with the pure layout functions it draws with (schedule-draw.ts).

import { type PlanView, readPlan } from '../../src/steering-schedule/plan-data.js';
import {
  type CommandMarker,
  commandMarkers,
  layoutSchedule,
  type ScheduleLayout,
  uncertaintyBand,
} from '../../src/steering-schedule/schedule-draw.js';
import type { TaulineSteeringSchedule } from '../../src/steering-schedule/steering-schedule.js';

export interface PublicLayout {
  view: PlanView;
  layout: ScheduleLayout;
  markers: CommandMarker[];
  /** The plot box's client rectangle (pointer events are placed relative to it). */
  rect: DOMRect;
  box: HTMLElement;
}

export function publicLayout(el: TaulineSteeringSchedule): PublicLayout {
  const box = el.shadowRoot!.querySelector<HTMLElement>('[part="plot"]')!;
  const rect = box.getBoundingClientRect();
  const read = readPlan(el.plan, el.scenario);
  if (!read.ok) throw new Error(read.error);
  const span = el.view!;
  const k = Number.isFinite(el.sigmaMultiple) && el.sigmaMultiple >= 0 ? el.sigmaMultiple : 2;
  const layout = layoutSchedule(
    read.view,
    uncertaintyBand(read.view, k),
    [span.startSeconds, span.endSeconds],
    { width: Math.floor(rect.width), height: Math.floor(rect.height) },
    { yUnit: el.yUnit, fitAll: el.fitAll, devicePixelRatio: globalThis.devicePixelRatio },
  );
  return { view: read.view, layout, markers: commandMarkers(read.view, layout.scales), rect, box };
}

/** RGBA of the data canvas at CSS pixel (x, y) of the plot box. */
export function pixelAt(el: TaulineSteeringSchedule, x: number, y: number): number[] {
  const canvas = el.shadowRoot!.querySelector<HTMLCanvasElement>('canvas.data')!;
  const ratio = canvas.width / canvas.getBoundingClientRect().width;
  return [...canvas.getContext('2d')!.getImageData(Math.round(x * ratio), Math.round(y * ratio), 1, 1).data];
}
