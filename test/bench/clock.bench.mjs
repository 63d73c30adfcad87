// Clock Kalman filter and `tauline clock` on long records. Imports the built SDK and CLI (dist/).
//   - runClockFilter per-sample time (2-state, with and without the GLR outlier/jump detector) against a
//     plain-JS scalar loop of the same 2-state recursion (predict, update, Joseph form, no detection,
//     no outputs) measured in the same run, at 10^4, 10^5, 10^6 samples, with the growth exponent;
//   - `tauline clock --phase <10^6 generated samples> --tau0 1` end to end in a child process: wall
//     time and peak RSS (process.resourceUsage().maxRSS of the child). Goal: < 10 s, < 300 MB.
// Prints times and ratios; asserts nothing. On a shared machine wall time follows the load: the CPU
// time of the child is printed beside it.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { runClockFilter, simulateClock } from '../../packages/sdk/dist/clock-model/index.js';
import { BUNDLED_LEAP_SECONDS, createTimeScales } from '../../packages/sdk/dist/time/index.js';

const Q = { q1: 1e-22, q2: 1e-28 };
const R = 1e-20;
/** The invented epoch of t = 0 of the benchmark series (it does not enter the numerics). */
const EPOCH = createTimeScales(BUNDLED_LEAP_SECONDS).parseIso('2027-02-08T06:00:00', 'GPS');

/** The same 2-state recursion as plain scalar JavaScript: the baseline. Returns a checksum. */
function scalarKalman(z) {
  let x = z[0],
    y = 0,
    p00 = R,
    p01 = 0,
    p11 = 1e-18,
    acc = 0;
  const tau = 1,
    qa = Q.q1 * tau + (Q.q2 * tau ** 3) / 3,
    qb = (Q.q2 * tau * tau) / 2,
    qc = Q.q2 * tau;
  for (let i = 1; i < z.length; i++) {
    x += tau * y;
    const a00 = p00 + tau * p01,
      a01 = p01 + tau * p11;
    p00 = a00 + tau * a01 + qa;
    p01 = a01 + qb;
    p11 += qc;
    const s = p00 + R,
      nu = z[i] - x,
      k0 = p00 / s,
      k1 = p01 / s;
    const n00 = p00 - 2 * k0 * p00 + k0 * k0 * s,
      n01 = p01 - k0 * p01 - k1 * p00 + k0 * k1 * s,
      n11 = p11 - 2 * k1 * p01 + k1 * k1 * s;
    p00 = n00;
    p01 = n01;
    p11 = n11;
    x += k0 * nu;
    y += k1 * nu;
    acc += x;
  }
  return acc;
}

function best(fn, repeat) {
  fn();
  let ms = Infinity;
  for (let r = 0; r < repeat; r++) {
    const t0 = performance.now();
    fn();
    ms = Math.min(ms, performance.now() - t0);
  }
  return ms;
}

function filterCases() {
  const sizes = [1e4, 1e5, 1e6];
  const rows = [];
  for (const n of sizes) {
    const z = simulateClock({ samples: n, tau0: 1, q: Q, seed: 3, measurementNoise: 1e-10 }).phase;
    const repeat = n >= 1e6 ? 3 : 5;
    const base = best(() => scalarKalman(z), repeat);
    const off = best(
      () =>
        runClockFilter(
          { epoch: EPOCH, phase: z, variance: R, tau0: 1 },
          { q: Q, jumpDetection: false, outlierProbability: false },
        ),
      repeat,
    );
    const on = best(() => runClockFilter({ epoch: EPOCH, phase: z, variance: R, tau0: 1 }, { q: Q }), repeat);
    rows.push({ n, base, off, on });
  }
  process.stdout.write(
    'runClockFilter, 2-state, best of ≥ 3 (baseline: plain scalar loop of the same recursion, same run)\n',
  );
  for (const r of rows) {
    const us = (ms) => ((ms * 1000) / r.n).toFixed(3).padStart(7);
    process.stdout.write(
      `  N = ${String(r.n).padStart(7)}  baseline ${us(r.base)} µs/sample   no detection ${us(r.off)} µs (×${(r.off / r.base).toFixed(1)})` +
        `   with GLR detector ${us(r.on)} µs (×${(r.on / r.base).toFixed(1)})\n`,
    );
  }
  const first = rows[0],
    last = rows[rows.length - 1];
  const growth = (key) => (Math.log(last[key] / first[key]) / Math.log(last.n / first.n)).toFixed(2);
  process.stdout.write(
    `  growth exponent (time ∝ N^k, N = 1e4 → 1e6): baseline ${growth('base')}, no detection ${growth('off')}, with detector ${growth('on')}\n`,
  );
}

function cliCase() {
  const root = fileURLToPath(new URL('../..', import.meta.url));
  const dir = mkdtempSync(join(tmpdir(), 'tauline-clock-bench-'));
  try {
    const file = join(dir, 'phase-1e6.txt');
    const sim = simulateClock({ samples: 1e6, tau0: 1, q: Q, seed: 7, measurementNoise: 1e-10 });
    writeFileSync(file, `${Array.from(sim.phase, (v) => v.toExponential(12)).join('\n')}\n`);
    const child = `const { main } = await import(${JSON.stringify(join(root, 'packages/cli/dist/main.js'))});
const io = { out() {}, err(s) { process.stderr.write(s); } };
const code = await main(['clock', '--phase', ${JSON.stringify(file)}, '--tau0', '1', '--epoch', '2027-02-08T06:00:00'], io);
const u = process.resourceUsage();
process.stdout.write(JSON.stringify({ code, maxRssKiB: u.maxRSS, cpuS: (u.userCPUTime + u.systemCPUTime) / 1e6 }));`;
    const t0 = performance.now();
    const r = spawnSync(process.execPath, ['--input-type=module', '-e', child], { encoding: 'utf8' });
    const wall = (performance.now() - t0) / 1000;
    if (r.status !== 0) {
      process.stdout.write(`tauline clock on 10^6 samples failed: ${r.stderr}\n`);
      return;
    }
    const res = JSON.parse(r.stdout);
    process.stdout.write(
      `tauline clock, 10^6 generated samples (one column, τ0 = 1 s): exit ${res.code}, wall ${wall.toFixed(1)} s ` +
        `(CPU ${res.cpuS.toFixed(1)} s), peak RSS ${(res.maxRssKiB / 1024).toFixed(0)} MiB; goal < 10 s, < 300 MB\n`,
    );
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

export default function run() {
  filterCases();
  cliCase();
}
