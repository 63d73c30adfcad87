/**
 * Hostile input to every command that reads a file (issue 11): devices, named pipes, directories, a multi-GB
 * sparse file, an endless or over-long line, binary content, `-` for standard input, an unwritable --output and
 * control characters in ids. Each ends in exit 2 with one line (never exit 3, never a heap abort), within the
 * vitest timeout given to each test (a bound on a hang, not a speed target). Limits: common practice, no source.
 */
import { spawnSync } from 'node:child_process';
import {
  closeSync,
  existsSync,
  mkdirSync,
  mkdtempSync,
  openSync,
  readFileSync,
  truncateSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { MAX_LINE_CHARACTERS } from '@tauline/sdk/io';
import { describe, expect, it } from 'vitest';
import { MAX_DOCUMENT_BYTES, MAX_NAVIGATION_BYTES, MAX_RECORD_BYTES } from '../src/files.js';
import { describeFailure, escapeControlCharacters, OutputError } from '../src/framework.js';
import { type CliRun, runCli } from './run.js';

const ROOT = fileURLToPath(new URL('../../../', import.meta.url));
const ORIN = join(ROOT, 'packages/sdk/examples/steering/orin-3-meo.json');
const REVIEW = join(ROOT, 'packages/sdk/examples/review/kestrel-block-a.review.json');
const NBS14 = join(ROOT, 'test/fixtures/stability/nbs14-phase.txt');
const CLK = join(ROOT, 'test/fixtures/rinex-clock/fictional-304.clk');
const NAV = join(ROOT, 'test/fixtures/rinex-nav/mixed-v305.rnx');
const SP3 = join(ROOT, 'test/fixtures/sp3/orbit-d-p.sp3');
const WINDOW = ['--from', '2024-01-07T00:00:00', '--to', '2024-01-07T02:00:00', '--step', '3600'];
const BIN = fileURLToPath(new URL('../bin/tauline.js', import.meta.url));

/** Every way a command reads a file, with `F` standing for the file under test. */
const F = '<file>';
const READERS: readonly (readonly string[])[] = [
  ['stability', '--phase', F, '--tau0', '1'],
  ['stability', '--frequency', F, '--tau0', '1'],
  ['stability', '--rinex-clock', F, '--clock', 'G05'],
  ['clock', '--phase', F, '--epoch', '2027-02-08T06:00:00', '--tau0', '1'],
  ['clock', '--rinex-clock', F, '--clock', 'G05'],
  ['broadcast', F, ...WINDOW],
  ['precise', F],
  ['precise', SP3, '--nav', F],
  ['plan', F],
  ['plan', ORIN, '--leap-seconds', F],
  ['simulate', F, '--runs', '5'],
  ['review', F],
];
const withFile = (argv: readonly string[], file: string): string[] => argv.map((a) => (a === F ? file : a));

/** Asserts exit 2, exactly one stderr line (no stack trace) matching `pattern`, and no "internal error". */
function expectRefusal(r: CliRun, argv: readonly string[], pattern: RegExp): void {
  const label = argv.join(' ');
  expect(r.status, `${label}\n${r.err}`).toBe(2);
  expect(r.err.trimEnd().split('\n'), label).toHaveLength(1);
  expect(r.err, label).not.toMatch(/internal error|\n\s+at /);
  expect(r.err, label).toMatch(pattern);
}

const tmp = mkdtempSync(join(tmpdir(), 'tauline-hostile-'));

describe('devices, pipes, directories and huge files are refused up front (exit 2, one line)', () => {
  it('every file-reading command refuses /dev/zero and /dev/urandom as devices, without reading them', async () => {
    for (const device of ['/dev/zero', '/dev/urandom']) {
      for (const argv of READERS) {
        const a = withFile(argv, device);
        expectRefusal(await runCli(a), a, new RegExp(`"${device}" is a device, not a regular file; expected `));
      }
    }
  }, 20_000);

  it('every file-reading command refuses a named pipe (FIFO) without opening it (opening one would wait for a writer)', async () => {
    const fifo = join(tmp, 'pipe');
    const made = spawnSync('mkfifo', [fifo]);
    expect(made.status).toBe(0);
    for (const argv of READERS) {
      const a = withFile(argv, fifo);
      expectRefusal(
        await runCli(a),
        a,
        /is a named pipe \(FIFO\), not a regular file; expected .*\(give - to read standard input\)/,
      );
    }
  }, 20_000);

  it('every file-reading command refuses a directory', async () => {
    const dir = join(tmp, 'a-directory');
    mkdirSync(dir, { recursive: true });
    for (const argv of READERS) {
      const a = withFile(argv, dir);
      expectRefusal(await runCli(a), a, /is a directory; expected /);
    }
  }, 20_000);

  it('every file-reading command refuses a 5 GiB sparse file by its size, and precise --csv (no size limit: it streams) at its first NUL byte', async () => {
    const big = join(tmp, 'sparse.bin');
    writeFileSync(big, '');
    truncateSync(big, 5 * 2 ** 30); // sparse: no disk blocks, reads as NUL bytes
    for (const argv of READERS) {
      const a = withFile(argv, big);
      expectRefusal(await runCli(a), a, /is 5368709120 bytes, more than the (64|128|512) MiB limit for /);
    }
    const holdsWhole = await runCli(['review', big]);
    expect(holdsWhole.err).toContain(
      `more than the ${MAX_DOCUMENT_BYTES / 2 ** 20} MiB limit for a review file (JSON)`,
    );
    const records = await runCli(['stability', '--phase', big, '--tau0', '1']);
    expect(records.err).toContain(`more than the ${MAX_RECORD_BYTES / 2 ** 20} MiB limit for a phase record`);
    const nav = await runCli(['broadcast', big, ...WINDOW]);
    expect(nav.err).toContain(`more than the ${MAX_NAVIGATION_BYTES / 2 ** 20} MiB limit for a RINEX navigation file`);
    expect((await runCli(['precise', big])).err).toContain(
      'more than the 128 MiB limit for an SP3 file read for table output (--csv streams any size)',
    );
    const streamed = await runCli(['precise', big, '--csv']);
    expect(streamed.err).toMatch(/is not a text file \(a NUL byte at byte 1\); expected an SP3 file/);
  }, 20_000);

  it('a text file with a NUL byte in the middle is refused naming the byte', async () => {
    const nul = join(tmp, 'nul.txt');
    writeFileSync(nul, '1e-9\n2e-9\n\u00003e-9\n');
    expectRefusal(
      await runCli(['stability', '--phase', nul, '--tau0', '1']),
      ['nul'],
      /"[^"]*nul\.txt" is not a text file \(a NUL byte at byte 11\); expected a phase record/,
    );
  });
});

