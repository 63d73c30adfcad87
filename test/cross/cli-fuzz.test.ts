/**
 * Seeded fuzzing of the file-reading commands end to end (in-process, so it lives here rather than in
 * packages/cli/test, whose type-check root cannot include the SDK test harness): mutants of the real fixtures
 * must end in exit 0, 1 or 2 — never exit 3 ("internal error"), which is kept for bugs in tauline.
 * Guarantee from issue 11 and the CLI rules of DEVELOPERS.md (common practice, no source).
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../packages/cli/test/run.js';
import { fixturesMatching, MUTATORS, Random } from '../../packages/sdk/test/io/fuzz/harness.js';

const tmp = mkdtempSync(join(tmpdir(), 'tauline-cli-fuzz-'));
const WINDOW = ['--from', '2024-01-07T00:00:00', '--to', '2024-01-07T02:00:00', '--step', '3600'];
const F = '<file>';

const CASES: { fixtures: RegExp; argv: string[] }[] = [
  { fixtures: /^(nbs14-phase|phase-two-column)\.txt$/, argv: ['stability', '--phase', F, '--tau0', '1', '--json'] },
  {
    fixtures: /^(nbs14-phase|phase-two-column)\.txt$/,
    argv: ['clock', '--phase', F, '--epoch', '2027-02-08T06:00:00', '--tau0', '1', '--json'],
  },
  { fixtures: /^(fictional-304|long-304)\.clk$/, argv: ['stability', '--rinex-clock', F, '--clock', 'G05', '--json'] },
  { fixtures: /\.rnx$/, argv: ['broadcast', F, ...WINDOW, '--json'] },
  { fixtures: /\.sp3$/, argv: ['precise', F, '--json'] },
  { fixtures: /\.review\.json$/, argv: ['review', F, '--runs', '100', '--json'] },
  { fixtures: /^(orin-3-meo|halcyr-g1-geo)\.json$/, argv: ['plan', F, '--json'] },
];
const RUNS_PER_CASE = 60;
const NAMES = Object.keys(MUTATORS);

describe('file-reading commands under seeded fuzzing (seed 20261203)', () => {
  it(`tauline stability, clock, broadcast, precise, review and plan (${RUNS_PER_CASE} mutants of each fixture kind) never exit 3`, async () => {
    const rng = new Random(20261203);
    const internal: string[] = [];
    for (const c of CASES) {
      const fixtures = fixturesMatching(c.fixtures);
      expect(fixtures.length, String(c.fixtures)).toBeGreaterThan(0);
      for (let run = 0; run < RUNS_PER_CASE; run++) {
        let text = fixtures[run % fixtures.length]!.text;
        const applied: string[] = [];
        for (let k = 0; k < 1 + rng.int(3); k++) {
          const name = rng.pick(NAMES);
          applied.push(name);
          text = MUTATORS[name]!(text, rng);
        }
        const file = join(tmp, `mutant-${run}`);
        writeFileSync(file, text);
        const r = await runCli(c.argv.map((a) => (a === F ? file : a)));
        if (r.status === 3 || ![0, 1, 2].includes(r.status))
          internal.push(`${c.argv[0]} run ${run} (${applied.join(', ')}): ${r.status} ${r.err.trim()}`);
      }
    }
    expect(internal.join('\n')).toBe('');
  }, 60_000);
});
