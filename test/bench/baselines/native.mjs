// Native baselines for the benchmarks: compiles a C file of this folder with `cc -O2` into a temporary
// directory, once per run. Returns null (and says why) when no C compiler is present, so a benchmark can
// fall back to its plain JavaScript loop and name the baseline it used.
import { spawnSync } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = fileURLToPath(new URL('.', import.meta.url));
let workDir;

/** Path of the executable built from `baselines/<name>.c`, or `{ reason }` when it cannot be built. */
export function compileC(name) {
  workDir ??= mkdtempSync(join(tmpdir(), 'tauline-bench-'));
  const exe = join(workDir, name);
  const r = spawnSync('cc', ['-O2', '-o', exe, join(here, `${name}.c`), '-lm'], { encoding: 'utf8' });
  if (r.error || r.status !== 0)
    return { reason: r.error ? `no C compiler (${r.error.code})` : `cc failed: ${r.stderr.trim().split('\n')[0]}` };
  return { exe };
}

/** Runs a compiled baseline with `args`; returns its stdout split on whitespace. */
export function runC(exe, args) {
  const r = spawnSync(exe, args.map(String), { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`${exe} failed: ${r.stderr}`);
  return r.stdout.trim().split(/\s+/);
}

/** Least-squares slope of log(time) against log(size): the growth exponent (1 = linear). */
export function growthExponent(sizes, times) {
  const x = sizes.map(Math.log),
    y = times.map(Math.log);
  const mx = x.reduce((a, b) => a + b) / x.length,
    my = y.reduce((a, b) => a + b) / y.length;
  let sxy = 0,
    sxx = 0;
  for (let i = 0; i < x.length; i++) {
    sxy += (x[i] - mx) * (y[i] - my);
    sxx += (x[i] - mx) ** 2;
  }
  return sxy / sxx;
}
