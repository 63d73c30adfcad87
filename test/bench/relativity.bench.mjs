// Relativity batch APIs, Kepler's equation and proper-time integration. Imports the built SDK
// (packages/sdk/dist). Prints times, ratios and targets; asserts nothing.
//
// 1. Batch APIs (relativity/batch.ts) over one day at 1 s for a 30-satellite constellation (30 × 86 400 epochs),
//    against a per-call loop of the scalar functions (baseline, same run, same inputs; results compared).
//    Target: each batch call ≥ 2× the per-call loop.
// 2. solveKepler on the same 2.6 M mean anomalies (GNSS eccentricities) and on high eccentricities, against a
//    plain Newton iteration written here (baseline: no bracketing, no residual guarantee).
//    Target: ≥ 1 M solves/s, and ≥ 0.5× the plain Newton speed (solveKepler also brackets and polishes).
// 3. integrateProperTime for one day (MEO, GEO, LEO; j2 model, 60-s output) with its step counts, against the
//    point-mass model on the same orbit (baseline: same integrator, cheaper force).
//    Target: one day of MEO under 1 s on this machine, and the j2 model ≤ 2× the point-mass time.
import { cpus } from 'node:os';
import { DEFAULT_CONSTANT_SET } from '../../packages/sdk/dist/constants.js';
import { solveKepler } from '../../packages/sdk/dist/orbit/index.js';
import {
  integrateProperTime,
  j2PeriodicTermBatch,
  j2PeriodicTermFromStatesBatch,
  j2ResidualPeriodicTerm,
  periodicCorrectionFromElements,
  periodicCorrectionFromElementsBatch,
  periodicCorrectionFromState,
  periodicCorrectionFromStatesBatch,
} from '../../packages/sdk/dist/relativity/index.js';
import { growthExponent } from './baselines/native.mjs';

const GM = DEFAULT_CONSTANT_SET.gm;
const EPOCHS = 86_400;
const SATELLITES = 30;
const out = (line) => process.stdout.write(`${line}\n`);
const fmt = (ms) => (ms >= 1000 ? `${(ms / 1000).toFixed(2)} s` : `${ms.toFixed(1)} ms`);
const rate = (n, ms) => `${(((n / ms) * 1000) / 1e6).toFixed(2)} M/s`;

/** Invented 30-satellite MEO constellation: 3 planes at 56°, a = 29 599.8 km, e from 1e-4 to 0.02. */
function constellation() {
  const sats = [];
  for (let k = 0; k < SATELLITES; k++) {
    const plane = k % 3;
    sats.push({
      a: 29_599_800 + 50 * k,
      e: 1e-4 + (0.02 - 1e-4) * (k / (SATELLITES - 1)),
      i: (56 * Math.PI) / 180,
      raan: (2 * Math.PI * plane) / 3,
      w: 0.3 * k,
      m0: (2 * Math.PI * Math.floor(k / 3)) / 10 + 0.2 * plane,
    });
  }
  return sats;
}

/** Inputs for one satellite over the day, prepared outside the timed regions: M, E, u and inertial states. */
function inputs(s) {
  const n = Math.sqrt(GM / s.a ** 3);
  const M = new Float64Array(EPOCHS),
    E = new Float64Array(EPOCHS),
    u = new Float64Array(EPOCHS),
    states = new Float64Array(6 * EPOCHS);
  const cO = Math.cos(s.raan),
    sO = Math.sin(s.raan),
    ci = Math.cos(s.i),
    si = Math.sin(s.i),
    cw = Math.cos(s.w),
    sw = Math.sin(s.w);
  const P = [cO * cw - sO * sw * ci, sO * cw + cO * sw * ci, sw * si];
  const Q = [-cO * sw - sO * cw * ci, -sO * sw + cO * cw * ci, cw * si];
  const q = Math.sqrt(1 - s.e * s.e);
  for (let t = 0; t < EPOCHS; t++) {
    const m = s.m0 + n * t;
    let e = m;
    for (let k = 0; k < 6; k++) e -= (e - s.e * Math.sin(e) - m) / (1 - s.e * Math.cos(e));
    M[t] = m;
    E[t] = e;
    const nu = 2 * Math.atan2(Math.sqrt(1 + s.e) * Math.sin(e / 2), Math.sqrt(1 - s.e) * Math.cos(e / 2));
    u[t] = s.w + nu;
    const x = s.a * (Math.cos(e) - s.e),
      y = s.a * q * Math.sin(e);
    const rdot = (n * s.a) / (1 - s.e * Math.cos(e));
    const vx = -rdot * Math.sin(e),
      vy = rdot * q * Math.cos(e);
    for (let c = 0; c < 3; c++) {
      states[6 * t + c] = x * P[c] + y * Q[c];
      states[6 * t + 3 + c] = vx * P[c] + vy * Q[c];
    }
  }
  return { M, E, u, states };
}

