/**
 * Everyday use in a terminal: every command's default output fits 100 columns on the bundled examples
 * and fixtures (`--wide` keeps the long form), RINEX clock epochs as calendar times, `tauline help
 * <command>`, "did you mean", plausibility warnings, review and plan wording, the precise cross-check
 * note, the propertime caution, and progress only on a terminal. Run in-process.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { runCli } from './run.js';

const ROOT = fileURLToPath(new URL('../../../', import.meta.url));
/** Paths as a user in the repository would type them (an absolute temp path could itself exceed 100 columns). */
const at = (path: string): string => relative(process.cwd(), join(ROOT, path)) || '.';
const ORIN = at('packages/sdk/examples/steering/orin-3-meo.json');
const HALCYR = at('packages/sdk/examples/steering/halcyr-g1-geo.json');
const REVIEW_A = at('packages/sdk/examples/review/kestrel-block-a.review.json');
const REVIEW_B = at('packages/sdk/examples/review/kestrel-block-b-mistakes.review.json');
const VESTRA = at('packages/sdk/examples/clock/vestra-4-rafs.txt');
const NAV = at('test/fixtures/rinex-nav/mixed-v305.rnx');
const NAV4 = at('test/fixtures/rinex-nav/mixed-v401.rnx');
const SP3_D = at('test/fixtures/sp3/orbit-d-p.sp3');
const SP3_C = at('test/fixtures/sp3/orbit-c-pv.sp3');
const CLK = at('test/fixtures/rinex-clock/long-304.clk');
const NBS14 = at('test/fixtures/stability/nbs14-phase.txt');
const TWO_COLUMN = at('test/fixtures/stability/phase-two-column.txt');
const WINDOW = ['--from', '2024-01-07T00:00:00', '--to', '2024-01-07T06:00:00', '--step', '1800'];

/**
 * Terminal columns of a line, computed independently of the CLI's own table: grapheme clusters
 * (Intl.Segmenter, so combining marks add nothing), two columns for Han, Hangul and kana scripts, the
 * fullwidth forms block U+FF01–U+FF60 / U+FFE0–U+FFE6 and emoji with emoji presentation (Unicode Standard
 * Annex #11 East Asian Width W/F classes, from memory [M]), one for any other cluster.
 */
function columns(line: string): number {
  let n = 0;
  for (const { segment } of new Intl.Segmenter('en', { granularity: 'grapheme' }).segment(line)) {
    const wide =
      /\p{Script=Han}|\p{Script=Hangul}|\p{Script=Hiragana}|\p{Script=Katakana}|[\uff01-\uff60\uffe0-\uffe6]|\p{Emoji_Presentation}/u.test(
        segment,
      );
    n += wide ? 2 : 1;
  }
  return n;
}

/** Every command on the bundled examples and fixtures, with the options that widen its tables most. */
const DEFAULT_RUNS: string[][] = [
  ['rate', '--semi-major-axis', '26561750', '--nominal-frequency', '10.23e6'],
  ['rate', '--semi-major-axis', '29600000', '--constants', 'galileo-icd', '--reference', 'tcg'],
  ['periodic', '--semi-major-axis', '26561750', '--eccentricity', '0.02', '--mean-anomaly', '1.5'],
  ['propertime', '--state=26561750,0,0,0,3873.8299,0', '--duration', '86400', '--step', '21600', '--model', 'full'],
  ['broadcast', NAV, ...WINDOW],
  ['broadcast', NAV, ...WINDOW, '--signal', 'E1'],
  [
    'broadcast',
    NAV4,
    '--from',
    '2024-01-07T00:00:00Z',
    '--to',
    '2024-01-07T06:00:00Z',
    '--step',
    '1800',
    '--time-scale',
    'utc',
    '--signal',
    'L2P',
  ],
  ['precise', SP3_D],
  ['precise', SP3_C, '--nav', NAV],
  ['precise', SP3_D, '--nav', NAV],
  ['stability', '--phase', NBS14, '--tau0', '1', '--statistics', 'adev,oadev,mdev,tdev,hdev,ohdev,totdev'],
  ['stability', '--phase', TWO_COLUMN],
  ['stability', '--rinex-clock', CLK, '--clock', 'G37'],
  [
    'clock',
    '--phase',
    VESTRA,
    '--epoch',
    '2027-02-08T06:00:00',
    '--tau0',
    '300',
    '--states',
    '3',
    '--scenario-noise',
    '--predict',
    '2027-02-22T06:00:00,2027-02-23T06:00:00',
  ],
  ['clock', '--rinex-clock', CLK, '--clock', 'G37'],
  ['plan', ORIN],
  ['plan', HALCYR],
  ['plan', HALCYR, '--strategy', 'optimal'],
  ['simulate', ORIN, '--runs', '20', '--seed', '3'],
  ['review', REVIEW_A, '--runs', '200'],
  ['review', REVIEW_B, '--runs', '200'],
  ['fleet', at('packages/sdk/examples/fleet/vesper-constellation.json')],
  ['fleet', at('packages/sdk/examples/fleet/ashgrove-orbits.json')],
];

