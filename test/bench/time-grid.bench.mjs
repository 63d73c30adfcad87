// periodicCorrectionOnTimeGrid (relativity/time-grid.ts): the periodic correction of one orbit on a 1-s grid,
// at 10^5, 10^6 and 10^7 epochs, against the strongest baseline available in the same run: a plain C loop
// (Newton's method from M per epoch, libm sin/cos, `cc -O2`, baselines/periodic-grid.c) when a compiler is
// present, otherwise the same loop in plain JavaScript. Times are process CPU time (user + system), best of
// three, both sides writing into an array allocated and touched before timing. Target: ≥ 3× the C loop at
// 10^7 epochs for e = 0.01 and e = 0.7. Reports the growth exponent over the three sizes; asserts nothing.

import { DEFAULT_CONSTANT_SET } from '../../packages/sdk/dist/constants.js';
import { periodicCorrectionOnTimeGrid } from '../../packages/sdk/dist/relativity/index.js';
import { compileC, growthExponent, runC } from './baselines/native.mjs';

const A = 26_561_750,
  M0 = 0.3,
  STEP = 1;
const SIZES = [1e5, 1e6, 1e7];
const out = (line) => process.stdout.write(`${line}\n`);
const fmt = (ms) => (ms >= 1000 ? `${(ms / 1000).toFixed(2)} s` : `${ms.toFixed(1)} ms`);

function cpuMs(fn) {
  let best = Infinity;
  for (let r = 0; r < 3; r++) {
    const t = process.cpuUsage();
    fn();
    const u = process.cpuUsage(t);
    best = Math.min(best, (u.user + u.system) / 1000);
  }
  return best;
}

/** The baseline loop in JavaScript: what a user would write without the grid function. */
function plainLoop(e, count, target) {
  const gm = DEFAULT_CONSTANT_SET.gm,
    n = Math.sqrt(gm / A ** 3),
    amp = DEFAULT_CONSTANT_SET.relativisticF * e * Math.sqrt(A);
  for (let k = 0; k < count; k++) {
    const M = (M0 + n * k * STEP) % (2 * Math.PI);
    let E = M + e * Math.sin(M);
    for (let it = 0; it < 50; it++) {
      const d = (E - e * Math.sin(E) - M) / (1 - e * Math.cos(E));
      E -= d;
      if (Math.abs(d) < 1e-15) break;
    }
    target[k] = amp * Math.sin(E);
  }
}

export default async function benchTimeGrid() {
  const native = compileC('periodic-grid');
  const baselineName = native.exe ? 'plain C loop (cc -O2)' : `plain JavaScript loop (${native.reason})`;
  out(`periodic correction on a 1-s grid, a = ${A} m; baseline: ${baselineName}`);
  const buffer = new Float64Array(SIZES[SIZES.length - 1]);
  for (const e of [0.01, 0.7, 0.9]) {
    const times = [];
    for (const count of SIZES) {
      const orbit = { semiMajorAxis: A, eccentricity: e, meanAnomalyAtStart: M0 };
      const ours = cpuMs(() =>
        periodicCorrectionOnTimeGrid(
          orbit,
          { stepSeconds: STEP, count },
          { constants: DEFAULT_CONSTANT_SET, out: buffer },
        ),
      );
      const js = cpuMs(() => plainLoop(e, count, buffer));
      let base = js;
      if (native.exe) {
        base = Infinity;
        for (let r = 0; r < 3; r++) base = Math.min(base, 1000 * Number(runC(native.exe, [A, e, M0, STEP, count])[0]));
      }
      times.push(ours);
      const target = count === 1e7 && e <= 0.7 ? `  target ≥ 3×: ${base / ours >= 3 ? 'met' : 'MISSED'}` : '';
      out(
        `  e = ${String(e).padEnd(4)} ${count.toExponential(0).padStart(5)} epochs: grid ${fmt(ours).padStart(9)}  ` +
          `baseline ${fmt(base).padStart(9)}  ${(base / ours).toFixed(2)}× faster  (plain JS loop ${fmt(js)})${target}`,
      );
    }
    out(
      `  e = ${e}: growth exponent of the grid function over 10^5…10^7 epochs ${growthExponent(SIZES, times).toFixed(2)}`,
    );
  }
}