describe('over-long lines and endless input are refused in bounded memory', () => {
  it('every streamed reader refuses a 2 MiB line naming file, line and MAX_LINE_CHARACTERS', async () => {
    const long = join(tmp, 'long-line.txt');
    writeFileSync(long, `${'7'.repeat(2 * MAX_LINE_CHARACTERS)}\n`);
    for (const argv of [READERS[0]!, READERS[2]!, READERS[5]!, READERS[6]!]) {
      const a = withFile(argv, long);
      expectRefusal(await runCli(a), a, /long-line\.txt:1:1048577: expected a line of at most 1048576 characters/);
    }
  }, 20_000);

  it('an endless line on standard input (- for the file) is refused after about 1 MiB, not read to the end', async () => {
    let chunks = 0;
    async function* endless(): AsyncGenerator<string> {
      for (;;) {
        chunks++;
        yield '1'.repeat(65_536);
      }
    }
    const r = await runCli(['stability', '--phase', '-', '--tau0', '1'], false, endless);
    expectRefusal(
      r,
      ['stability --phase -'],
      /^tauline stability: parse-error: stdin:1:1048577: expected a line of at most 1048576 characters/,
    );
    expect(chunks).toBeLessThan(20);
  });

  it('endless NUL bytes on standard input are refused at the first chunk', async () => {
    let chunks = 0;
    async function* zeros(): AsyncGenerator<Uint8Array> {
      for (;;) {
        chunks++;
        yield new Uint8Array(65_536);
      }
    }
    for (const argv of [
      ['review', '-'],
      ['broadcast', '-', ...WINDOW],
      ['clock', '--rinex-clock', '-', '--clock', 'G05'],
    ]) {
      chunks = 0;
      expectRefusal(
        await runCli(argv, false, zeros),
        argv,
        /standard input is not a text file \(a NUL byte at byte 1\)/,
      );
      expect(chunks).toBe(1);
    }
  });

  it('the built binary refuses `tauline stability --phase - < /dev/zero` with exit 2 (real standard input)', () => {
    if (!existsSync(join(ROOT, 'packages/cli/dist/main.js'))) throw new Error('build first: npm run build');
    const zero = openSync('/dev/zero', 'r');
    try {
      const r = spawnSync(process.execPath, [BIN, 'stability', '--phase', '-', '--tau0', '1'], {
        stdio: [zero, 'pipe', 'pipe'],
        encoding: 'utf8',
        timeout: 15_000,
      });
      expect(r.status).toBe(2);
      expect(r.stderr).toBe(
        'tauline stability: standard input is not a text file (a NUL byte at byte 1); expected a phase record (text, one or two columns)\n',
      );
    } finally {
      closeSync(zero);
    }
  }, 20_000);
});

