/**
 * Bad input across every `tauline` command: each unusable input exits 2 with one line naming the
 * field, the value and what was expected; the shared file reader; `--format` beside `--json`/`--csv`;
 * units and cautions in the JSON. Run in-process (no build needed).
 */
import { chmodSync, mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { ParseError } from '@tauline/sdk/errors';
import { describe, expect, it } from 'vitest';
import { jsonErrorOffset, lineColumn, readJsonFile } from '../src/files.js';
import { describeFailure } from '../src/framework.js';
import { type CliRun, runCli } from './run.js';

const ROOT = fileURLToPath(new URL('../../../', import.meta.url));
const ORIN = join(ROOT, 'packages/sdk/examples/steering/orin-3-meo.json');
const REVIEW = join(ROOT, 'packages/sdk/examples/review/kestrel-block-a.review.json');
const NBS14 = join(ROOT, 'test/fixtures/stability/nbs14-phase.txt');
const NAV = join(ROOT, 'test/fixtures/rinex-nav/mixed-v305.rnx');
const SP3 = join(ROOT, 'test/fixtures/sp3/orbit-d-p.sp3');
const WINDOW = ['--from', '2024-01-07T00:00:00', '--to', '2024-01-07T02:00:00', '--step', '3600'];

const run = (...argv: string[]): Promise<CliRun> => runCli(argv);

/** Asserts exit 2, nothing on stdout, exactly one stderr line without a stack trace, matching `pattern`. */
async function expectOneLine(argv: string[], pattern: RegExp): Promise<void> {
  const r = await run(...argv);
  expect(r.status, argv.join(' ')).toBe(2);
  expect(r.out, argv.join(' ')).toBe('');
  expect(r.err.trimEnd().split('\n'), argv.join(' ')).toHaveLength(1);
  expect(r.err, argv.join(' ')).not.toMatch(/\n\s+at /);
  expect(r.err, argv.join(' ')).toMatch(pattern);
}

const tmp = mkdtempSync(join(tmpdir(), 'tauline-hardening-'));
const dir = join(tmp, 'a-directory');
mkdirSync(dir);
const empty = join(tmp, 'empty.json');
writeFileSync(empty, '  \n');
const syntax = join(tmp, 'syntax.json');
writeFileSync(syntax, '{\n  "a": 1,\n  "b": }\n');
const truncated = join(tmp, 'truncated.json');
writeFileSync(truncated, readFileSync(ORIN, 'utf8').slice(0, 300));

describe('files: the shared JSON reader (plan, simulate, review)', () => {
  it('jsonErrorOffset(text) finds the first RFC 8259 error, independent of the engine message', () => {
    expect(jsonErrorOffset('{"a": [1, 2, {"b": null}]}')).toBeUndefined();
    expect(jsonErrorOffset('{"a": 1,}')).toBe(8);
    expect(jsonErrorOffset('[01]')).toBe(2);
    expect(jsonErrorOffset('{"a": tru}')).toBe(9);
    expect(jsonErrorOffset('"\\x"')).toBe(2);
    expect(jsonErrorOffset('"abc')).toBe(4);
    expect(jsonErrorOffset('{} x')).toBe(3);
    expect(lineColumn('ab\ncd', 4)).toEqual({ line: 2, column: 2 });
  });

  it('readJsonFile(path, what) names file, line, column and the text found for a syntax error, an empty file and a truncated file', async () => {
    await expect(readJsonFile(syntax, 'a steering scenario')).rejects.toThrow(
      /syntax\.json:3:8: expected valid JSON \(a steering scenario\); found "}"/,
    );
    await expect(readJsonFile(empty, 'a review file')).rejects.toThrow(
      /empty\.json:1:1: expected a review file \(JSON\); found "an empty file"/,
    );
    await expect(readJsonFile(truncated)).rejects.toThrow(/found "the end of the file \(truncated\?\)"/);
    await expect(readJsonFile(syntax)).rejects.toBeInstanceOf(ParseError);
    await expect(readJsonFile(dir, 'a review file')).rejects.toThrow(/is a directory; expected a review file \(JSON\)/);
    const bom = join(tmp, 'bom.json');
    writeFileSync(bom, '\ufeff{"ok": true}');
    await expect(readJsonFile(bom)).resolves.toEqual({ ok: true });
  });

  it('tauline plan, simulate and review report the same one-line ParseError for malformed JSON and refuse a directory', async () => {
    for (const cmd of [['plan'], ['simulate', '--runs', '10'], ['review']]) {
      await expectOneLine([...cmd, syntax], /syntax\.json:3:8: expected valid JSON/);
      await expectOneLine([...cmd, empty], /empty\.json:1:1: .*found "an empty file"/);
      await expectOneLine([...cmd, truncated], /truncated\.json:4:\d+: .*end of the file/);
      await expectOneLine([...cmd, dir], /is a directory/);
      await expectOneLine([...cmd, join(tmp, 'missing.json')], /no such file/);
    }
    await expectOneLine(
      ['plan', ORIN, '--leap-seconds', dir],
      /is a directory; expected an IERS\/NIST leap-seconds\.list/,
    );
  });
});

describe('framework: flags', () => {
  it('a flag given twice is refused naming both values, not silently the last one', async () => {
    await expectOneLine(
      ['rate', '--semi-major-axis', '26561750', '--semi-major-axis', '7000000'],
      /--semi-major-axis is given more than once \("26561750" and "7000000"\)/,
    );
  });

  it('a missing required flag quotes its help (unit and example)', async () => {
    await expectOneLine(['rate'], /--semi-major-axis is required: <m>, Orbit semi-major axis a, in metres/);
    await expectOneLine(['rate', '--semi-major-axis='], /--semi-major-axis is required \(it was given empty\)/);
  });

  it('describeFailure(error) maps unusable-file errors (EISDIR, EACCES, ENOTDIR) to exit 2 with the reason', () => {
    for (const [code, reason] of [
      ['EISDIR', 'directory'],
      ['EACCES', 'permission denied'],
      ['ENOTDIR', 'not a directory'],
    ] as const) {
      const e = Object.assign(new Error(code), { code, path: '/x/y' });
      const d = describeFailure(e);
      expect(d.status).toBe(2);
      expect(d.line).toContain('cannot read "/x/y"');
      expect(d.line).toContain(reason);
    }
    expect(describeFailure(new Error('boom')).status).toBe(3);
  });

  it('an unreadable file exits 2 (permission denied) unless running as root', async () => {
    const locked = join(tmp, 'locked.json');
    writeFileSync(locked, '{}');
    chmodSync(locked, 0o000);
    const r = await run('review', locked);
    expect(r.status).toBe(2);
    if (process.getuid?.() !== 0) expect(r.err).toMatch(/permission denied/);
  });

  it('--format json prints exactly what --json prints, for every command offering JSON', async () => {
    const cases: string[][] = [
      ['rate', '--semi-major-axis', '26561750'],
      ['periodic', '--semi-major-axis', '26561750', '--eccentricity', '0.01', '--mean-anomaly', '1'],
      ['propertime', '--state', '26561750,0,0,0,3873.8,0', '--duration', '600', '--step', '300'],
      ['stability', '--phase', NBS14, '--tau0', '1'],
      ['plan', ORIN],
      ['simulate', ORIN, '--runs', '5'],
      ['review', REVIEW, '--runs', '200'],
      ['broadcast', NAV, ...WINDOW, '--satellite', 'G05'],
      ['precise', SP3],
      [
        'clock',
        '--phase',
        join(ROOT, 'packages/sdk/examples/clock/vestra-4-rafs.txt'),
        '--epoch',
        '2027-02-08T06:00:00',
      ],
    ];
    for (const argv of cases) {
      const a = await run(...argv, '--json');
      const b = await run(...argv, '--format', 'json');
      expect(a.out, argv[0]).toBe(b.out);
      expect(a.status, argv[0]).toBe(b.status);
      expect(() => JSON.parse(a.out), argv[0]).not.toThrow();
    }
  });

  it('--format csv prints what --csv prints (broadcast, precise); conflicting or unknown formats exit 2', async () => {
    for (const argv of [
      ['broadcast', NAV, ...WINDOW, '--satellite', 'G05'],
      ['precise', SP3],
    ]) {
      expect((await run(...argv, '--csv')).out).toBe((await run(...argv, '--format', 'csv')).out);
      await expectOneLine([...argv, '--format', 'json', '--csv'], /--format json and --csv cannot be combined/);
    }
    await expectOneLine(
      ['rate', '--semi-major-axis', '26561750', '--format', 'xml'],
      /--format must be one of table, json; received "xml"/,
    );
    await expectOneLine(['review', REVIEW, '--format', 'md', '--json'], /--format md and --json cannot be combined/);
  });

  it('--seed has one range, [0, 4294967295], for review and simulate (a wider seed would alias another after the 32-bit reduction)', async () => {
    for (const seed of ['-1', '4294967296', '1.5']) {
      await expectOneLine(
        ['simulate', ORIN, '--runs', '5', '--seed', seed],
        /--seed must be an integer in \[0, 4294967295\]/,
      );
      await expectOneLine(['review', REVIEW, '--seed', seed], /--seed must be an integer in \[0, 4294967295\]/);
    }
    expect((await run('simulate', ORIN, '--runs', '5', '--seed', '4294967295', '--json')).status).toBe(0);
  });
});

describe('commands: nonsense that used to pass', () => {
  it('tauline periodic refuses |M| > 1e9 rad (a double no longer holds M modulo 2π)', async () => {
    await expectOneLine(
      ['periodic', '--semi-major-axis', '26561750', '--eccentricity', '0.01', '--mean-anomaly', '1e30'],
      /--mean-anomaly must be in \[−1e9, 1e9\] rad; received 1e\+30/,
    );
    expect(
      (await run('periodic', '--semi-major-axis', '26561750', '--eccentricity', '0.01', '--mean-anomaly', '-1e9'))
        .status,
    ).toBe(0);
  });

  it('tauline propertime refuses an unbound (hyperbolic) state, naming the escape speed √(2GM/r) (5478.4 m/s at 26 561 750 m, IERS 2010 GM [C])', async () => {
    await expectOneLine(
      ['propertime', '--state', '26561750,0,0,0,9000,0', '--duration', '600', '--step', '60'],
      /--state \(\|velocity\|\) must be below the escape speed √\(2GM\/r\) = 5478\.4 m\/s at r = 26561750 m.*received 9000/,
    );
    await expectOneLine(
      ['propertime', '--state', '26561750,0,0,0,3873800,0', '--duration', '600', '--step', '60'],
      /looks like mm\/s or cm\/s/,
    );
  });

  it('tauline stability: a directory, a record under 4 points, no usable τ, a confidence outside (0, 1) exit 2 naming the flag', async () => {
    const short = join(tmp, 'short.txt');
    writeFileSync(short, '1e-9\n2e-9\n3e-9\n');
    await expectOneLine(['stability', '--phase', dir, '--tau0', '1'], /is a directory; expected a phase record/);
    await expectOneLine(
      ['stability', '--phase', short, '--tau0', '1'],
      /--phase must be a record of at least 4 phase points.*it has 3 sample/,
    );
    await expectOneLine(
      ['stability', '--phase', NBS14, '--tau0', '1', '--taus', '100'],
      /--taus must be a request in which at least one τ has a complete \(gap-free\) term; received "100"\. the record has 10 phase points.*oadev reaches τ = ⌊\(N − 1\)\/2⌋·τ0 = 4 s/,
    );
    await expectOneLine(
      ['stability', '--phase', NBS14, '--tau0', '1', '--confidence', '0'],
      /--confidence must be in \(0, 1\)/,
    );
    await expectOneLine(
      ['stability', '--phase', NBS14, '--tau0', '1', '--confidence', '95'],
      /a fraction, not a percentage/,
    );
    await expectOneLine(
      ['stability', '--phase', NBS14, '--tau0', '-1'],
      /^tauline stability: invalid input: --tau0 must be/,
    );
  });

  it('tauline clock: a directory (phase or RINEX clock) and a record too short for the noise estimate exit 2 naming the file or flag', async () => {
    const short = join(tmp, 'clock-short.txt');
    writeFileSync(short, '1e-9\n2e-9\n3e-9\n');
    await expectOneLine(
      ['clock', '--phase', dir, '--tau0', '1'],
      /"[^"]*a-directory" is a directory; expected a phase record/,
    );
    await expectOneLine(
      ['clock', '--rinex-clock', dir, '--clock', 'G05'],
      /"[^"]*a-directory" is a directory; expected a RINEX clock file/,
    );
    await expectOneLine(
      ['clock', '--phase', short, '--tau0', '1'],
      /^tauline clock: --phase .*clock-short\.txt has 3 phase samples; the clock model needs at least 12/,
    );
  });

  it('tauline stability and clock: a RINEX clock with a single epoch asks for a longer file (--tau0 cannot help)', async () => {
    const one = join(tmp, 'one-epoch.clk');
    writeFileSync(
      one,
      `${readFileSync(join(ROOT, 'test/fixtures/rinex-clock/fictional-304.clk'), 'utf8')
        .split('\n')
        .slice(0, 7)
        .join('\n')}\n`,
    );
    for (const cmd of ['stability', 'clock']) {
      await expectOneLine(
        [cmd, '--rinex-clock', one, '--clock', 'G05'],
        new RegExp(`^tauline ${cmd}: clock G05 has a single epoch; give a longer file\n$`),
      );
    }
  });

  it('tauline broadcast exits 1 when no sample has a record (still printing the table), and puts the caution on stderr with --csv', async () => {
    const none = await run('broadcast', NAV, ...WINDOW, '--satellite', 'G99', '--json');
    expect(none.status).toBe(1);
    expect(JSON.parse(none.out).samplesWithoutRecord).toBe(3);
    expect(none.err).toMatch(/no sample has a valid record: no record of G99/);
    const csv = await run('broadcast', NAV, ...WINDOW, '--satellite', 'G05', '--csv');
    expect(csv.status).toBe(0);
    expect(csv.out).not.toContain('Caution');
    expect(csv.err).toContain('responsible engineering authority');
    await expectOneLine(['broadcast', dir, ...WINDOW], /is a directory; expected a RINEX navigation file/);
  });

  it('tauline precise refuses a --satellite missing from the SP3 header, and a directory', async () => {
    await expectOneLine(
      ['precise', SP3, '--satellite', 'G30,G99'],
      /--satellite must be satellites listed in the header of .*orbit-d-p\.sp3: G30, G31; received "G99"/,
    );
    await expectOneLine(['precise', dir], /is a directory; expected an SP3 file/);
    await expectOneLine(['precise', SP3, '--nav', dir], /is a directory; expected a RINEX navigation file/);
  });
});

