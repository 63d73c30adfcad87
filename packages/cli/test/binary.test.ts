/**
 * `tauline rate` and `tauline periodic` through the built binary (`npm run build` first):
 * the exit codes, stdout/stderr split and JSON numbers that other tools rely on.
 */
import { spawn, spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const BIN = fileURLToPath(new URL('../bin/tauline.js', import.meta.url));
const BUILT_RATE = fileURLToPath(new URL('../dist/commands/rate.js', import.meta.url));

function tauline(...argv: string[]): { status: number | null; stdout: string; stderr: string } {
  if (!existsSync(BUILT_RATE)) throw new Error('the CLI is not built with the rate command: run `npm run build` first');
  const r = spawnSync(process.execPath, [BIN, ...argv], { encoding: 'utf8' });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe('tauline binary: rate and periodic', () => {
  it('node bin/tauline.js rate --semi-major-axis 26561750 --nominal-frequency 10.23e6 --json prints the documented JSON numbers (physics-refs §2, §3 [C])', () => {
    const r = tauline('rate', '--semi-major-axis', '26561750', '--nominal-frequency', '10.23e6', '--json');
    expect(r.status).toBe(0);
    expect(r.stderr).toBe('');
    const j = JSON.parse(r.stdout) as Record<string, unknown>;
    for (const key of [
      'fractionalRate',
      'gravitational',
      'velocity',
      'microsecondsPerDay',
      'factoryOffset',
      'offsetFrequencyHz',
    ]) {
      expect(typeof j[key]).toBe('number');
    }
    expect(Math.abs((j.fractionalRate as number) - 4.464733e-10)).toBeLessThanOrEqual(0.5e-16);
    expect(Math.abs((j.microsecondsPerDay as number) - 38.5753)).toBeLessThanOrEqual(0.00005);
    expect(Math.abs((j.offsetHz as number) - -4.5674e-3)).toBeLessThanOrEqual(0.5e-7);
    expect(Math.abs((j.offsetFrequencyHz as number) - (10.23e6 - 4.5674e-3))).toBeLessThanOrEqual(1e-7);
  });

  it('node bin/tauline.js periodic ... --constants gps-icd --json gives Δt_r = −2.378695477618e-08 s (physics-refs §3 [C])', () => {
    const e = 0.0123456789;
    const r = tauline(
      'periodic',
      '--semi-major-axis',
      String(5153.79589081 ** 2),
      '--eccentricity',
      String(e),
      '--mean-anomaly',
      String(1 - e * Math.sin(1)),
      '--constants',
      'gps-icd',
      '--json',
    );
    expect(r.status).toBe(0);
    const j = JSON.parse(r.stdout) as Record<string, number>;
    expect(Math.abs((j.correctionSeconds as number) - -2.378695477618e-8)).toBeLessThanOrEqual(0.5e-20);
    expect(typeof j.amplitudeSeconds).toBe('number');
  });

  it('node bin/tauline.js rate --semi-major-axis 26561.75 exits 2 with one stderr line asking whether km were meant', () => {
    const r = tauline('rate', '--semi-major-axis', '26561.75');
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(r.stderr).toContain('tauline rate: invalid input: --semi-major-axis must be');
    expect(r.stderr).toContain('did you mean 26561.75 km = 26561750 m?');
  });

  it('node bin/tauline.js periodic with e = 1.5 or --constants nope exits 2 with one clear line, no stack trace', () => {
    for (const argv of [
      ['periodic', '--semi-major-axis', '26561750', '--eccentricity', '1.5', '--mean-anomaly', '0'],
      [
        'periodic',
        '--semi-major-axis',
        '26561750',
        '--eccentricity',
        '0.01',
        '--mean-anomaly',
        '0',
        '--constants',
        'nope',
      ],
      ['rate', '--semi-major-axis', '26561750', '--reference', 'utc'],
    ]) {
      const r = tauline(...argv);
      expect(r.status).toBe(2);
      expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(
        /^tauline (rate|periodic): invalid input: --(eccentricity|constants|reference) must be /,
      );
      expect(r.stderr).not.toMatch(/\s+at /);
    }
  });

  it('node bin/tauline.js broadcast ... | head: a reader closing stdout early ends the command quietly (status 0, no EPIPE stack trace)', async () => {
    if (!existsSync(BUILT_RATE)) throw new Error('the CLI is not built: run `npm run build` first');
    const nav = fileURLToPath(new URL('../../../test/fixtures/rinex-nav/mixed-v305.rnx', import.meta.url));
    // 43 201 table rows: far more than the pipe holds, so the command is still writing when the reader goes.
    const child = spawn(process.execPath, [
      BIN,
      'broadcast',
      nav,
      '--from',
      '2024-01-07T00:00:00',
      '--to',
      '2024-01-07T12:00:00',
      '--step',
      '1',
      '--satellite',
      'G05',
    ]);
    let stderr = '';
    child.stderr.on('data', (chunk: Buffer) => {
      stderr += chunk.toString();
    });
    child.stdout.once('data', () => child.stdout.destroy());
    const status = await new Promise<number | null>((resolve) => child.on('close', (code) => resolve(code)));
    expect(stderr).toBe('');
    expect(status).toBe(0);
  });
});