describe('- reads standard input wherever a file is read', () => {
  it('stability, clock, broadcast, precise, plan, simulate and review give the same output from - as from the file', async () => {
    const cases: [string[], string][] = [
      [['stability', '--phase', F, '--tau0', '1', '--json'], NBS14],
      [
        ['clock', '--rinex-clock', F, '--clock', 'G37', '--tau0', '300', '--json'],
        join(ROOT, 'test/fixtures/rinex-clock/long-304.clk'),
      ],
      [['broadcast', F, ...WINDOW, '--satellite', 'G05', '--json'], NAV],
      [['precise', F, '--json'], SP3],
      [['plan', F, '--json'], ORIN],
      [['simulate', F, '--runs', '5', '--json'], ORIN],
      [['review', F, '--runs', '200', '--json'], REVIEW],
    ];
    for (const [argv, file] of cases) {
      const fromFile = await runCli(withFile(argv, file));
      const fromStdin = await runCli(withFile(argv, '-'), false, readFileSync(file, 'utf8'));
      expect(fromStdin.status, argv[0]).toBe(fromFile.status);
      // The output names the input as given (the path, or - / stdin); everything else is identical.
      const same = (text: string) =>
        text.replaceAll(file, '<input>').replaceAll('"-"', '"<input>"').replaceAll('stdin', '<input>');
      expect(same(fromStdin.out), argv[0]).toBe(same(fromFile.out));
      expect(fromStdin.out.length, argv[0]).toBeGreaterThan(100);
    }
  }, 20_000);

  it('- given twice (broadcast files, precise SP3 and --nav) is refused: standard input can be read once', async () => {
    expectRefusal(
      await runCli(['broadcast', '-', '-', ...WINDOW], false, ''),
      ['broadcast - -'],
      /standard input\) can be read once only/,
    );
    expectRefusal(
      await runCli(['precise', '-', '--nav', '-'], false, ''),
      ['precise - --nav -'],
      /standard input\) can be read once only/,
    );
  });

  it('a parse error in standard input names "stdin" with the line', async () => {
    const r = await runCli(['stability', '--phase', '-', '--tau0', '1'], false, '1e-9\n2e-9\nabc\n');
    expectRefusal(r, ['stability --phase -'], /^tauline stability: parse-error: stdin:3:1: expected phase in seconds/);
  });

  it('the help of each flag or argument that reads a record says - reads standard input', async () => {
    // Help text is wrapped to the terminal width: compare with runs of white space as one space.
    const help = async (name: string) => (await runCli([name, '--help'])).out.replace(/\s+/g, ' ');
    expect(await help('stability')).toMatch(/--phase <file>.*- reads standard input/);
    expect(await help('clock')).toMatch(/--rinex-clock <file>.*- reads standard input/);
    for (const name of ['review', 'plan', 'simulate', 'broadcast', 'precise', 'stability', 'clock']) {
      expect(await help(name), name).toContain('Input files: - reads standard input');
    }
    expect((await runCli(['rate', '--help'])).out).not.toContain('Input files');
  });
});

