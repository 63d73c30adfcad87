/**
 * The events the elements fire, with their detail types. All bubble and cross shadow roots
 * (`composed: true`), and fire only as the result of a user action, never when the host sets
 * a property.
 *
 * @module
 */
import type { SteeringCommandView } from './steering-schedule/plan-data.js';

/** Detail of `tauline-command-select`: the user picked a command (marker, table row or keyboard). */
export interface CommandSelectDetail {
  /** Index of the command in `plan.commands`. */
  index: number;
  /** The command object as given in `plan.commands`. */
  command: SteeringCommandView['source'];
  /** Execution time, seconds since the scenario epoch. */
  executeAtSeconds: number;
}

/** Detail of `tauline-view-change`: the user zoomed or panned the time axis. */
export interface ViewChangeDetail {
  /** Start of the visible span, seconds since the scenario epoch. */
  startSeconds: number;
  /** End of the visible span, seconds since the scenario epoch. */
  endSeconds: number;
}

/** Detail of `tauline-spacecraft-select`: the user opened a spacecraft's findings. */
export interface SpacecraftSelectDetail {
  /** The spacecraft id as given in the review. */
  id: string;
  /** Its verdict. */
  verdict: string;
}

/** Event map, for typed `addEventListener` on the elements. */
export interface TaulineEventMap {
  'tauline-command-select': CustomEvent<CommandSelectDetail>;
  'tauline-view-change': CustomEvent<ViewChangeDetail>;
  'tauline-spacecraft-select': CustomEvent<SpacecraftSelectDetail>;
}

declare global {
  interface GlobalEventHandlersEventMap extends TaulineEventMap {}
}

/** Dispatches a bubbling, composed CustomEvent from `target`. */
export function emit<K extends keyof TaulineEventMap>(
  target: EventTarget,
  type: K,
  detail: TaulineEventMap[K]['detail'],
): boolean {
  return target.dispatchEvent(new CustomEvent(type, { detail, bubbles: true, composed: true, cancelable: false }));
}
