import { describe, expect, it } from 'vitest';
import { type CliRun, runCli } from '../run.js';

const run = (...argv: string[]): Promise<CliRun> => runCli(['rate', ...argv]);

async function json(...argv: string[]): Promise<Record<string, unknown>> {
  const r = await run(...argv, '--json');
  expect(r.err).toBe('');
  expect(r.status).toBe(0);
  return JSON.parse(r.out) as Record<string, unknown>;
}

/** Expects one error line on stderr, exit status 2 and nothing on stdout. */
async function expectUsageError(argv: string[], pattern: RegExp): Promise<string> {
  const r = await run(...argv);
  expect(r.status).toBe(2);
  expect(r.out).toBe('');
  expect(r.err.trimEnd().split('\n')).toHaveLength(1);
  expect(r.err).toMatch(pattern);
  expect(r.err).not.toMatch(/\n\s+at /);
  return r.err;
}

describe('tauline rate', () => {
  it('tauline rate --semi-major-axis 26561750 --json gives +4.464733e-10 vs TT, 38.5753 µs/day (physics-refs §2 table [C]; IERS 2010 §10.2 [V1])', async () => {
    const r = await json('--semi-major-axis', '26561750');
    expect(r.fractionalRate as number).toBeCloseTo(4.464733e-10, 16);
    expect(r.gravitational as number).toBeCloseTo(45.7884e-6 / 86400, 15);
    expect(r.velocity as number).toBeCloseTo(-7.2131e-6 / 86400, 15);
    expect(r.microsecondsPerDay as number).toBeCloseTo(38.5753, 4);
    expect(r.factoryOffset as number).toBeCloseTo(-4.464733e-10, 16);
    expect(r.constants).toBe('iers-2010');
    expect(r.reference).toBe('tt');
    expect(r.semiMajorAxis).toBe(26561750);
    expect(r.caution).toMatch(/responsible engineering authority/);
    expect(r).not.toHaveProperty('offsetFrequencyHz');
  });

  it('tauline rate --nominal-frequency 10.23e6 adds the frequency to set: 10.2299999954326 MHz at the conventional a (IS-GPS-200E §3.3.1.1 [V2])', async () => {
    // a = 26 561 400.1 m gives the conventional 4.4647e-10 (physics-refs §2 [C]).
    const r = await json('--semi-major-axis', '26561400.08', '--nominal-frequency', '10.23e6');
    expect(r.nominalFrequencyHz).toBe(10.23e6);
    expect((r.offsetFrequencyHz as number) / 1e6).toBeCloseTo(10.2299999954326, 13);
    expect(r.offsetHz as number).toBeCloseTo(-4.5674e-3, 7);
  });

  it('tauline rate --reference tcg gives −3GM/(2ac²) = −2.504557e-10 split −GM/(ac²) and −GM/(2ac²) (IERS 2010 eq. 10.7 [V1]; physics-refs §2 [C])', async () => {
    const r = await json('--semi-major-axis', '26561750', '--reference', 'tcg');
    expect(r.fractionalRate as number).toBeCloseTo(-2.504557e-10, 16);
    expect((r.gravitational as number) + (r.velocity as number)).toBeCloseTo(r.fractionalRate as number, 22);
    expect(r.factoryOffset as number).toBeGreaterThan(0);
    expect(r.reference).toBe('tcg');
  });

  it('tauline rate --constants gps-icd uses GM 3.986005e14 (IS-GPS-200 Table 20-IV [M])', async () => {
    const iers = await json('--semi-major-axis', '26561750');
    const gps = await json('--semi-major-axis', '26561750', '--constants', 'gps-icd');
    expect(gps.constants).toBe('gps-icd');
    // Δrate = −(3/2)·ΔGM/(a c²) with ΔGM = 3.986005e14 − 3.986004418e14 = 5.82e7 m³/s² (independent arithmetic [C]).
    const expected = (-1.5 * 5.82e7) / (26561750 * 299792458 ** 2);
    expect((gps.fractionalRate as number) - (iers.fractionalRate as number)).toBeCloseTo(expected, 22);
  });

  it('tauline rate without --json prints a key/value table with units and the flight caution', async () => {
    const r = await run('--semi-major-axis', '26561750', '--nominal-frequency', '10.23e6');
    expect(r.status).toBe(0);
    expect(r.err).toBe('');
    expect(r.out).toMatch(/fractional rate\s+\+4\.46473\d+e-10 \(satellite clock runs fast vs TT\)/);
    expect(r.out).toMatch(/time gained per day\s+\+38\.575\d* µs\/day/);
    expect(r.out).toMatch(/factory offset\s+-4\.46473\d+e-10 \(set the oscillator low on the ground\)/);
    expect(r.out).toMatch(/frequency to set\s+10229999\.99543\d* Hz/);
    expect(r.out).toContain('responsible engineering authority');
  });

  it('tauline rate --help explains the formula and names its source', async () => {
    const r = await run('--help');
    expect(r.status).toBe(0);
    expect(r.out).toContain('L_G − 3GM/(2ac²)');
    expect(r.out).toContain('IERS Conventions (2010)');
    expect(r.out).toContain('--semi-major-axis <m>');
  });

  it('tauline rate --semi-major-axis 26561.75 says the value is inside the Earth and asks whether km were meant', async () => {
    const line = await expectUsageError(['--semi-major-axis', '26561.75'], /--semi-major-axis must be/);
    expect(line).toContain('26561.75 m is inside the Earth');
    expect(line).toContain('did you mean 26561.75 km = 26561750 m?');
  });

  it('tauline rate rejects a missing --semi-major-axis, "abc", NaN, a negative or a far-away axis with one line each', async () => {
    await expectUsageError([], /--semi-major-axis is required/);
    await expectUsageError(['--semi-major-axis', 'abc'], /--semi-major-axis must be a decimal number.*received "abc"/);
    await expectUsageError(['--semi-major-axis', 'NaN'], /--semi-major-axis must be a decimal number.*received "NaN"/);
    // Negative values need the `--flag=value` form (node:util parseArgs reads `-2...` as an option).
    await expectUsageError(
      ['--semi-major-axis=-26561750'],
      /--semi-major-axis must be a distance from the geocentre in metres.*received -26561750/,
    );
    await expectUsageError(
      ['--semi-major-axis', '1e11'],
      /--semi-major-axis must be .*below 1e10 m; received 100000000000/,
    );
  });

  it('tauline rate rejects an unknown --constants or --reference naming the accepted values', async () => {
    await expectUsageError(
      ['--semi-major-axis', '26561750', '--constants', 'wgs72'],
      /--constants must be one of iers-2010, gps-icd, galileo-icd, beidou-icd; received "wgs72"/,
    );
    await expectUsageError(
      ['--semi-major-axis', '26561750', '--reference', 'tai'],
      /--reference must be one of tt, tcg; received "tai"/,
    );
  });

  it('tauline rate rejects a bad --nominal-frequency and unknown flags', async () => {
    await expectUsageError(
      ['--semi-major-axis', '26561750', '--nominal-frequency=-5'],
      /--nominal-frequency must be in \[1, 1000000000000\] Hz; received -5/,
    );
    await expectUsageError(
      ['--semi-major-axis', '26561750', '--nominal-frequency', '10MHz'],
      /--nominal-frequency must be a decimal number/,
    );
    await expectUsageError(['--semi-major-axis', '26561750', '--frequency', '5'], /--frequency/);
  });
});