describe('default tables fit 100 columns', () => {
  it.each(DEFAULT_RUNS.map((argv) => [argv.join(' '), argv] as const))(
    'tauline %s prints no line wider than 100 columns',
    async (_, argv) => {
      const r = await runCli(argv);
      expect(r.status, r.err).toBeLessThan(2);
      expect(r.out.length).toBeGreaterThan(0);
      const wide = r.out.split('\n').filter((line) => columns(line) > 100);
      expect(wide).toEqual([]);
    },
  );

  it('tauline <command> --wide keeps the long form: one line per command with its reason, and unwrapped text', async () => {
    const narrow = await runCli(['plan', HALCYR]);
    const wide = await runCli(['plan', HALCYR, '--wide']);
    expect(wide.status).toBe(narrow.status);
    expect(wide.out).toMatch(/^1 .*frequency .*deadband: predicted offset would use more than 50 %.*over 24\.0 h$/m);
    expect(Math.max(...wide.out.split('\n').map(columns))).toBeGreaterThan(100);
    // Same content: only line breaks and runs of spaces differ, and the moved reasons lose their column header.
    const words = (text: string) =>
      text
        .split(/\s+/)
        .filter((w) => w !== '' && !/^─+$/.test(w))
        .sort();
    const wideWords = words(wide.out);
    wideWords.splice(wideWords.indexOf('reason'), 1);
    expect(words(narrow.out)).toEqual(wideWords);
  });

  it('tauline broadcast puts "no record covers this time" on its own line, not in the t_oe column', async () => {
    const r = await runCli(['broadcast', NAV, ...WINDOW, '--satellite', 'C03']);
    const lines = r.out.split('\n');
    const k = lines.findIndex((l) => /^C03 +2024-01-07T06:00:00 +— +— +— *$/.test(l));
    expect(k, r.out).toBeGreaterThan(0);
    // The reason says which fit interval the time falls outside (or that no healthy record covers it).
    expect(lines[k + 1]).toMatch(/^ +(after the end of|before the start of|no healthy record)/);
    const wide = await runCli(['broadcast', NAV, ...WINDOW, '--satellite', 'C03', '--wide']);
    expect(wide.out).toMatch(
      /^C03 +2024-01-07T06:00:00 +— +— +(after the end of|before the start of|no healthy record)/m,
    );
  });
});

