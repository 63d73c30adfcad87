import { describe, expect, it } from 'vitest';
import { type CliRun, runCli } from '../run.js';

const run = (...argv: string[]): Promise<CliRun> => runCli(['periodic', ...argv]);

async function expectUsageError(argv: string[], pattern: RegExp): Promise<void> {
  const r = await run(...argv);
  expect(r.status).toBe(2);
  expect(r.out).toBe('');
  expect(r.err.trimEnd().split('\n')).toHaveLength(1);
  expect(r.err).toMatch(pattern);
}

// physics-refs §3 check value [C]: √A = 5153.79589081, e = 0.0123456789, E = 1 rad, GPS μ → Δt_r = −2.378695477618e-08 s.
const A = 5153.79589081 ** 2;
const E = 0.0123456789;
const M_FOR_E_1 = 1 - E * Math.sin(1);

describe('tauline periodic', () => {
  it('tauline periodic --constants gps-icd reproduces Δt_r = −2.378695477618e-08 s at E = 1 rad (IS-GPS-200 §20.3.3.3.3.1 [M]; physics-refs §3 [C])', async () => {
    const r = await run(
      '--semi-major-axis',
      String(A),
      '--eccentricity',
      String(E),
      '--mean-anomaly',
      String(M_FOR_E_1),
      '--constants',
      'gps-icd',
      '--json',
    );
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out) as Record<string, number | string>;
    expect(Math.abs((j.correctionSeconds as number) - -2.378695477618e-8)).toBeLessThan(1e-20);
    expect(j.eccentricAnomaly as number).toBeCloseTo(1, 14);
    expect(j.relativisticF as number).toBeCloseTo(-4.442807633e-10, 19);
    expect(j.amplitudeSeconds as number).toBeCloseTo(2.378695477618e-8 / Math.sin(1), 19);
    expect(j.constants).toBe('gps-icd');
  });

  it('tauline periodic gives amplitude 2.28974 µs × e at GPS a (IERS Conventions 2010 §10.2 "about 2.29 µs × e" [V1]; physics-refs §4 [C])', async () => {
    const r = await run('--semi-major-axis', '26561750', '--eccentricity', '0.02', '--mean-anomaly', '0', '--json');
    const j = JSON.parse(r.out) as Record<string, number>;
    expect((j.amplitudeSeconds as number) * 1e9).toBeCloseTo(45.7948, 4);
    expect(j.correctionSeconds).toBe(0);
  });

  it('tauline periodic without --json prints the correction in s and ns and says it is added to Δt_sv', async () => {
    const r = await run(
      '--semi-major-axis',
      '26561750',
      '--eccentricity',
      '0.01',
      '--mean-anomaly',
      String(Math.PI / 2),
    );
    expect(r.status).toBe(0);
    expect(r.out).toMatch(/correction Δt_r\s+-2\.\d+e-8 s \(-2\d\.\d+ ns; add to Δt_sv\)/);
    expect(r.out).toMatch(/amplitude\s+2\.28973\d*e-8 s \(22\.897\d* ns\)/);
  });

  it('tauline periodic --mean-anomaly=-1 accepts a negative mean anomaly and gives the opposite correction of +1 (Δt_r is odd in M)', async () => {
    const plus = await run('--semi-major-axis', '26561750', '--eccentricity', '0.02', '--mean-anomaly', '1', '--json');
    const minus = await run('--semi-major-axis', '26561750', '--eccentricity', '0.02', '--mean-anomaly=-1', '--json');
    expect(minus.status).toBe(0);
    expect(JSON.parse(minus.out).correctionSeconds).toBe(-JSON.parse(plus.out).correctionSeconds);
    expect(JSON.parse(plus.out).correctionSeconds).toBeLessThan(0);
  });

  it('tauline periodic --help names the formula and sources', async () => {
    const r = await run('--help');
    expect(r.status).toBe(0);
    expect(r.out).toContain('F·e·√a·sin E');
    expect(r.out).toContain('IS-GPS-200 §20.3.3.3.3.1');
    expect(r.out).toContain('eqs. 10.10–10.11');
  });

  it('tauline periodic rejects hyperbolic, negative and NaN eccentricity with one line naming --eccentricity', async () => {
    await expectUsageError(
      ['--semi-major-axis', '26561750', '--eccentricity', '1.2', '--mean-anomaly', '1'],
      /--eccentricity must be in \[0, 1\) for an elliptical orbit; received 1\.2\. e ≥ 1 is a parabolic or hyperbolic trajectory/,
    );
    await expectUsageError(
      ['--semi-major-axis', '26561750', '--eccentricity=-0.01', '--mean-anomaly', '1'],
      /--eccentricity must be in \[0, 1\).*received -0\.01\. eccentricity cannot be negative/,
    );
    await expectUsageError(
      ['--semi-major-axis', '26561750', '--eccentricity', 'NaN', '--mean-anomaly', '1'],
      /--eccentricity must be a decimal number/,
    );
  });

  it('tauline periodic rejects missing flags, kilometres and a non-numeric mean anomaly', async () => {
    await expectUsageError(['--eccentricity', '0.01', '--mean-anomaly', '1'], /--semi-major-axis is required/);
    await expectUsageError(['--semi-major-axis', '26561750', '--mean-anomaly', '1'], /--eccentricity is required/);
    await expectUsageError(['--semi-major-axis', '26561750', '--eccentricity', '0.01'], /--mean-anomaly is required/);
    await expectUsageError(
      ['--semi-major-axis', '26561.75', '--eccentricity', '0.01', '--mean-anomaly', '1'],
      /--semi-major-axis must be .*did you mean 26561\.75 km = 26561750 m\?/,
    );
    await expectUsageError(
      ['--semi-major-axis', '26561750', '--eccentricity', '0.01', '--mean-anomaly', 'abc'],
      /--mean-anomaly must be a decimal number.*received "abc"/,
    );
    await expectUsageError(
      ['--semi-major-axis', '26561750', '--eccentricity', '0.01', '--mean-anomaly', '1', '--constants', 'x'],
      /--constants must be one of/,
    );
  });
});