function timed(fn) {
  const t0 = performance.now();
  fn();
  return performance.now() - t0;
}

function maxDiff(a, b) {
  let m = 0;
  for (let k = 0; k < a.length; k++) m = Math.max(m, Math.abs(a[k] - b[k]));
  return m;
}

/** Baseline Kepler solver: Newton from E0 = M + e sin M until |ΔE| ≤ 1e-15 (at most 50 steps). */
function keplerNewton(M, e) {
  let E = M + e * Math.sin(M);
  for (let k = 0; k < 50; k++) {
    const d = (E - e * Math.sin(E) - M) / (1 - e * Math.cos(E));
    E -= d;
    if (Math.abs(d) <= 1e-15) break;
  }
  return E;
}

function batchSection() {
  const sats = constellation();
  const N = SATELLITES * EPOCHS;
  out(
    `\nBatch APIs, ${SATELLITES} satellites × ${EPOCHS} epochs (one day at 1 s) = ${(N / 1e6).toFixed(2)} M evaluations; baseline: per-call loop of the scalar function`,
  );
  const rows = {
    elements: {
      label: 'periodicCorrectionFromElementsBatch vs periodicCorrectionFromElements',
      batch: 0,
      loop: 0,
      diff: 0,
    },
    states: {
      label: 'periodicCorrectionFromStatesBatch vs periodicCorrectionFromState({position, velocity})',
      batch: 0,
      loop: 0,
      diff: 0,
    },
    j2: { label: 'j2PeriodicTermBatch vs j2ResidualPeriodicTerm', batch: 0, loop: 0, diff: 0 },
    j2states: {
      label: 'j2PeriodicTermFromStatesBatch (whole day) vs the same called once per epoch',
      batch: 0,
      loop: 0,
      diff: 0,
    },
    kepler: { label: 'solveKepler vs plain Newton (baseline), e = 1e-4 … 0.02', batch: 0, loop: 0, diff: 0 },
  };
  const res = new Float64Array(EPOCHS);
  const ref = new Float64Array(EPOCHS);
  // One warm-up pass of each path on the first satellite's inputs, not timed.
  const warm = inputs(sats[0]);
  for (const pass of [true, false]) {
    for (const s of pass ? [sats[0]] : sats) {
      const x = pass ? warm : inputs(s);
      const add = (key, batchMs, loopMs) => {
        if (pass) return;
        rows[key].batch += batchMs;
        rows[key].loop += loopMs;
        rows[key].diff = Math.max(rows[key].diff, maxDiff(res, ref));
      };
      add(
        'elements',
        timed(() => periodicCorrectionFromElementsBatch(s.a, s.e, x.E, { constants: DEFAULT_CONSTANT_SET, out: res })),
        timed(() => {
          for (let t = 0; t < EPOCHS; t++) ref[t] = periodicCorrectionFromElements(s.a, s.e, x.E[t]);
        }),
      );
      add(
        'states',
        timed(() => periodicCorrectionFromStatesBatch(x.states, { out: res })),
        timed(() => {
          const st = x.states;
          for (let t = 0; t < EPOCHS; t++) {
            const o = 6 * t;
            ref[t] = periodicCorrectionFromState({
              position: [st[o], st[o + 1], st[o + 2]],
              velocity: [st[o + 3], st[o + 4], st[o + 5]],
            });
          }
        }),
      );
      add(
        'j2',
        timed(() => j2PeriodicTermBatch(s.a, s.i, x.u, 'residual', { constants: DEFAULT_CONSTANT_SET, out: res })),
        timed(() => {
          for (let t = 0; t < EPOCHS; t++) ref[t] = j2ResidualPeriodicTerm(s.a, s.i, x.u[t]);
        }),
      );
      add(
        'j2states',
        timed(() => j2PeriodicTermFromStatesBatch(x.states, 'residual', { constants: DEFAULT_CONSTANT_SET, out: res })),
        timed(() => {
          for (let t = 0; t < EPOCHS; t++)
            ref[t] = j2PeriodicTermFromStatesBatch(x.states.subarray(6 * t, 6 * t + 6))[0];
        }),
      );
      add(
        'kepler',
        timed(() => {
          for (let t = 0; t < EPOCHS; t++) res[t] = solveKepler(x.M[t], s.e);
        }),
        timed(() => {
          for (let t = 0; t < EPOCHS; t++) ref[t] = keplerNewton(x.M[t], s.e);
        }),
      );
    }
  }
  for (const [key, r] of Object.entries(rows)) {
    const ratio = r.loop / r.batch;
    const unit = key === 'kepler' ? 'rad' : 's';
    let target;
    if (key === 'kepler') {
      const ok = (N / r.batch) * 1000 >= 1e6 && ratio >= 0.5;
      target = `target ≥ 1 M/s and ≥ 0.5× baseline: ${ok ? 'met' : 'NOT met'}`;
    } else {
      target = `target ≥ 2×: ${ratio >= 2 ? 'met' : 'NOT met'}`;
    }
    out(`  ${r.label}`);
    out(
      `    ${fmt(r.batch)} (${rate(N, r.batch)}) vs baseline ${fmt(r.loop)} (${rate(N, r.loop)})  → ×${ratio.toFixed(2)}; ` +
        `max |difference| ${r.diff.toExponential(1)} ${unit}; ${target}`,
    );
  }
}

