import { describe, expect, it } from 'vitest';
import { main } from '../src/main.js';
import type { Io } from '../src/framework.js';
import { parseNumber, table } from '../src/framework.js';

async function run(...argv: string[]): Promise<{ status: number; out: string; err: string }> {
  let out = '', err = '';
  const io: Io = { out: (t) => { out += t; }, err: (t) => { err += t; }, isTty: false };
  return { status: await main(argv, io), out, err };
}

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
    expect(r.err).toMatch(/unknown command "ratez"; known commands: .*rate/);
  });

  it('a negative number after a string flag is its value, not an option', async () => {
    const r = await run('periodic', '--semi-major-axis', '26561750', '--eccentricity', '0.01', '--mean-anomaly', '-1', '--json');
    expect(r.status).toBe(0);
    const pos = await run('periodic', '--semi-major-axis', '26561750', '--eccentricity', '0.01', '--mean-anomaly', '1', '--json');
    expect(JSON.parse(r.out).correctionSeconds).toBeCloseTo(-JSON.parse(pos.out).correctionSeconds, 20);
  });

  it('a negative eccentricity is a one-line range error, an unknown flag a one-line usage error', async () => {
    const neg = await run('periodic', '--semi-major-axis', '26561750', '--eccentricity', '-0.01', '--mean-anomaly', '1');
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
    for (const bad of ['', 'abc', '1e', '12km', 'NaN', 'Infinity', '0x10', '1e999']) expect(() => parseNumber('--x', bad)).toThrow(/--x/);
  });

  it('table(headers, rows) right-aligns numeric columns', () => {
    expect(table(['name', 'value'], [['a', 1], ['bb', 22]])).toBe('name  value\n────  ─────\na         1\nbb       22\n');
  });
});
