/**
 * The revision layer of `<tauline-steering-schedule>`: commands a re-plan superseded (faded,
 * hollow markers on the steered line) and the clock-offset estimates the re-plan used (points
 * with ±1σ bars). Input adapter and drawing; never throws (unreadable entries are counted).
 *
 * @module
 */
import { elapsed, interpolate, type PlanClock, StampError } from './plan-data.js';
import { describeFailure, guardRevisions } from './plan-guard.js';

/** What the layer draws, in seconds since the scenario epoch. */
export interface RevisionView {
  superseded: Array<{ executeAt: number; kind: 'frequency' | 'phase' }>;
  estimates: Array<{ t: number; phase: number; sigma: number }>;
}

/**
 * Reads `superseded` (SteeringCommandJson objects with ISO 8601 `executeAt`, the SDK's
 * `revision.superseded`) and `estimates` (`ClockOffsetEstimate`s, as given to `replanSteering`)
 * against the scenario epoch; an error naming the first unreadable field (nothing is skipped).
 */
export function readRevisions(
  superseded: unknown,
  estimates: unknown,
  clock: PlanClock,
): { ok: true; view: RevisionView } | { ok: false; error: string } {
  const guarded = guardRevisions(superseded, estimates);
  if (!guarded.ok) return { ok: false, error: describeFailure(guarded.failure) };
  try {
    const view: RevisionView = {
      superseded: guarded.superseded.map((c, k) => ({
        executeAt: elapsed(clock, c.executeAt, `superseded[${k}].executeAt`),
        kind: c.kind,
      })),
      estimates: [],
    };
    for (const [k, e] of guarded.estimates.entries()) {
      const bad = !Number.isFinite(e.tSeconds)
        ? 'tSeconds'
        : !Number.isFinite(e.phaseSeconds)
          ? 'phaseSeconds'
          : !(Number.isFinite(e.sigmaSeconds) && e.sigmaSeconds >= 0)
            ? 'sigmaSeconds'
            : null;
      if (bad) {
        const msg = `estimates[${k}].${bad} must be a finite number of seconds (σ ≥ 0); received ${String(e[bad])}`;
        return { ok: false, error: msg };
      }
      view.estimates.push({ t: e.tSeconds, phase: e.phaseSeconds, sigma: e.sigmaSeconds });
    }
    return { ok: true, view };
  } catch (error) {
    if (error instanceof StampError) return { ok: false, error: error.message };
    throw error;
  }
}

/** Pixel positions of what was drawn (kept by the element for tests and hit-testing). */
export interface RevisionMarks {
  superseded: Array<{ x: number; y: number }>;
  estimates: Array<{ x: number; y: number; yLow: number; yHigh: number }>;
}

interface Scale {
  map(v: number): number;
}

/**
 * Draws the layer inside `frame` (the caller has clipped to it) for the visible span [x0, x1]:
 * superseded commands as hollow dashed markers at 40 % opacity on the steered line, estimates as
 * dots with a vertical bar from phase − σ to phase + σ, at 60 % opacity in the text colour.
 */
export function drawRevisions(
  ctx: CanvasRenderingContext2D,
  frame: { top: number; height: number },
  sx: Scale,
  sy: Scale,
  span: [number, number],
  line: { t: Float64Array; y: Float64Array },
  rev: RevisionView,
  colors: { command: string; estimate: string },
): RevisionMarks {
  const marks: RevisionMarks = { superseded: [], estimates: [] };
  const clampY = (y: number): number => Math.min(frame.top + frame.height - 6, Math.max(frame.top + 6, y));
  ctx.save();
  ctx.globalAlpha = 0.4;
  ctx.strokeStyle = colors.command;
  ctx.lineWidth = 1.5;
  ctx.setLineDash([2, 2]);
  for (const c of rev.superseded) {
    if (c.executeAt < span[0] || c.executeAt > span[1]) continue;
    let yv = interpolate(line.t, line.y, c.executeAt);
    if (!Number.isFinite(yv)) yv = 0;
    const x = sx.map(c.executeAt);
    const y = clampY(sy.map(yv));
    ctx.beginPath();
    if (c.kind === 'phase') ctx.rect(x - 5, y - 5, 10, 10);
    else ctx.arc(x, y, 5, 0, 2 * Math.PI);
    ctx.stroke();
    marks.superseded.push({ x, y });
  }
  ctx.setLineDash([]);
  ctx.globalAlpha = 0.6;
  ctx.strokeStyle = colors.estimate;
  ctx.fillStyle = colors.estimate;
  ctx.lineWidth = 1;
  for (const e of rev.estimates) {
    if (e.t < span[0] || e.t > span[1]) continue;
    const x = sx.map(e.t);
    const y = sy.map(e.phase);
    const yLow = sy.map(e.phase - e.sigma);
    const yHigh = sy.map(e.phase + e.sigma);
    ctx.beginPath();
    ctx.moveTo(Math.round(x) + 0.5, yLow);
    ctx.lineTo(Math.round(x) + 0.5, yHigh);
    ctx.stroke();
    ctx.beginPath();
    ctx.arc(x, y, 2.5, 0, 2 * Math.PI);
    ctx.fill();
    marks.estimates.push({ x, y, yLow, yHigh });
  }
  ctx.restore();
  return marks;
}