function keplerHighEccentricity() {
  out('\nsolveKepler at high eccentricity, 100 000 mean anomalies evenly over (−π, π] each');
  const n = 100_000;
  const M = new Float64Array(n);
  for (let k = 0; k < n; k++) M[k] = -Math.PI + (2 * Math.PI * (k + 1)) / n;
  for (const e of [0.3, 0.7, 0.95, 0.999]) {
    const E = new Float64Array(n);
    const B = new Float64Array(n);
    const a = timed(() => {
      for (let k = 0; k < n; k++) E[k] = solveKepler(M[k], e);
    });
    const b = timed(() => {
      for (let k = 0; k < n; k++) B[k] = keplerNewton(M[k], e);
    });
    let ra = 0,
      rb = 0;
    for (let k = 0; k < n; k++) {
      ra = Math.max(ra, Math.abs(E[k] - e * Math.sin(E[k]) - M[k]));
      rb = Math.max(rb, Number.isFinite(B[k]) ? Math.abs(B[k] - e * Math.sin(B[k]) - M[k]) : Infinity);
    }
    out(
      `  e = ${String(e).padEnd(5)} solveKepler ${fmt(a)} (${rate(n, a)}, max residual ${ra.toExponential(1)} rad); ` +
        `plain Newton ${fmt(b)} (${rate(n, b)}, max residual ${rb.toExponential(1)} rad)  → ×${(b / a).toFixed(2)}`,
    );
  }
}

function properTimeSection() {
  out(
    '\nintegrateProperTime, one day (86 400 s), output every 60 s (1 441 samples), default tolerance 1e-12, fastest of 3 runs; baseline: point-mass model',
  );
  const circ = (a, incDeg, e = 0) => {
    // Perigee on the x axis, ascending node at x: r = a(1 − e), v = √(GM(1 + e)/(a(1 − e))) in the plane.
    const r = a * (1 - e),
      v = Math.sqrt((GM * (1 + e)) / r),
      i = (incDeg * Math.PI) / 180;
    return { position: [r, 0, 0], velocity: [0, v * Math.cos(i), v * Math.sin(i)] };
  };
  const orbits = [
    ['MEO  a = 29 600 km, e = 2e-4, i = 56°', circ(29_599_800, 56, 2e-4)],
    ['GEO  a = 42 164 km, e = 0,    i = 0.05°', circ(42_164_170, 0.05)],
    ['LEO  a =  7 078 km, e = 1e-3, i = 98°', circ(7_078_137, 98, 1e-3)],
  ];
  // Warm-up of both models on every orbit, then the fastest of 3 runs (single runs take milliseconds).
  for (const [, state] of orbits)
    for (const model of ['j2', 'point-mass']) integrateProperTime(state, 86_400, 60, { model });
  const best = (fn) => Math.min(timed(fn), timed(fn), timed(fn));
  let meoMs = 0;
  for (const [label, state] of orbits) {
    let j2;
    let pm;
    const a = best(() => {
      j2 = integrateProperTime(state, 86_400, 60);
    });
    const b = best(() => {
      pm = integrateProperTime(state, 86_400, 60, { model: 'point-mass' });
    });
    if (label.startsWith('MEO')) meoMs = a;
    out(
      `  ${label}: j2 ${fmt(a)}, ${j2.acceptedSteps} accepted + ${j2.rejectedSteps} rejected steps (${((a * 1000) / (j2.acceptedSteps + j2.rejectedSteps)).toFixed(1)} µs/step), ` +
        `τ − TT at 1 d ${(j2.tauMinusTT.at(-1) * 1e6).toFixed(3)} µs; point-mass ${fmt(b)}, ${pm.acceptedSteps} + ${pm.rejectedSteps} steps  → j2/point-mass ×${(a / b).toFixed(2)}` +
        ` (target ≤ 2: ${a / b <= 2 ? 'met' : 'NOT met'})`,
    );
  }
  out(`  target: one day of MEO under 1 s: ${meoMs < 1000 ? 'met' : 'NOT met'} (${fmt(meoMs)})`);
  const dense = best(() => integrateProperTime(orbits[0][1], 86_400, 1));
  out(
    `  MEO one day at 1-s output (86 401 samples): ${fmt(dense)}  → ×${(dense / meoMs).toFixed(2)} of the 60-s output (dense-output cost)`,
  );
}