describe('--output failures and exit status 3', () => {
  it('tauline review --output to a missing folder or a directory says "cannot write …" with the reason and exits 2', async () => {
    const missing = join(tmp, 'no-such-folder', 'report.md');
    expectRefusal(
      await runCli(['review', REVIEW, '--runs', '200', '--output', missing]),
      ['review --output missing'],
      new RegExp(
        `^tauline review: cannot write "${missing.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&')}": no such file\\n$`,
      ),
    );
    expectRefusal(
      await runCli(['review', REVIEW, '--runs', '200', '--output', tmp]),
      ['review --output dir'],
      /cannot write "[^"]+": it is a directory, not a file/,
    );
  });

  it('describeFailure(OutputError or a failed write) is exit 2 saying "cannot write", never the internal-error status 3', () => {
    expect(describeFailure(new OutputError('/x', 'read-only file system'))).toEqual({
      line: 'cannot write "/x": read-only file system',
      status: 2,
    });
    const full = Object.assign(new Error('ENOSPC: no space left on device, write'), {
      code: 'ENOSPC',
      syscall: 'write',
    });
    expect(describeFailure(full)).toEqual({
      line: 'cannot write standard output: no space left on the device',
      status: 2,
    });
  });

  it('the built binary with standard output on a full device (/dev/full) prints one line and exits 2, no stack trace', () => {
    if (!existsSync(join(ROOT, 'packages/cli/dist/main.js'))) throw new Error('build first: npm run build');
    const full = openSync('/dev/full', 'w');
    try {
      const r = spawnSync(process.execPath, [BIN, 'rate', '--semi-major-axis', '26561750'], {
        stdio: ['ignore', full, 'pipe'],
        encoding: 'utf8',
        timeout: 15_000,
      });
      expect(r.status).toBe(2);
      expect(r.stderr).toBe('tauline: cannot write standard output: no space left on the device\n');
    } finally {
      closeSync(full);
    }
  }, 20_000);
});

describe('control characters in ids are escaped in terminal and Markdown output', () => {
  const hostile = join(tmp, 'hostile.review.json');
  const doc = JSON.parse(readFileSync(REVIEW, 'utf8')) as { title: string; spacecraft: { id: string }[] };
  doc.title = 'Title\u001b]0;owned\u0007';
  doc.spacecraft[0]!.id = 'KES\u001b[2J\rTREL|\n# injected\u202e';
  writeFileSync(hostile, JSON.stringify(doc));
  const raw = /[\u0000-\u0009\u000b-\u001f\u007f-\u009f\u202e]/;

  it('escapeControlCharacters(text) shows C0, DEL, C1 and bidirectional controls as visible escapes and keeps what it is told to keep', () => {
    expect(escapeControlCharacters('a\u001b[31mb\u007f\u0085\u202e\n')).toBe('a\\x1B[31mb\\x7F\\x85\\u202E\\x0A');
    expect(escapeControlCharacters('x\ny\tz', '\n')).toBe('x\ny\\x09z');
  });

  it('tauline review (table and md) prints a hostile spacecraft id and title escaped: no raw control character, no injected line', async () => {
    for (const format of ['table', 'md']) {
      const r = await runCli(['review', hostile, '--runs', '200', '--format', format]);
      expect(r.status, format).toBe(0); // the example passes every check; only its texts are hostile
      expect(r.out, format).not.toMatch(raw);
      expect(r.out, format).toContain('KES\\x1B[2J\\x0DTREL');
      expect(r.out, format).not.toMatch(/^# injected/m);
    }
    const md = (await runCli(['review', hostile, '--runs', '200', '--format', 'md'])).out;
    expect(md).toContain('| KES\\x1B[2J\\x0DTREL\\|\\x0A# injected\\u202E |');
    expect(md.split('\n')[0]).toBe('# Title\\x1B]0;owned\\x07');
  });

  it('a clock name with control characters is echoed escaped in the error line', async () => {
    const r = await runCli(['clock', '--rinex-clock', CLK, '--clock', 'G\u001b[2J05']);
    expectRefusal(r, ['clock --clock hostile'], /G\\u001b\[2J05|G\\x1B\[2J05/);
    expect(r.err).not.toMatch(raw);
  });
});
