import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { type CliRun, runCli } from '../run.js';

const ORIN = fileURLToPath(new URL('../../../sdk/examples/steering/orin-3-meo.json', import.meta.url));
const HALCYR = fileURLToPath(new URL('../../../sdk/examples/steering/halcyr-g1-geo.json', import.meta.url));
const BIN = fileURLToPath(new URL('../../bin/tauline.js', import.meta.url));
/** Test leap-second table in the leap-seconds.list format, invented expiry 2036-06-28 (test/fixtures/time/SOURCE.md). */
const LEAP_LIST = fileURLToPath(new URL('../../../../test/fixtures/time/leap-seconds-test.list', import.meta.url));
const BUILT = existsSync(fileURLToPath(new URL('../../dist/main.js', import.meta.url)));

const run = (...argv: string[]): Promise<CliRun> => runCli(['plan', ...argv]);

function tempFile(name: string, text: string): string {
  const dir = mkdtempSync(join(tmpdir(), 'tauline-plan-'));
  const path = join(dir, name);
  writeFileSync(path, text);
  return path;
}

describe('tauline plan', () => {
  it('tauline plan orin-3-meo.json --json prints the plan fields and exits 0 when feasible', async () => {
    const r = await run(ORIN, '--json');
    expect(r.err).toBe('');
    expect(r.status).toBe(0);
    const plan = JSON.parse(r.out) as Record<string, any>;
    expect(Object.keys(plan).sort()).toEqual([
      'caution',
      'commands',
      'epoch',
      'feasible',
      'metrics',
      'predicted',
      'units',
    ]);
    expect(plan.feasible).toBe(true);
    // The origin of predicted.t is named in the output itself (the scenario epoch, as given there).
    expect(plan.epoch).toBe(JSON.parse(readFileSync(ORIN, 'utf8')).epoch);
    expect(plan.units.epoch).toMatch(/^ISO 8601 UTC/);
    expect(Object.keys(plan.predicted).sort()).toEqual(['steered', 't', 'unsteered']);
    for (const c of plan.commands) {
      expect(Object.keys(c)).toEqual(
        expect.arrayContaining(['uplinkAt', 'executeAt', 'kind', 'actuatorSteps', 'reason']),
      );
    }
  });

  it('tauline plan orin-3-meo.json prints a schedule table with units and the caution', async () => {
    const r = await run(ORIN);
    expect(r.status).toBe(0);
    expect(r.out).toMatch(/uplink \(UTC\)\s+execute \(UTC\)/);
    expect(r.out).toMatch(/Tolerance ±30\.000 ns at 95 % per epoch/);
    expect(r.out).toMatch(/steered mean \(ns\)/);
    expect(r.out).toMatch(/responsible engineering authority/);
  });

  it('tauline plan <scenario> exits 1 and prints the reason when the plan is infeasible', async () => {
    const s = JSON.parse(readFileSync(HALCYR, 'utf8')) as Record<string, any>;
    s.tolerance.phaseSeconds = 1e-8;
    const r = await run(tempFile('tight.json', JSON.stringify(s)));
    expect(r.status).toBe(1);
    expect(r.out.replace(/\s+/g, ' ')).toMatch(
      /Feasible: NO \(smallest per-epoch probability in tolerance [\d.]+ < 0\.99\)\. σ alone exceeds the tolerance after/,
    );
  });

  it('tauline plan --strategy deadband overrides the scenario strategy; an unknown strategy is a usage error', async () => {
    const r = await run(HALCYR, '--strategy', 'deadband');
    expect(r.out).toMatch(/deadband planner/);
    const bad = await run(HALCYR, '--strategy', 'fast');
    expect(bad.status).toBe(2);
    expect(bad.err).toMatch(/--strategy must be one of deadband, optimal, none/);
  });

  it('tauline plan reports bad input as one line naming the field (negative tolerance)', async () => {
    const s = JSON.parse(readFileSync(ORIN, 'utf8')) as Record<string, any>;
    s.tolerance.phaseSeconds = -1e-8;
    const r = await run(tempFile('neg.json', JSON.stringify(s)));
    expect(r.status).toBe(2);
    expect(r.out).toBe('');
    expect(r.err.trimEnd().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/tolerance\.phaseSeconds must be/);
  });

  it('tauline plan reports a JSON syntax error with file, line and column', async () => {
    const path = tempFile('broken.json', '{\n  "epoch": "2027-01-01T00:00:00Z",\n  "horizonSeconds": ,\n}');
    const r = await run(path);
    expect(r.status).toBe(2);
    expect(r.err).toMatch(/broken\.json:3:\d+: expected valid JSON/);
  });

  it('tauline plan without a file, or with a missing file, is a usage error', async () => {
    expect((await run()).status).toBe(2);
    const r = await run('/nonexistent/scenario.json');
    expect(r.status).toBe(2);
    expect(r.err).toMatch(/no such file/);
  });

  it('tauline plan <2031 scenario> exits 2 with one out-of-domain line saying to pass --leap-seconds (bundled table valid until 2027-06-28)', async () => {
    const path = tempFile('orin-2031.json', readFileSync(ORIN, 'utf8').replace(/2027-02-/g, '2031-04-'));
    const r = await run(path);
    expect(r.status).toBe(2);
    expect(r.out).toBe('');
    expect(r.err.trimEnd().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/out-of-domain: epoch = "2031-04-08T00:00:00Z" is outside the valid span .*2027-06-28/);
    expect(r.err).toMatch(/--leap-seconds <file>/);
  });

  it('tauline plan <2031 scenario> --leap-seconds <list> plans with that table and prints 2031 stamps', async () => {
    const path = tempFile('orin-2031.json', readFileSync(ORIN, 'utf8').replace(/2027-02-/g, '2031-04-'));
    const r = await run(path, '--leap-seconds', LEAP_LIST, '--json');
    expect(r.err).toBe('');
    expect(r.status).toBe(0);
    const plan = JSON.parse(r.out) as { commands: { executeAt: string }[] };
    expect(plan.commands.length).toBeGreaterThan(0);
    for (const c of plan.commands) expect(c.executeAt).toMatch(/^2031-04-/);
    expect((await run(ORIN, '--leap-seconds', LEAP_LIST, '--json')).out).toBe((await run(ORIN, '--json')).out);
  });

  it('tauline plan --leap-seconds reports a malformed list with file and line (ParseError), and a missing file', async () => {
    const lines = readFileSync(LEAP_LIST, 'utf8').split('\n');
    const bad = lines.findIndex((l) => l.startsWith('2871676800'));
    lines[bad] = '2871676800  twenty-six  # 1 Jan 1991';
    const path = tempFile('bad.list', lines.join('\n'));
    const r = await run(ORIN, '--leap-seconds', path);
    expect(r.status).toBe(2);
    expect(r.err).toMatch(new RegExp(`parse-error: .*bad\\.list:${bad + 1}:1: expected a data line`));
    const missing = await run(ORIN, '--leap-seconds', '/nonexistent/leap-seconds.list');
    expect(missing.status).toBe(2);
    expect(missing.err).toMatch(/no such file/);
  });

  it('tauline plan --leap-seconds names the flag when the list breaks the table rules (a step of 2 s)', async () => {
    const text = readFileSync(LEAP_LIST, 'utf8').replace('3692217600\t37', '3692217600\t38');
    const r = await run(ORIN, '--leap-seconds', tempFile('jump.list', text));
    expect(r.status).toBe(2);
    expect(r.err).toMatch(
      /invalid input: --leap-seconds must be an IERS\/NIST leap-seconds\.list with a valid table; received ".*jump\.list"\. entries\[27\]\.taiMinusUtc/,
    );
  });

  it.runIf(BUILT)(
    'the built binary `tauline plan <orin-3-meo> --json` prints the same plan as the in-process call',
    async () => {
      const out = execFileSync(process.execPath, [BIN, 'plan', ORIN, '--json'], { encoding: 'utf8' });
      expect(JSON.parse(out)).toEqual(JSON.parse((await run(ORIN, '--json')).out));
    },
  );

  it.runIf(BUILT)('the built binary `tauline plan` exits 1 on an infeasible plan', () => {
    const s = JSON.parse(readFileSync(HALCYR, 'utf8')) as Record<string, any>;
    s.tolerance.phaseSeconds = 1e-8;
    const r = spawnSync(process.execPath, [BIN, 'plan', tempFile('tight.json', JSON.stringify(s))], {
      encoding: 'utf8',
    });
    expect(r.status).toBe(1);
  });
});