describe('RINEX clock epochs as calendar times', () => {
  // Epochs as written in the file (test/fixtures/rinex-clock/SOURCE.md): 2026-02-02 00:00 to 2026-02-03 09:15, GPS time.
  it("tauline stability --rinex-clock prints the record span and gap epochs in the file's time system, JSON gives them on the first epoch with stamps", async () => {
    const r = await runCli(['stability', '--rinex-clock', CLK, '--clock', 'G37']);
    expect(r.out.replace(/\n(?! )/g, ' ')).toMatch(/epochs 2026-02-02T00:00:00 GPS … 2026-02-03T09:15:00 GPS/);
    expect(r.out).toMatch(/\(t = 2026-02-02T12:30:00 GPS\)/);
    expect(r.out).not.toMatch(/e\+9/);
    const j = JSON.parse((await runCli(['stability', '--rinex-clock', CLK, '--clock', 'G37', '--json'])).out);
    // 12:30:00 is 45 000 s after the first epoch 00:00:00 (hand computation [C]).
    expect(j.input.gaps[0]).toEqual({
      index: 150,
      missing: 1,
      line: 162,
      time: 45000,
      timeStamp: { iso: '2026-02-02T12:30:00', scale: 'GPS' },
    });
    expect(j.input.epoch).toEqual({ iso: '2026-02-02T00:00:00', scale: 'GPS' });
    expect(j.input.timeSystem).toBe('GPS');
    expect(j.units.gapTime).toBe('s since input.epoch (the first sample)');
  });

  it('tauline clock --rinex-clock --predict <ISO 8601> prints the prediction epoch as a calendar time', async () => {
    const r = await runCli(['clock', '--rinex-clock', CLK, '--clock', 'G37', '--predict', '2026-02-04T00:00:00']);
    expect(r.status).toBe(0);
    expect(r.out).toMatch(/prediction at t = 2026-02-04T00:00:00 GPS: x = /);
  });
});

