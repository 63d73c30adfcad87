import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { runCli as run } from './run.js';

const ROOT = fileURLToPath(new URL('../../../', import.meta.url));
const EXAMPLE = join(ROOT, 'packages/sdk/examples/clock/vestra-4-rafs.txt');
const BIN = join(ROOT, 'packages/cli/bin/tauline.js');

/** True values of the generated example (packages/sdk/examples/clock/SOURCE.md). */
const TRUTH = { af0: 1.5e-7, af1: 3.2e-11, af2: 5e-19, q1: 1e-23, q2: 1e-31, jumpEpoch: 750000, jumpSize: 2e-9 };

describe('tauline clock', () => {
  it('tauline clock --phase <VESTRA-4 example> --json recovers the true af1, the jump epoch and size, and q1, q2 within the stated uncertainties (generator values in SOURCE.md; model Zucca & Tavella 2005 [M])', async () => {
    const r = await run(['clock', '--phase', EXAMPLE, '--predict', '1296000', '--scenario-noise', '--json']);
    expect(r.status).toBe(0);
    expect(r.err).toBe('');
    const j = JSON.parse(r.out);
    const [af0, af1, af2] = j.polynomial.coefficients;
    expect(af1.name).toBe('af1');
    // 2σ bounds: one draw per coefficient, 95.45 % each.
    expect(Math.abs(af1.value - TRUTH.af1)).toBeLessThan(2 * af1.std);
    expect(Math.abs(af0.value - TRUTH.af0)).toBeLessThan(2 * af0.std);
    expect(Math.abs(af2.value - TRUTH.af2)).toBeLessThan(2 * af2.std);
    expect(j.filter.jumps).toHaveLength(1);
    const jump = j.filter.jumps[0];
    expect(jump).toMatchObject({ kind: 'phase', epoch: TRUTH.jumpEpoch, index: 2500, pass: 1 });
    expect(Math.abs(jump.size - TRUTH.jumpSize)).toBeLessThan(2 * jump.sizeStd);
    expect(j.filter.rejected).toEqual([]);
    // q intervals at the reported 68.27 % level (χ², diffusionFromStabilityRows).
    for (const n of ['q1', 'q2'] as const) {
      const iv = j.noise.intervals[n];
      expect(iv.low).toBeLessThanOrEqual(TRUTH[n]);
      expect(iv.high).toBeGreaterThanOrEqual(TRUTH[n]);
    }
    expect(j.noise.h.h0).toBeCloseTo(2 * j.noise.q.q1, 35);
    expect(j.scenarioNoise).toEqual(j.noise.q);
    expect(j.filter.nis.mean).toBeGreaterThan(j.filter.nis.low);
    expect(j.filter.nis.mean).toBeLessThan(j.filter.nis.high);
    expect(j.polynomial.caution).toMatch(/responsible engineering authority/);
    expect(j.polynomial.predictions[0].std).toBeGreaterThan(0);
  });

  it('tauline clock (table) names units, prints the flight caution, the jump and the scenario-noise snippet', async () => {
    const r = await run(['clock', '--phase', EXAMPLE, '--degree', '1', '--states', '2', '--measurement-sigma', '3e-11', '--scenario-noise']);
    expect(r.status).toBe(0);
    expect(r.out).toMatch(/af1 .* dimensionless/);
    expect(r.out).toMatch(/x\(t\) = af0 \+ af1·\(t − t_oc\), t_oc = 0 s, degree 1/);
    expect(r.out).not.toMatch(/^af2/m);
    expect(r.out).toMatch(/Caution: verify these values/);
    expect(r.out).toMatch(/phase +750000 +2500/);
    expect(r.out).toMatch(/measurement noise σ_v = 3\.00e-11 s \(given\)/);
    const snippet = r.out.trim().split('\n').pop()!;
    expect(Object.keys(JSON.parse(snippet))).toEqual(['q1', 'q2', 'q3']);
  });

  it('tauline clock --states 3 fits q3 from OHDEV and reports h₋₄', async () => {
    const r = await run(['clock', '--phase', EXAMPLE, '--states', '3', '--json']);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.noise.statistic).toBe('ohdev');
    expect(j.noise.h).toHaveProperty('hMinus4');
    expect(j.filter.states).toBe(3);
  });

  it('tauline clock rejects bad input with one line and exit 2', async () => {
    const tmp = mkdtempSync(join(tmpdir(), 'tauline-clock-'));
    const one = join(tmp, 'one-column.txt');
    writeFileSync(one, Array.from({ length: 40 }, (_, k) => `${k * 1e-10}`).join('\n') + '\n');
    const cases: [string[], RegExp][] = [
      [['--phase', EXAMPLE, '--degree', '3'], /--degree must be 1 or 2/],
      [['--phase', EXAMPLE, '--states', '4'], /--states must be 2 or 3/],
      [['--phase', EXAMPLE, '--measurement-sigma', '0'], /--measurement-sigma must be > 0 s/],
      [['--phase', EXAMPLE, '--measurement-sigma', '1ns'], /--measurement-sigma must be a decimal number/],
      [['--phase', EXAMPLE, '--predict', '100'], /--predict: 100 s is before the last sample epoch 1209300 s/],
      [['--phase', one], /--tau0/],
      [[], /exactly one input/],
      [['--rinex-clock', EXAMPLE], /--clock/],
      [['--phase', join(tmp, 'missing.txt')], /cannot read/],
    ];
    for (const [argv, pattern] of cases) {
      const r = await run(['clock', ...argv]);
      expect(r.status).toBe(2);
      expect(r.err).toMatch(pattern);
      expect(r.err.trim().split('\n')).toHaveLength(1);
    }
  });

  it.skipIf(!existsSync(BIN))('the built binary `tauline clock --phase <example> --json` prints the same result as the in-process call', async () => {
    const b = spawnSync(process.execPath, [BIN, 'clock', '--phase', EXAMPLE, '--json'], { encoding: 'utf8' });
    const inProcess = await run(['clock', '--phase', EXAMPLE, '--json']);
    if (b.stderr.includes('unknown command')) return; // binary built before this command existed
    expect(b.status).toBe(0);
    expect(JSON.parse(b.stdout).filter.jumps).toEqual(JSON.parse(inProcess.out).filter.jumps);
  });
});

describe('tauline clock on a record too short to characterise', () => {
  it('exits 2 naming the flag, the file, the sample count and the minimum', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tauline-clock-'));
    const file = join(dir, 'short.txt');
    writeFileSync(file, Array.from({ length: 9 }, (_, k) => `${k * 1e-9}`).join('\n') + '\n');
    const r = await run(['clock', '--phase', file, '--tau0', '1']);
    expect(r.status).toBe(2);
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/--phase .*short\.txt has 9 phase samples; the clock model needs at least 12/);
  });
});
