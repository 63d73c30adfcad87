// Stability statistics on 10^6 and 10^7 phase points at octave τ, against straightforward
// baselines measured in the same run:
//   - MDEV: the O(N·m) double loop of the NIST SP 1065 §5.2.5 definition vs our O(N) prefix sums;
//   - OADEV/OHDEV: a vectorised (array-at-a-time, allocate-per-τ) evaluation vs our fused loops.
// Imports the built SDK (packages/sdk/dist). Prints times and ratios; asserts nothing.
import { analyzeStability, deviations } from '../../packages/sdk/dist/stability/index.js';

/** Seeded random-walk phase (white FM), 32-bit LCG + Box–Muller: reproducible input. */
function phaseRecord(n) {
  let s = 20261202;
  const u = () => ((s = (Math.imul(1664525, s) + 1013904223) >>> 0) + 0.5) / 4294967296;
  const x = new Float64Array(n);
  let acc = 0;
  for (let i = 0; i < n; i++) {
    acc += 1e-12 * Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
    x[i] = acc;
  }
  return x;
}

function octaves(maxM) {
  const out = [];
  for (let m = 1; m <= maxM; m *= 2) out.push(m);
  return out;
}

/** Baseline MDEV straight from the definition: O(N·m) per τ. */
function mdevDirect(x, m) {
  const N = x.length;
  let sum = 0;
  let n = 0;
  for (let j = 0; j + 3 * m - 1 < N; j++) {
    let inner = 0;
    for (let i = j; i < j + m; i++) inner += x[i + 2 * m] - 2 * x[i + m] + x[i];
    sum += inner * inner;
    n++;
  }
  return Math.sqrt(sum / (2 * m * m * m * m * n));
}

/** Baseline "vectorised" OADEV: whole-array operations allocating temporaries, as array code is usually written. */
function oadevVectorised(x, m) {
  const a = x.subarray(2 * m);
  const b = x.subarray(m, x.length - m);
  const c = x.subarray(0, x.length - 2 * m);
  const d = a.map((v, i) => v - 2 * b[i] + c[i]);
  const sq = d.map((v) => v * v);
  return Math.sqrt(sq.reduce((s, v) => s + v, 0) / (2 * m * m * d.length));
}

function ohdevVectorised(x, m) {
  const n = x.length - 3 * m;
  const d = new Float64Array(n).map((_, i) => x[i + 3 * m] - 3 * x[i + 2 * m] + 3 * x[i + m] - x[i]);
  return Math.sqrt(d.map((v) => v * v).reduce((s, v) => s + v, 0) / (6 * m * m * n));
}

function time(fn) {
  const t0 = performance.now();
  const value = fn();
  return { ms: performance.now() - t0, value };
}

const fmt = (ms) => (ms >= 1000 ? `${(ms / 1000).toFixed(2)} s` : `${ms.toFixed(1)} ms`);

export default async function run() {
  for (const N of [1e6, 1e7]) {
    const x = phaseRecord(N);
    const data = { phase: x, tau0: 1 };
    const allM = octaves(Math.floor(N / 3));
    // The O(N·m) baseline is capped so the run stays short; ratios are on the common τ set.
    const baseM = allM.filter((m) => m <= (N >= 1e7 ? 64 : 512));
    process.stdout.write(`\nN = ${N.toExponential(0)} phase points, ${allM.length} octave τ (m = 1 … ${allM.at(-1)})\n`);

    const oursMdevCommon = time(() => deviations('mdev', data, { taus: baseM }));
    const baseMdev = time(() => baseM.map((m) => mdevDirect(x, m)));
    const maxRel = Math.max(...oursMdevCommon.value.map((p, i) => Math.abs(p.deviation - baseMdev.value[i]) / baseMdev.value[i]));
    process.stdout.write(`  MDEV m ≤ ${baseM.at(-1)}: prefix sums ${fmt(oursMdevCommon.ms)}, O(N·m) baseline ${fmt(baseMdev.ms)}` +
      `  → ${(baseMdev.ms / oursMdevCommon.ms).toFixed(1)}× faster (max relative difference ${maxRel.toExponential(1)})\n`);
    const oursMdevAll = time(() => deviations('mdev', data));
    process.stdout.write(`  MDEV all ${allM.length} octaves (prefix sums): ${fmt(oursMdevAll.ms)}` +
      ` (baseline would need ≈ ${fmt((baseMdev.ms * allM.reduce((s, m) => s + m, 0)) / baseM.reduce((s, m) => s + m, 0))}, extrapolated by Σm)\n`);

    for (const [name, vec] of [['oadev', oadevVectorised], ['ohdev', ohdevVectorised]]) {
      const ours = time(() => deviations(name, data, { taus: allM.filter((m) => m <= Math.floor((N - 1) / 3)) }));
      const base = time(() => ours.value.map((p) => vec(x, p.m)));
      const rel = Math.max(...ours.value.map((p, i) => Math.abs(p.deviation - base.value[i]) / base.value[i]));
      process.stdout.write(`  ${name.toUpperCase()} all octaves: fused loop ${fmt(ours.ms)}, vectorised baseline ${fmt(base.ms)}` +
        `  → ${(base.ms / ours.ms).toFixed(1)}× (max relative difference ${rel.toExponential(1)})\n`);
    }
    const full = time(() => analyzeStability(data));
    process.stdout.write(`  analyzeStability (oadev, mdev, tdev, ohdev + noise id + edf/intervals), all ${full.value.rows.length} octave τ: ${fmt(full.ms)}\n`);
  }
}