describe('help and mistyped names', () => {
  it('tauline help <command> prints the same help as tauline <command> --help and exits 0', async () => {
    for (const name of ['rate', 'clock', 'review']) {
      const viaHelp = await runCli(['help', name]);
      expect(viaHelp.status).toBe(0);
      expect(viaHelp.out).toBe((await runCli([name, '--help'])).out);
      expect(viaHelp.out).toMatch(/--wide/);
    }
  });

  it('a mistyped command or flag exits 2 with "did you mean"', async () => {
    const cmd = await runCli(['simulte', 'x.json']);
    expect(cmd.status).toBe(2);
    expect(cmd.err).toMatch(/^tauline: unknown command "simulte"; did you mean simulate\? \(known commands: /);
    const viaHelp = await runCli(['help', 'stabilty']);
    expect(viaHelp.status).toBe(2);
    expect(viaHelp.err).toMatch(/did you mean stability\?/);
    const flag = await runCli([
      'periodic',
      '--semi-major-axis',
      '26561750',
      '--eccentricity',
      '0.01',
      '--mean-anomoly',
      '1',
    ]);
    expect(flag.status).toBe(2);
    expect(flag.err.trim().split('\n')).toHaveLength(1);
    expect(flag.err).toMatch(/Unknown option '--mean-anomoly'; did you mean --mean-anomaly\?/);
    const far = await runCli(['rate', '--colour', 'red']);
    expect(far.status).toBe(2);
    expect(far.err).not.toMatch(/did you mean/);
  });
});

describe('plausibility warnings', () => {
  it('a valid but suspicious value is used as given, with one warning line on stderr and the same stdout', async () => {
    const cases: [string[], string[], RegExp][] = [
      [
        ['periodic', '--semi-major-axis', '26561750', '--eccentricity', '0.01', '--mean-anomaly', '90'],
        ['--mean-anomaly', '1.5'],
        /^tauline periodic: warning: --mean-anomaly 90 rad is more than one turn .*if it is in degrees, give 1\.570796327 rad$/,
      ],
      [
        ['rate', '--semi-major-axis', '26561750', '--nominal-frequency', '10.23'],
        ['--nominal-frequency', '10.23e6'],
        /^tauline rate: warning: --nominal-frequency 10\.23 Hz is below 1 kHz; if it is in MHz, give 10230000 Hz$/,
      ],
      [
        ['propertime', '--state=26561750,0,0,0,3.8738299,0', '--duration', '600', '--step', '300'],
        [],
        /^tauline propertime: warning: --state \(\|velocity\|\) 3\.87383 m\/s is under 1 % of the circular speed .*km\/s/,
      ],
    ];
    for (const [argv, , pattern] of cases) {
      const r = await runCli([...argv, '--json']);
      expect(r.status, r.err).toBe(0);
      expect(r.err.trimEnd().split('\n')).toHaveLength(1);
      expect(r.err.trimEnd()).toMatch(pattern);
      expect(() => JSON.parse(r.out)).not.toThrow();
    }
    const plain = await runCli(['rate', '--semi-major-axis', '26561750', '--nominal-frequency', '10.23e6']);
    expect(plain.err).toBe('');
    expect(
      (await runCli(['periodic', '--semi-major-axis', '26561750', '--eccentricity', '0.01', '--mean-anomaly', '6']))
        .err,
    ).toBe('');
  });
});

describe('review, plan, precise and propertime wording', () => {
  it('tauline review explains a MARGINAL verdict without findings in the table, Markdown and HTML', async () => {
    const table = await runCli(['review', REVIEW_B, '--runs', '200']);
    expect(table.out.replace(/\s+/g, ' ')).toMatch(
      /KESTREL-19 \(MARGINAL\): .* · No recognised mistake matches\. MARGINAL: the difference 3\.50e-13 is inside the tolerance ±5\.0e-13 but uses 70 % of it/,
    );
    const html = await runCli(['review', REVIEW_B, '--runs', '200', '--format', 'html']);
    const section = /<section><h2>KESTREL-19[\s\S]*?<\/section>/.exec(html.out)![0];
    expect(section).not.toMatch(/No findings\./);
    expect(section).toMatch(/MARGINAL: the difference 3\.50e-13 is inside the tolerance/);
    expect((await runCli(['review', REVIEW_B, '--runs', '200', '--format', 'md'])).out).toMatch(
      /MARGINAL: the difference 3\.50e-13/,
    );
  });

  it('tauline plan starts the infeasibility sentence with a capital (or a symbol such as σ), never a lower-case letter', async () => {
    // HALCYR-G1 with a ±10 ns tolerance: infeasible (the example itself is feasible under the per-epoch criterion).
    const s = JSON.parse(readFileSync(HALCYR, 'utf8')) as { tolerance: { phaseSeconds: number } };
    s.tolerance.phaseSeconds = 1e-8;
    const dir = mkdtempSync(join(tmpdir(), 'tauline-terminal-'));
    const tight = join(dir, 'tight.json');
    writeFileSync(tight, JSON.stringify(s));
    const r = await runCli(['plan', tight]);
    rmSync(dir, { recursive: true, force: true });
    expect(r.status).toBe(1);
    expect(r.out.replace(/\s+/g, ' ')).toMatch(/Feasible: NO \([^)]*\)\. [^a-z]/);
  });

  it('tauline precise --nav names the satellites the navigation file has no record of instead of columns of "—"', async () => {
    const r = await runCli(['precise', SP3_D, '--nav', NAV]);
    expect(r.status).toBe(0);
    expect(r.out).not.toMatch(/—/);
    expect(r.out).not.toMatch(/broadcast \(ns\)/); // no satellite has a record: no empty columns
    expect(r.out).toMatch(
      /No broadcast cross-check:\n {2}G30: the navigation file\(s\) have no record of this satellite over the SP3 span\n {2}G31: /,
    );
    const j = JSON.parse((await runCli(['precise', SP3_D, '--nav', NAV, '--json'])).out);
    expect(j.satellites[0].broadcastNote).toMatch(/no record of this satellite/);
    const some = await runCli(['precise', SP3_C, '--nav', NAV]);
    expect(some.out).toMatch(/broadcast \(ns\)/);
  });

  it('tauline propertime prints the flight caution in the table and carries it in the JSON with meanRate', async () => {
    const argv = [
      'propertime',
      '--state=26561750,0,0,0,3873.8299,0',
      '--duration',
      '86400',
      '--step',
      '43200',
      '--model',
      'point-mass',
    ];
    const t = await runCli(argv);
    expect(t.out.replace(/\s+/g, ' ')).toMatch(
      /mean rate over the span: .* Caution: verify these values against the mission's own interface specification/,
    );
    const j = JSON.parse((await runCli([...argv, '--json'])).out);
    expect(j.meanRate).toBeCloseTo(4.4647e-10, 13); // tauline rate's GPS check value (physics-refs, IERS 2010 eq. 10.9)
    expect(j.caution).toMatch(/responsible engineering authority/);
  });
});

