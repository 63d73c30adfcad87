// Invented test data (no real spacecraft): a three-day steering plan on a 5-minute grid.
export const EPOCH = '2031-04-02T00:00:00Z';
const EPOCH_MS = Date.parse(EPOCH);
const iso = (s: number): string => new Date(EPOCH_MS + s * 1000).toISOString();

export interface FixturePlanOptions {
  samples?: number;
  spanSeconds?: number;
}

/** A plan shaped like the planner output: two frequency steps (one up, one down) and a phase step. */
export function makePlan(options: FixturePlanOptions = {}) {
  const n = options.samples ?? 865;
  const span = options.spanSeconds ?? 3 * 86400;
  const t = new Float64Array(n);
  const steered = new Float64Array(n);
  const sigma = new Float64Array(n);
  const unsteered = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const s = (span * i) / (n - 1);
    t[i] = s;
    unsteered[i] = 2e-9 + 6e-14 * s;
    steered[i] = 2e-9 * Math.cos(s / 40000) + 1e-10 * Math.sin(s / 900);
    sigma[i] = 3e-10 + 1e-15 * s;
  }
  return {
    feasible: true,
    commands: [
      { uplinkAt: iso(20000), executeAt: iso(30000), kind: 'frequency', fractionalFrequencyStep: -6e-14, actuatorSteps: -6, reason: 'offset would leave the band before the next contact' },
      { uplinkAt: iso(100000), executeAt: iso(110000), kind: 'frequency', fractionalFrequencyStep: 2e-14, actuatorSteps: 2, reason: 'trim after manoeuvre' },
      { uplinkAt: iso(180000), executeAt: iso(190000), kind: 'phase', phaseStepSeconds: -1.5e-9, actuatorSteps: -15, reason: 'recentre phase' },
    ],
    predicted: { t, steered: { phaseSeconds: steered, sigmaSeconds: sigma }, unsteered: { phaseSeconds: unsteered, sigmaSeconds: sigma } },
    metrics: { worstOffsetSeconds: 4.1e-9, probabilityInTolerance: 0.9987, commandCount: 3 },
  };
}

export function makeScenario() {
  return {
    epoch: EPOCH,
    horizonSeconds: 3 * 86400,
    tolerance: { phaseSeconds: 5e-9, probability: 0.95 },
    contacts: [
      { start: iso(18000), end: iso(22000) },
      { start: iso(98000), end: iso(102000) },
      { start: iso(178000), end: iso(182000) },
    ],
    maneuvers: [{ at: iso(90000), semiMajorAxisBefore: 27_750_000, semiMajorAxisAfter: 27_750_180 }],
  };
}

/** Collects warnings instead of logging them (tests must not log). */
export async function captureWarnings(): Promise<{ list: Array<{ code: string; message: string }>; restore: () => void }> {
  const { setWarningHandler } = await import('../src/internal/warn.js');
  const list: Array<{ code: string; message: string }> = [];
  const previous = setWarningHandler((code, message) => list.push({ code, message }));
  return { list, restore: () => setWarningHandler(previous) };
}
