// Stability statistics (OADEV, OHDEV, MDEV at every octave τ) on 10^5, 10^6 and 10^7 phase points, against the
// strongest baseline available in the same run, named in the output: plain C loops (`cc -O2`,
// baselines/stability.c) when a compiler is present, numpy array code (baselines/stability_numpy.py) when
// python3 with numpy is present, otherwise plain JavaScript loops written here. Every available baseline is
// reported; the ratio is taken against the fastest. All sides get the same record (written once to a
// float64 file) and report CPU time of the statistic alone (input loading excluded); deviations are compared
// for agreement. Also reports the growth exponent of each case over the three sizes and the full
// analyzeStability call. Imports the built SDK (packages/sdk/dist). Asserts nothing.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { analyzeStability, deviations } from '../../packages/sdk/dist/stability/index.js';
import { compileC, growthExponent, runC } from './baselines/native.mjs';

const SIZES = [1e5, 1e6, 1e7];
const STATISTICS = ['oadev', 'ohdev', 'mdev'];
const here = fileURLToPath(new URL('.', import.meta.url));
const out = (line) => process.stdout.write(`${line}\n`);
const fmt = (ms) => (ms >= 1000 ? `${(ms / 1000).toFixed(2)} s` : `${ms.toFixed(1)} ms`);

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
  const ms = [];
  for (let m = 1; m <= maxM; m *= 2) ms.push(m);
  return ms;
}

/** Plain JavaScript baselines: the sums of NIST SP 1065 as single loops (MDEV through a prefix sum). */
const plainJs = {
  oadev(x, m) {
    let sum = 0,
      n = 0;
    for (let i = 0; i + 2 * m < x.length; i++) {
      const d = x[i + 2 * m] - 2 * x[i + m] + x[i];
      sum += d * d;
      n++;
    }
    return Math.sqrt(sum / (2 * m * m * n));
  },
  ohdev(x, m) {
    let sum = 0,
      n = 0;
    for (let i = 0; i + 3 * m < x.length; i++) {
      const d = x[i + 3 * m] - 3 * x[i + 2 * m] + 3 * x[i + m] - x[i];
      sum += d * d;
      n++;
    }
    return Math.sqrt(sum / (6 * m * m * n));
  },
  mdev(x, m, S) {
    let sum = 0,
      n = 0;
    for (let j = 0; j + 3 * m <= x.length; j++) {
      const inner = S[j + 3 * m] - S[j + 2 * m] - 2 * (S[j + 2 * m] - S[j + m]) + (S[j + m] - S[j]);
      sum += inner * inner;
      n++;
    }
    return Math.sqrt(sum / (2 * m ** 4 * n));
  },
};

function cpuMs(fn) {
  const t = process.cpuUsage();
  const value = fn();
  const u = process.cpuUsage(t);
  return { ms: (u.user + u.system) / 1000, value };
}

function numpyAvailable() {
  const r = spawnSync('python3', ['-c', 'import numpy; print(numpy.__version__)'], { encoding: 'utf8' });
  return r.status === 0 ? { version: r.stdout.trim() } : { reason: r.error ? 'no python3' : 'python3 without numpy' };
}

/** Runs one external baseline: returns { ms, values } (best CPU time of two runs). */
function external(kind, exe, file, stat, ms) {
  let best;
  for (let r = 0; r < 2; r++) {
    const fields =
      kind === 'c'
        ? runC(exe, [file, stat, ...ms])
        : spawnSync('python3', [join(here, 'baselines', 'stability_numpy.py'), file, stat, ...ms.map(String)], {
            encoding: 'utf8',
          })
            .stdout.trim()
            .split(/\s+/);
    const result = { ms: 1000 * Number(fields[0]), values: fields.slice(1).map(Number) };
    if (!best || result.ms < best.ms) best = result;
  }
  return best;
}

export default async function run() {
  const native = compileC('stability');
  const numpy = numpyAvailable();
  out(
    `baselines: C ${native.exe ? '(cc -O2)' : `unavailable: ${native.reason}`}; numpy ${numpy.version ?? `unavailable: ${numpy.reason}`}; plain JavaScript loops`,
  );
  const dir = mkdtempSync(join(tmpdir(), 'tauline-stability-bench-'));
  const grow = Object.fromEntries(STATISTICS.map((s) => [s, []]));
  try {
    for (const N of SIZES) {
      const x = phaseRecord(N);
      const file = join(dir, `phase-${N}.f64`);
      writeFileSync(file, Buffer.from(x.buffer));
      const S = new Float64Array(N + 1);
      for (let i = 0; i < N; i++) S[i + 1] = S[i] + x[i];
      out(`\nN = ${N.toExponential(0)} phase points`);
      for (const stat of STATISTICS) {
        const ms = octaves(Math.floor((N - 1) / 3));
        const ours = cpuMs(() => deviations(stat, { phase: x, tau0: 1 }, { taus: ms }));
        grow[stat].push(ours.ms);
        const baselines = [
          {
            name: 'plain JS',
            ...(() => {
              const r = cpuMs(() => ms.map((m) => plainJs[stat](x, m, S)));
              return { ms: r.ms, values: r.value };
            })(),
          },
        ];
        if (numpy.version) baselines.push({ name: 'numpy', ...external('numpy', null, file, stat, ms) });
        if (native.exe) baselines.push({ name: 'C -O2', ...external('c', native.exe, file, stat, ms) });
        const strongest = baselines.reduce((a, b) => (b.ms < a.ms ? b : a));
        const rel = Math.max(
          ...ours.value.map((p, i) => Math.abs(p.deviation - strongest.values[i]) / strongest.values[i]),
        );
        out(
          `  ${stat.toUpperCase().padEnd(5)} ${ms.length} octave τ: Tauline ${fmt(ours.ms).padStart(8)}; ` +
            baselines.map((b) => `${b.name} ${fmt(b.ms)}`).join(', ') +
            `  → ${(strongest.ms / ours.ms).toFixed(2)}× the strongest (${strongest.name}); max relative difference ${rel.toExponential(1)}`,
        );
      }
      const full = cpuMs(() => analyzeStability({ phase: x, tau0: 1 }));
      out(
        `  analyzeStability (oadev, mdev, tdev, ohdev + noise id + edf/intervals), ${full.value.rows.length} rows: ${fmt(full.ms)}`,
      );
    }
    out('');
    for (const stat of STATISTICS)
      out(
        `growth exponent of Tauline ${stat.toUpperCase()} over 10^5…10^7 points: ${growthExponent(SIZES, grow[stat]).toFixed(2)}`,
      );
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