describe('JSON outputs: units named, cautions carried', () => {
  it("every command's JSON has a units map; flight-configuration outputs (rate, plan, review, broadcast) and simulate carry the caution", async () => {
    const rate = JSON.parse(
      (await run('rate', '--semi-major-axis', '26561750', '--nominal-frequency', '10.23e6', '--json')).out,
    );
    expect(rate.units).toMatchObject({ semiMajorAxis: 'm', microsecondsPerDay: 'µs per day', offsetFrequencyHz: 'Hz' });
    expect(rate.caution).toMatch(/interface specification.*responsible engineering authority/);
    const periodic = JSON.parse(
      (
        await run(
          'periodic',
          '--semi-major-axis',
          '26561750',
          '--eccentricity',
          '0.01',
          '--mean-anomaly',
          '1',
          '--json',
        )
      ).out,
    );
    expect(periodic.units).toMatchObject({ correctionSeconds: 's', meanAnomaly: 'rad', relativisticF: 's/√m' });
    const pt = JSON.parse(
      (await run('propertime', '--state', '26561750,0,0,0,3873.8,0', '--duration', '600', '--step', '300', '--json'))
        .out,
    );
    expect(pt.units).toMatchObject({ tauMinusTT: 's' });
    const st = JSON.parse((await run('stability', '--phase', NBS14, '--tau0', '1', '--json')).out);
    expect(st.units).toMatchObject({ tau: 's', tdev: 's' });
    const plan = JSON.parse((await run('plan', ORIN, '--json')).out);
    expect(plan.units).toMatchObject({ phaseStepSeconds: 's', fractionalFrequencyStep: 'dimensionless (Δf/f)' });
    expect(plan.caution).toMatch(/responsible engineering authority/);
    const sim = JSON.parse((await run('simulate', ORIN, '--runs', '5', '--json')).out);
    expect(sim.units).toMatchObject({ worstExcursionSeconds: 's' });
    expect(sim.caution).toMatch(/interface specification.*responsible engineering authority/);
    const review = JSON.parse((await run('review', REVIEW, '--runs', '200', '--json')).out);
    expect(review.caution).toMatch(/responsible engineering authority/);
    const bc = JSON.parse((await run('broadcast', NAV, ...WINDOW, '--satellite', 'G05', '--json')).out);
    expect(bc.units).toMatchObject({ relativisticSeconds: 's', clockCorrectionSeconds: 's' });
    expect(bc.caution).toMatch(/responsible engineering authority/);
    const pr = JSON.parse((await run('precise', SP3, '--json')).out);
    expect(pr.units).toMatchObject({ relativisticSeconds: 's', epochInterval: 's' });
  });

  it('the table forms of rate, plan, simulate, review and broadcast print the caution', async () => {
    for (const argv of [
      ['rate', '--semi-major-axis', '26561750'],
      ['plan', ORIN],
      ['simulate', ORIN, '--runs', '5'],
      ['review', REVIEW, '--runs', '200'],
      ['broadcast', NAV, ...WINDOW, '--satellite', 'G05'],
    ]) {
      // Fitted to 100 columns the caution may break across lines: compare with line breaks as spaces.
      expect((await run(...argv)).out.replace(/\s+/g, ' '), argv[0]).toMatch(
        /interface specification.*responsible engineering authority/,
      );
    }
  });
});

describe('tauline broadcast time flags', () => {
  it('a date-only or zoned --from is one line that quotes the value once and says how to fix it', async () => {
    const base = ['broadcast', NAV, '--to', '2024-01-07T02:00:00', '--step', '3600'];
    const r = await run(...base, '--from', '2024-01-07');
    expect(r.status).toBe(2);
    expect(r.err.trimEnd().split('\n')).toHaveLength(1);
    expect(r.err.match(/received/g)).toHaveLength(1);
    expect(r.err).toMatch(/--from must be an ISO 8601 date-time .*; received "2024-01-07"\. .*add a time/);
    const z = await run(...base, '--from', '2024-01-07T00:00:00Z');
    expect(z.err.match(/received/g)).toHaveLength(1);
    expect(z.err).toMatch(/use --time-scale utc for UTC/);
  });
});
