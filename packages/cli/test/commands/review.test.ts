import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { type CliRun, runCli } from '../run.js';

const examples = fileURLToPath(new URL('../../../sdk/examples/review/', import.meta.url));
const good = join(examples, 'kestrel-block-a.review.json');
const bad = join(examples, 'kestrel-block-b-mistakes.review.json');

const run = (...argv: string[]): Promise<CliRun> => runCli(['review', ...argv]);

describe('tauline review', () => {
  it('exits 0 and prints a table with the caution when every spacecraft passes', async () => {
    const r = await run(good);
    expect(r.status).toBe(0);
    expect(r.out).toMatch(/KESTREL-01\s+PASS/);
    expect(r.out).toContain('3 pass, 0 marginal, 0 fail');
    expect(r.out).toContain('responsible engineering authority');
  });

  it('--format json gives the documented fields and exits 1 on failures', async () => {
    const r = await run(bad, '--format', 'json');
    expect(r.status).toBe(1);
    const report = JSON.parse(r.out);
    const s = report.spacecraft.find((x: { id: string }) => x.id === 'KESTREL-11');
    expect(s.verdict).toBe('fail');
    expect(typeof s.expectedFractionalOffset).toBe('number');
    expect(typeof s.differenceFractional).toBe('number');
    expect(s.diagnosis[0]).toMatchObject({ code: 'sign-flipped' });
    expect(typeof s.diagnosis[0].message).toBe('string');
    expect(typeof s.diagnosis[0].wouldHaveProduced).toBe('number');
  });

  it('--format md and --format html --output write the report', async () => {
    const md = await run(bad, '--format', 'md');
    expect(md.out).toMatch(/^# Kestrel Block B/);
    const dir = mkdtempSync(join(tmpdir(), 'tauline-review-'));
    const file = join(dir, 'review.html');
    const html = await run(bad, '--format', 'html', '--output', file);
    expect(html.status).toBe(1);
    expect(html.out).toBe('');
    expect(html.err).toContain(`wrote ${file}`);
    expect(readFileSync(file, 'utf8')).toMatch(/^<!doctype html>/);
  });

  it('exits 2 naming file, line and column for malformed JSON', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tauline-review-'));
    const file = join(dir, 'broken.json');
    writeFileSync(file, '{\n  "spacecraft": [\n    { "id": "X", }\n  ]\n}\n');
    const r = await run(file);
    expect(r.status).toBe(2);
    expect(r.err).toMatch(/broken\.json:3:\d+: expected valid JSON/);
  });

  it('exits 2 naming the field for invalid content, and for usage errors', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tauline-review-'));
    const file = join(dir, 'km.json');
    writeFileSync(
      file,
      JSON.stringify({
        nominalFrequencyHz: 10.23e6,
        spacecraft: [{ id: 'X', configured: { fractionalOffset: -4.4e-10 }, orbit: { semiMajorAxis: 26561.75 } }],
      }),
    );
    const r = await run(file);
    expect(r.status).toBe(2);
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/spacecraft\[0\]\.orbit\.semiMajorAxis.*did you mean 26561\.75 km/);
    expect((await run()).status).toBe(2);
    expect((await run(good, '--format', 'pdf')).err).toMatch(/--format must be one of/);
    expect((await run(good, '--runs', '5')).err).toMatch(/--runs must be an integer/);
    expect((await run(join(dir, 'missing.json'))).err).toMatch(/no such file/);
  });
});
