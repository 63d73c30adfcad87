import { InvalidArgumentError } from '@tauline/sdk/errors';
import { describe, expect, it } from 'vitest';
import {
  choiceFlag,
  formatFlags,
  JSON_INSTEAD_OF_TABLE,
  onePositional,
  type ParsedArgs,
  parseNumber,
  progressBar,
  seedFlagSpec,
  table,
  withFlagNames,
} from '../src/framework.js';
import { type CliRun, runCli } from './run.js';

const run = (...argv: string[]): Promise<CliRun> => runCli(argv);

describe('the tauline command framework', () => {
  it('main([]) prints the command list and exits 2; --help exits 0; --version prints it', async () => {
    const none = await run();
    expect(none.status).toBe(2);
    expect(none.out).toContain('Commands:');
    expect((await run('--help')).status).toBe(0);
    expect((await run('--version')).out).toMatch(/^\d+\.\d+\.\d+\n$/);
  });

  it('an unknown command exits 2 naming the known ones', async () => {
    const r = await run('ratez');
    expect(r.status).toBe(2);
    expect(r.err).toMatch(/unknown command "ratez"; did you mean rate\? \(known commands: .*rate/);
  });

  it('a negative number after a string flag is its value, not an option', async () => {
    const r = await run(
      'periodic',
      '--semi-major-axis',
      '26561750',
      '--eccentricity',
      '0.01',
      '--mean-anomaly',
      '-1',
      '--json',
    );
    expect(r.status).toBe(0);
    const pos = await run(
      'periodic',
      '--semi-major-axis',
      '26561750',
      '--eccentricity',
      '0.01',
      '--mean-anomaly',
      '1',
      '--json',
    );
    expect(JSON.parse(r.out).correctionSeconds).toBeCloseTo(-JSON.parse(pos.out).correctionSeconds, 20);
  });

  it('a negative eccentricity is a one-line range error, an unknown flag a one-line usage error', async () => {
    const neg = await run(
      'periodic',
      '--semi-major-axis',
      '26561750',
      '--eccentricity',
      '-0.01',
      '--mean-anomaly',
      '1',
    );
    expect(neg.status).toBe(2);
    expect(neg.err.trim().split('\n')).toHaveLength(1);
    expect(neg.err).toMatch(/eccentricity/);
    const unknown = await run('rate', '--semi-major', '1');
    expect(unknown.status).toBe(2);
    expect(unknown.err.trim().split('\n')).toHaveLength(1);
  });

  it('parseNumber(field, text) accepts decimal and exponent forms only', () => {
    expect(parseNumber('--x', '2.656175e7')).toBe(26_561_750);
    expect(parseNumber('--x', '-.5')).toBe(-0.5);
    for (const bad of ['', 'abc', '1e', '12km', 'NaN', 'Infinity', '0x10', '1e999'])
      expect(() => parseNumber('--x', bad)).toThrow(/--x/);
  });

  it('table(headers, rows) right-aligns numeric columns', () => {
    expect(
      table(
        ['name', 'value'],
        [
          ['a', 1],
          ['bb', 22],
        ],
      ),
    ).toBe('name  value\n────  ─────\na         1\nbb       22\n');
  });

  it('table(headers, rows) sizes a column of 200 000 rows without overflowing the call stack', () => {
    const rows = Array.from({ length: 200_000 }, (_, i) => [`r${i}`, i]);
    const lines = table(['name', 'value'], rows).split('\n');
    expect(lines).toHaveLength(200_003);
    expect(lines[0]).toBe('name      value');
    expect(lines[200_001]).toBe('r199999  199999');
  });

  it('formatFlags(formats, shorthands) lists the shorthands, then --format naming every format', () => {
    const flags = formatFlags(['table', 'json', 'csv'], { json: 'JSON.', csv: 'CSV.' });
    expect(Object.keys(flags)).toEqual(['json', 'csv', 'format']);
    expect(flags.csv).toEqual({ type: 'boolean', description: 'CSV.' });
    expect(flags.format).toEqual({
      type: 'string',
      value: 'table|json|csv',
      description: 'Output format: table, json, csv (default table).',
    });
    expect(formatFlags(['table', 'json']).json!.description).toBe(JSON_INSTEAD_OF_TABLE);
  });

  it('seedFlagSpec(of, purpose) states the 32-bit seed range', () => {
    expect(seedFlagSpec('the random generator', '; same seed, same numbers').description).toBe(
      'Seed of the random generator, 0 … 4294967295 (default 1); same seed, same numbers.',
    );
  });

  it('onePositional(args, what) returns the one file and refuses none or two', () => {
    const args = (positionals: string[]): ParsedArgs => ({
      values: {},
      positionals,
      command: { name: 'plan', summary: '', usage: '', flags: {}, run: () => 0 },
    });
    expect(onePositional(args(['a.json']), 'scenario file')).toBe('a.json');
    expect(() => onePositional(args([]), 'scenario file')).toThrow(
      'give exactly one scenario file (see `tauline plan --help`)',
    );
    expect(() => onePositional(args(['a', 'b']), 'scenario file')).toThrow(/give exactly one scenario file/);
  });

  it('choiceFlag(args, flag, choices, fallback) reads a choice case-insensitively, falls back when absent, and names flag, text and choices otherwise', () => {
    const args = (values: ParsedArgs['values']): ParsedArgs => ({ values, positionals: [] });
    expect(choiceFlag(args({ reference: 'TCG' }), 'reference', ['tt', 'tcg'], 'tt')).toBe('tcg');
    expect(choiceFlag(args({}), 'reference', ['tt', 'tcg'], 'tt')).toBe('tt');
    expect(() => choiceFlag(args({ reference: 'TAI' }), 'reference', ['tt', 'tcg'], 'tt')).toThrow(
      /^--reference must be one of tt, tcg; received "TAI"/,
    );
  });

  it('withFlagNames(names, body) renames an InvalidArgumentError by a map or a function and passes other errors through', () => {
    const fail = (argument: string) => (): never => {
      throw new InvalidArgumentError(argument, 5, 'at most 4', 'a hint');
    };
    expect(() => withFlagNames({ semiMajorAxis: '--semi-major-axis' }, fail('semiMajorAxis'))).toThrow(
      /^--semi-major-axis must be at most 4; received 5/,
    );
    expect(() => withFlagNames({ semiMajorAxis: '--semi-major-axis' }, fail('toString'))).toThrow(/^toString must be/);
    expect(() => withFlagNames((a) => (a === 'data.tau0' ? '--tau0' : undefined), fail('data.tau0'))).toThrow(
      /^--tau0 must be/,
    );
    expect(() => withFlagNames(() => undefined, fail('x'))).toThrow(/^x must be/);
    expect(() =>
      withFlagNames({}, () => {
        throw new RangeError('other');
      }),
    ).toThrow(RangeError);
    expect(withFlagNames({}, () => 7)).toBe(7);
  });

  it('progressBar(io, label) redraws only when the whole percentage changes and clears its line on finish', () => {
    const lines: string[] = [];
    const bar = progressBar(
      {
        out: () => {},
        err: (t) => {
          lines.push(t);
        },
        isTty: true,
      },
      'x',
    );
    bar.update(1, 200);
    bar.update(2, 200);
    bar.update(200, 200);
    bar.finish();
    expect(lines).toEqual([
      '\rx [.........................]   0 %',
      '\rx [.........................]   1 %',
      '\rx [#########################] 100 %',
      `\r${' '.repeat(36)}\r`,
    ]);
  });
});
