/**
 * The event form of the phase-text reader (`readPhaseText`) against the whole-series forms (`parsePhaseText`,
 * `readPhaseTextSeries`): the same samples, gaps and τ0, and the same errors at the same lines. The format is
 * the project's own plain-text record (common practice, no source); the fixtures are invented records.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ParseError } from '../../src/errors.js';
import {
  type PhaseTextEvent,
  type PhaseTextOptions,
  type PhaseTextSeries,
  parsePhaseText,
  readPhaseText,
  readPhaseTextSeries,
} from '../../src/io/index.js';

const fixture = (name: string) =>
  readFileSync(new URL(`../../../../test/fixtures/stability/${name}`, import.meta.url), 'utf8');

async function* chunksOf(text: string, size: number): AsyncGenerator<string> {
  for (let i = 0; i < text.length; i += size) yield text.slice(i, i + size);
}

async function eventsOf(source: string | AsyncIterable<string>, options?: PhaseTextOptions): Promise<PhaseTextEvent[]> {
  const out: PhaseTextEvent[] = [];
  for await (const e of readPhaseText(source, options)) out.push(e);
  return out;
}

/** The regularised series rebuilt from the events alone: each sample at (time − first time)/τ0 on the grid, NaN elsewhere. */
function seriesFromEvents(events: readonly PhaseTextEvent[]): { phase: number[]; gaps: unknown[]; tau0: unknown } {
  const samples = events.flatMap((e) => (e.kind === 'sample' ? [e.sample] : []));
  const gaps = events.flatMap((e) => (e.kind === 'gap' ? [e.gap] : []));
  const end = events.at(-1);
  if (end?.kind !== 'end') throw new Error('no end event');
  const t0 = samples[0]?.time;
  const phase: number[] = [];
  for (const [k, s] of samples.entries()) {
    const index =
      s.time === undefined || t0 === undefined || end.tau0 === undefined ? k : Math.round((s.time - t0) / end.tau0);
    while (phase.length < index) phase.push(Number.NaN);
    phase.push(s.phase);
  }
  return { phase, gaps, tau0: end.tau0 };
}

function expectSameSeries(events: readonly PhaseTextEvent[], series: PhaseTextSeries): void {
  const rebuilt = seriesFromEvents(events);
  expect(rebuilt.phase.map(String)).toEqual([...series.phase].map(String));
  expect(rebuilt.gaps).toEqual(series.gaps);
  expect(rebuilt.tau0).toBe(series.tau0);
  const header = events[0];
  expect(header?.kind === 'header' ? header.header : undefined).toEqual({
    sourceName: series.sourceName,
    columns: series.columns,
    names: series.header,
  });
}

describe('readPhaseText (event form of the phase-text reader)', () => {
  it('readPhaseText(two columns with a skipped run) yields header, one sample per line, the gap and end, matching parsePhaseText', async () => {
    const text = fixture('phase-two-column.txt');
    const events = await eventsOf(text, { sourceName: 'phase-two-column.txt' });
    expect(events.map((e) => e.kind)).toEqual(['header', ...Array(10).fill('sample'), 'gap', 'end']);
    const first = events[1];
    expect(first?.kind === 'sample' ? first.sample : undefined).toEqual({ time: 0, phase: 0, line: 3 });
    expect(events.at(-1)).toEqual({ kind: 'end', tau0: 30, missing: 2 });
    expectSameSeries(events, parsePhaseText(text, { sourceName: 'phase-two-column.txt' }));
  });

  it('readPhaseText(one column, explicit NaN markers, chunks of any size) gives the same series as parsePhaseText and readPhaseTextSeries', async () => {
    const text = '# one column\nphase\n1e-9\nNaN\nnan\n4e-9\n\n5e-9 # trailing comment\n';
    const whole = parsePhaseText(text, { tau0: 2 });
    for (const size of [1, 3, 7, 1000]) {
      const events = await eventsOf(chunksOf(text, size), { tau0: 2 });
      expectSameSeries(events, whole);
      const collected = await readPhaseTextSeries(chunksOf(text, size), { tau0: 2 });
      expect([...collected.phase].map(String)).toEqual([...whole.phase].map(String));
      expect(collected.gaps).toEqual(whole.gaps);
    }
  });

  it('readPhaseText(two columns with a missing epoch and an explicit NaN, given tau0) lists both gaps as parsePhaseText does', async () => {
    const text = '0 1e-9\n10 2e-9\n30 NaN\n40 4e-9\n';
    const events = await eventsOf(text, { tau0: 10 });
    expectSameSeries(events, parsePhaseText(text, { tau0: 10 }));
    expect(events.filter((e) => e.kind === 'gap')).toEqual([
      { kind: 'gap', gap: { index: 2, missing: 1, line: 3, time: 20 } },
      { kind: 'gap', gap: { index: 3, missing: 1, line: 3, time: 30 } },
    ]);
  });

  it('readPhaseText throws the ParseError of parsePhaseText (same line and column) after the events of the lines read so far', async () => {
    const cases = ['1\n2\n3x\n', '0 1\n1\n', '0 1\n10 2\n10 3\n', '0 1\n10 2\n25 3\n', '# only a comment\n'];
    for (const text of cases) {
      let expected: ParseError | undefined;
      try {
        parsePhaseText(text, { sourceName: 'bad.txt' });
      } catch (e) {
        expected = e as ParseError;
      }
      expect(expected).toBeInstanceOf(ParseError);
      const seen: PhaseTextEvent[] = [];
      let thrown: unknown;
      try {
        for await (const e of readPhaseText(chunksOf(text, 2), { sourceName: 'bad.txt' })) seen.push(e);
      } catch (e) {
        thrown = e;
      }
      expect(thrown).toBeInstanceOf(ParseError);
      const err = thrown as ParseError;
      expect([err.sourceName, err.line, err.column, err.message]).toEqual([
        expected?.sourceName,
        expected?.line,
        expected?.column,
        expected?.message,
      ]);
      // A malformed line throws before its sample; a step that is no multiple of τ0 only once τ0 is known (at the end).
      for (const e of seen) if (e.kind === 'sample') expect(e.sample.line).toBeLessThanOrEqual(err.line);
      expect(seen.some((e) => e.kind === 'end')).toBe(false);
    }
  });
});