describe('progress only on a terminal', () => {
  // 50 days of a GPS-like orbit: about 100 revolutions, above the propertime progress threshold.
  const LONG = [
    'propertime',
    '--state=26561750,0,0,0,3873.8299,0',
    '--duration',
    '5184000',
    '--step',
    '864000',
    '--model',
    'point-mass',
    '--json',
  ];

  it('tauline propertime over many orbits draws a bar on stderr when it is a terminal and nothing otherwise', async () => {
    const tty = await runCli(LONG, true);
    expect(tty.err).toMatch(/^\rintegrating \[/);
    expect(tty.err).toMatch(/100 %/);
    expect(tty.err.endsWith('\r')).toBe(true); // the line is cleared at the end
    const pipe = await runCli(LONG, false);
    expect(pipe.err).toBe('');
    expect(JSON.parse(pipe.out).samples).toHaveLength(7);
  });

  it('a run that fails after drawing its bar clears the bar before the one error line', async () => {
    // A GPS radius with a speed of 3.87 m/s (km/s given as m/s) falls into the Earth within the first orbit.
    const r = await runCli(
      ['propertime', '--state=26561750,0,0,0,3.8738299,0', '--duration', '5184000', '--step', '864000'],
      true,
    );
    expect(r.status).toBe(2);
    const error = r.err.slice(r.err.lastIndexOf('\r') + 1);
    expect(r.err).toMatch(/^\rintegrating \[/);
    expect(r.err.slice(0, r.err.lastIndexOf('\r') + 1)).toMatch(/\r +\r$/);
    expect(error).toMatch(/^tauline propertime: .*enters the Earth/);
    expect(error.trimEnd().split('\n')).toHaveLength(1);
  });

  it('tauline clock on a file above 4 MiB reports its stages on a terminal only', async () => {
    // The VESTRA-4 record behind 4.2 MB of comment lines: a big file that is quick to characterise.
    const dir = mkdtempSync(join(tmpdir(), 'tauline-terminal-'));
    const big = join(dir, 'big.txt');
    writeFileSync(
      big,
      `${'# padding line to make the file large, ignored by the reader\n'.repeat(70_000)}${readFileSync(join(ROOT, 'packages/sdk/examples/clock/vestra-4-rafs.txt'), 'utf8')}`,
    );
    const tty = await runCli(
      ['clock', '--phase', big, '--epoch', '2027-02-08T06:00:00', '--tau0', '300', '--json'],
      true,
    );
    expect(tty.status, tty.err).toBe(0);
    expect(tty.err).toMatch(/^\rcharacterising the clock \[\.+\] {3}0 %/);
    expect(tty.err).toMatch(/ 25 %/);
    expect(tty.err.endsWith('\r')).toBe(true);
    const pipe = await runCli(
      ['clock', '--phase', big, '--epoch', '2027-02-08T06:00:00', '--tau0', '300', '--json'],
      false,
    );
    expect(pipe.err).toBe('');
    expect(JSON.parse(pipe.out)).toEqual(JSON.parse(tty.out));
  });

  it('tauline review draws the Monte Carlo progress on a terminal only (3 dispersed spacecraft × 400 000 draws)', async () => {
    const argv = ['review', REVIEW_A, '--runs', '400000', '--json'];
    const tty = await runCli(argv, true);
    expect(tty.err).toMatch(/Monte Carlo over the injection dispersion \[#+\.*\] +\d+ %/);
    expect(tty.err).toMatch(/100 %/);
    const pipe = await runCli(['review', REVIEW_A, '--runs', '200'], false);
    expect(pipe.err).toBe('');
  });
});