/**
 * Growth of each case with its size: the batch APIs and solveKepler over 10^4, 10^5 and 10^6 epochs of one
 * satellite (the day's inputs tiled), proper time over 1, 4 and 16 days; the exponent of a least-squares fit
 * of log time against log size (1 = linear). Best of three runs per size.
 */
function growthSection() {
  out('\nGrowth exponents over three sizes (1 = linear; best of 3 runs per size)');
  const s = constellation()[SATELLITES - 1];
  const day = inputs(s);
  const sizes = [1e4, 1e5, 1e6];
  const tile = (src, n, width = 1) => {
    const a = new Float64Array(n * width);
    for (let k = 0; k < n * width; k++) a[k] = src[k % src.length];
    return a;
  };
  const best = (fn) => Math.min(timed(fn), timed(fn), timed(fn));
  const cases = [
    [
      'periodicCorrectionFromElementsBatch',
      (n) => {
        const E = tile(day.E, n);
        const o = new Float64Array(n);
        return () => periodicCorrectionFromElementsBatch(s.a, s.e, E, { constants: DEFAULT_CONSTANT_SET, out: o });
      },
    ],
    [
      'periodicCorrectionFromStatesBatch',
      (n) => {
        const st = tile(day.states, n, 6);
        const o = new Float64Array(n);
        return () => periodicCorrectionFromStatesBatch(st, { out: o });
      },
    ],
    [
      'j2PeriodicTermBatch',
      (n) => {
        const u = tile(day.u, n);
        const o = new Float64Array(n);
        return () => j2PeriodicTermBatch(s.a, s.i, u, 'residual', { constants: DEFAULT_CONSTANT_SET, out: o });
      },
    ],
    [
      'solveKepler (loop)',
      (n) => {
        const M = tile(day.M, n);
        const o = new Float64Array(n);
        return () => {
          for (let t = 0; t < n; t++) o[t] = solveKepler(M[t], s.e);
        };
      },
    ],
  ];
  for (const [label, make] of cases) {
    const times = sizes.map((n) => {
      const fn = make(n);
      fn();
      return best(fn);
    });
    out(
      `  ${label.padEnd(38)} ${times.map((t, k) => `${sizes[k].toExponential(0)}: ${fmt(t)}`).join(', ')}  → exponent ${growthExponent(sizes, times).toFixed(2)}`,
    );
  }
  const state = {
    position: [29_599_800, 0, 0],
    velocity: [0, Math.sqrt(GM / 29_599_800) * Math.cos(0.977), Math.sqrt(GM / 29_599_800) * Math.sin(0.977)],
  };
  const days = [1, 4, 16];
  const pt = days.map((d) => best(() => integrateProperTime(state, d * 86_400, 600)));
  out(
    `  ${'integrateProperTime (j2, MEO)'.padEnd(38)} ${pt.map((t, k) => `${days[k]} d: ${fmt(t)}`).join(', ')}  → exponent ${growthExponent(days, pt).toFixed(2)}`,
  );
}

export default function run() {
  out(`${cpus().length} × ${cpus()[0]?.model ?? 'cpu'}, ${new Date().toISOString()}`);
  batchSection();
  keplerHighEccentricity();
  properTimeSection();
  growthSection();
}
