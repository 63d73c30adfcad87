/**
 * Number, unit and time formatting for labels, read-outs and tables. Pure, no DOM.
 * Values come in SI (seconds, hertz, dimensionless); units are chosen for display only.
 *
 * @module
 */

/** Display units for a time offset. */
export type TimeUnit = 's' | 'ms' | 'µs' | 'ns' | 'ps';

const TIME_UNITS: ReadonlyArray<readonly [TimeUnit, number]> = [
  ['s', 1],
  ['ms', 1e-3],
  ['µs', 1e-6],
  ['ns', 1e-9],
  ['ps', 1e-12],
];

/** The unit in which `maxAbsSeconds` reads between 1 and 1000 (ps at the small end). */
export function pickTimeUnit(maxAbsSeconds: number): { unit: TimeUnit; seconds: number } {
  const m = Math.abs(maxAbsSeconds);
  for (const [unit, seconds] of TIME_UNITS) if (m >= seconds) return { unit, seconds };
  return { unit: 'ps', seconds: 1e-12 };
}

/** Parses a `y-unit` attribute value (`auto`, `s`, `ms`, `us`/`µs`, `ns`, `ps`); null for auto or unknown. */
export function parseTimeUnit(text: string | null | undefined): { unit: TimeUnit; seconds: number } | null {
  const t = (text ?? '').trim().replace(/^us$/, 'µs');
  const hit = TIME_UNITS.find(([u]) => u === t);
  return hit ? { unit: hit[0], seconds: hit[1] } : null;
}

/** Typographic minus so negative numbers line up and read clearly. */
function minus(text: string): string {
  return text.replace(/^-/, '−').replace(/e-/, 'e−').replace(/e\+/, 'e');
}

/**
 * Prose from the SDK (command reasons, review summaries and diagnoses) with every number's sign
 * and exponent sign shown as the typographic minus U+2212, as the elements print numbers; hyphens
 * between words or in dates (2027-03-08) are left alone.
 */
export function typographicMinus(text: string): string {
  return text.replace(/(^|[\s(=±Δ:[,;/])-(?=\.?\d)/g, '$1−').replace(/(\d[eE])-(?=\d)/g, '$1−');
}

/** A number with `digits` significant figures, plain notation for 1e-3 ≤ |v| < 1e6, else scientific. */
export function formatNumber(value: number, digits = 4): string {
  if (!Number.isFinite(value)) return '—';
  if (value === 0) return '0';
  const a = Math.abs(value);
  if (a >= 1e-3 && a < 1e6) return minus(String(Number(value.toPrecision(digits))));
  return minus(value.toExponential(Math.max(0, digits - 1)));
}

/** A dimensionless fraction in scientific notation, e.g. `−4.4647e−10`. */
export function formatFraction(value: number, digits = 5): string {
  if (!Number.isFinite(value)) return '—';
  if (value === 0) return '0';
  return minus(value.toExponential(Math.max(0, digits - 1)));
}

/** A time offset in the given unit, with the unit: `12.3 ns`. */
export function formatOffset(seconds: number, unit: { unit: TimeUnit; seconds: number }, digits = 4): string {
  if (!Number.isFinite(seconds)) return '—';
  return `${formatNumber(seconds / unit.seconds, digits)} ${unit.unit}`;
}

/** A time offset in its own best unit: `4.2 µs`. */
export function formatOffsetAuto(seconds: number, digits = 4): string {
  return formatOffset(seconds, pickTimeUnit(seconds), digits);
}

/** A frequency in hertz scaled to mHz/µHz/kHz... for display: `−4.567 mHz`. */
export function formatHertz(hz: number, digits = 4): string {
  if (!Number.isFinite(hz)) return '—';
  const a = Math.abs(hz);
  const units: Array<[string, number]> = [
    ['GHz', 1e9],
    ['MHz', 1e6],
    ['kHz', 1e3],
    ['Hz', 1],
    ['mHz', 1e-3],
    ['µHz', 1e-6],
    ['nHz', 1e-9],
  ];
  for (const [u, f] of units) if (a >= f) return `${formatNumber(hz / f, digits)} ${u}`;
  return `${formatNumber(hz / 1e-9, digits)} nHz`;
}

/** A duration in seconds as `2 h`, `45 min`, `3.5 d`, `120 s` (for τ labels). */
export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds)) return '—';
  const a = Math.abs(seconds);
  if (a >= 86400) return `${formatNumber(seconds / 86400, 3)} d`;
  if (a >= 3600) return `${formatNumber(seconds / 3600, 3)} h`;
  if (a >= 60) return `${formatNumber(seconds / 60, 3)} min`;
  return `${formatNumber(seconds, 3)} s`;
}
