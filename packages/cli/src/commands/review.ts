/**
 * `tauline review <file>`: checks the oscillator offsets configured for each spacecraft
 * against their planned orbits, before launch.
 */
import { type ReviewReport, reviewOffsets } from '@tauline/sdk/review';
import { readJsonFile, sourceLabel } from '../files.js';
import {
  type Command,
  EXIT_FINDING,
  EXIT_OK,
  escapeControlCharacters,
  formatFlag,
  formatFlagSpec,
  integerFlag,
  onePositional,
  optionalFlag,
  seedFlag,
  seedFlagSpec,
  toJson,
  writeOutputFile,
} from '../framework.js';
import { fitTable, outputWidth, wrapLines } from '../layout.js';
import { startProgress } from '../progress.js';
import { reviewToHtml, reviewToMarkdown, verdictExplanation } from '../render/review.js';

/** Monte Carlo draws (runs × spacecraft with a dispersion) above which a terminal shows progress. */
export const REVIEW_PROGRESS_DRAWS = 1_000_000;

const FORMATS = ['table', 'json', 'md', 'html'] as const;

function e(x: number, digits = 4): string {
  return x.toExponential(digits - 1);
}

/** The review as text fitted to `width` display columns (undefined: unlimited, `--wide`). */
function tableReport(report: ReviewReport, width: number | undefined): string {
  // Titles, ids and messages come from the review file: one line each, control characters shown escaped.
  const text = (t: string) => escapeControlCharacters(t);
  const out: string[] = [text(report.title), ''];
  out.push(
    fitTable(
      ['spacecraft', 'verdict', 'expected offset', 'configured', 'difference', 'ns/day', 'tolerance'],
      report.spacecraft.map((s) => [
        s.id,
        s.verdict.toUpperCase(),
        e(s.expectedFractionalOffset, 7),
        e(s.configuredFractionalOffset, 7),
        e(s.differenceFractional, 3),
        s.differenceNanosecondsPerDay.toFixed(3),
        e(s.toleranceFractional, 2),
      ]),
      { width },
    ).trimEnd(),
  );
  for (const s of report.spacecraft) {
    // A spacecraft that is not a plain pass is always explained, even when no known mistake matches.
    if (s.diagnosis.length === 0 && !s.dispersion && s.verdict === 'pass') continue;
    out.push('', `${text(s.id)} (${s.verdict.toUpperCase()}): ${text(s.summary)}`);
    const why = verdictExplanation(s);
    if (why) out.push(`  · ${text(why)}`);
    for (const d of s.diagnosis) out.push(`  ${d.matches ? '•' : '·'} [${d.code}] ${text(d.message)}`);
    if (s.dispersion) {
      const d = s.dispersion;
      out.push(
        `  dispersion σa = ${d.semiMajorAxisSigma} m: residual rate ${e(d.residualAtMinus3Sigma, 3)} (−3σ) .. ${e(d.residualAtPlus3Sigma, 3)} (+3σ)` +
          (d.daysToPhaseToleranceWorst === null
            ? ''
            : `; unsteered out of ±${d.phaseToleranceSeconds} s after ${d.daysToPhaseToleranceWorst.toFixed(2)} days`) +
          (d.actuatorCovers === null
            ? ''
            : d.actuatorCovers
              ? '; steering range covers it'
              : '; steering range does NOT cover it'),
      );
    }
  }
  out.push(
    '',
    `${report.counts.pass} pass, ${report.counts.marginal} marginal, ${report.counts.fail} fail`,
    '',
    report.caution,
    '',
  );
  return wrapLines(out.join('\n'), width);
}

export const reviewCommand: Command = {
  name: 'review',
  summary: 'Check configured oscillator offsets against planned orbits (launch review).',
  usage: '<review.json> [--format table|json|md|html | --json] [--output <file>] [--runs <n>] [--seed <n>]',
  allowPositionals: true,
  flags: {
    format: {
      ...formatFlagSpec(FORMATS),
      description: 'Output format: table (default), json, md or html (html is one self-contained page).',
    },
    json: { type: 'boolean', description: 'Same as --format json.' },
    output: {
      type: 'string',
      value: '<file>',
      description: 'Write the report to this file instead of standard output.',
    },
    runs: {
      type: 'string',
      value: '<n>',
      description: 'Monte Carlo draws over the injection dispersion, 100 … 10000000 (default 20000).',
    },
    seed: seedFlagSpec('the Monte Carlo', ', for reproducible reports'),
  },
  details: `
Expected factory offset: 1/(1 + r) − 1 with r = L_G − 3GM/(2ac²) against TT (or −3GM/(2ac²) against TCG),
IERS Conventions (2010) eq. 10.9 averaged over a Kepler orbit; N. Ashby, Living Rev. Relativity 6 (2003) §5.
Recognised mistakes: sign-flipped, kilometres-for-metres, metres-for-kilometres, wrong-gm-set, tcg-reference,
other-orbit, copied-from-spacecraft, gravitational-term-only, velocity-term-only, quantisation, actuator-range.
The input format is described by packages/sdk/schema/review.schema.json.
Exit status: 0 all pass, 1 some fail or marginal, 2 the input could not be read.`,
  async run(args, io) {
    const path = onePositional(args, 'review file');
    const format = formatFlag(args, FORMATS, 'table');
    const runs = integerFlag(args, 'runs', 100, 10_000_000, 'Monte Carlo draws');
    const seed = seedFlag(args);
    const document = await readJsonFile(path, 'a review file');
    let report: ReviewReport;
    const dispersed = Array.isArray((document as { spacecraft?: unknown }).spacecraft)
      ? (document as { spacecraft: unknown[] }).spacecraft.filter(
          (sc) => typeof sc === 'object' && sc !== null && 'dispersion' in sc,
        ).length
      : 0;
    const bar = startProgress(
      io,
      'Monte Carlo over the injection dispersion',
      (runs ?? 20_000) * dispersed > REVIEW_PROGRESS_DRAWS,
    );
    try {
      report = reviewOffsets(document, {
        ...(runs !== undefined ? { monteCarloRuns: runs } : {}),
        ...(seed !== undefined ? { seed } : {}),
        onProgress: bar.update,
      });
    } catch (error) {
      if (error instanceof Error) error.message = `${sourceLabel(path)}: ${error.message}`;
      throw error;
    } finally {
      bar.finish();
    }
    const actuatorRanges: Record<string, number> = {};
    const doc = document as {
      actuator?: { rangeFractional?: number };
      spacecraft: { id: string; actuator?: { rangeFractional?: number } }[];
    };
    for (const sc of doc.spacecraft) {
      const range = sc.actuator?.rangeFractional ?? doc.actuator?.rangeFractional;
      if (typeof range === 'number') actuatorRanges[sc.id] = range;
    }
    const text =
      format === 'json'
        ? toJson(report)
        : format === 'md'
          ? reviewToMarkdown(report)
          : format === 'html'
            ? reviewToHtml(report, actuatorRanges)
            : tableReport(report, outputWidth(args));
    const output = optionalFlag(args, 'output');
    if (output !== undefined) {
      await writeOutputFile(output, text);
      io.err(
        `wrote ${output} (${report.counts.pass} pass, ${report.counts.marginal} marginal, ${report.counts.fail} fail)\n`,
      );
    } else io.out(text);
    return report.counts.fail + report.counts.marginal > 0 ? EXIT_FINDING : EXIT_OK;
  },
};
