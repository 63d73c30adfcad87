/**
 * Terminal layout for `tauline` tables and prose: display width (wide and combining characters
 * counted properly), word wrapping, and tables that fit {@link TABLE_WIDTH} columns by wrapping their
 * headers and moving long columns under their row. `--wide` (every command) keeps the long form.
 */
import type { ParsedArgs } from './framework.js';
import { escapeControlCharacters } from './text-safety.js';

/** Columns every default table and paragraph fits in. */
export const TABLE_WIDTH = 100;

/**
 * Code-point ranges drawn two columns wide in a terminal: East Asian Wide and Fullwidth characters of the
 * CJK, Hangul, kana and fullwidth-forms blocks (Unicode Standard Annex #11, East Asian Width, classes W
 * and F; from memory [M]). Emoji with default emoji presentation are wide as well (see {@link displayWidth}).
 */
const WIDE: readonly (readonly [number, number])[] = [
  [0x1100, 0x115f],
  [0x2e80, 0x303e],
  [0x3041, 0x33ff],
  [0x3400, 0x4dbf],
  [0x4e00, 0x9fff],
  [0xa000, 0xa4cf],
  [0xa960, 0xa97f],
  [0xac00, 0xd7a3],
  [0xf900, 0xfaff],
  [0xfe10, 0xfe19],
  [0xfe30, 0xfe6f],
  [0xff00, 0xff60],
  [0xffe0, 0xffe6],
  [0x16fe0, 0x16fe4],
  [0x17000, 0x18aff],
  [0x1b000, 0x1b2ff],
  [0x20000, 0x2fffd],
  [0x30000, 0x3fffd],
];

/** Emoji drawn as pictures by default (Unicode property Emoji_Presentation), two columns wide (UAX #11 since Unicode 9 [M]). */
const EMOJI_PRESENTATION = /\p{Emoji_Presentation}/u;

/** Zero-width code points: combining marks, zero-width joiners/spaces, variation selectors (Unicode general categories Mn/Me/Cf [M]). */
const ZERO_WIDTH =
  /[\u0300-\u036f\u0483-\u0489\u0591-\u05bd\u0610-\u061a\u064b-\u065f\u0e31\u0e34-\u0e3a\u1ab0-\u1aff\u1dc0-\u1dff\u200b-\u200f\u2028-\u202e\u2060-\u2064\u20d0-\u20ff\ufe00-\ufe0f\ufe20-\ufe2f\ufeff]/u;

function isWide(codePoint: number): boolean {
  let lo = 0;
  let hi = WIDE.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const range = WIDE[mid];
    if (range === undefined) throw new RangeError(`WIDE[${mid}] is outside its ${WIDE.length} ranges`);
    const [a, b] = range;
    if (codePoint < a) hi = mid - 1;
    else if (codePoint > b) lo = mid + 1;
    else return true;
  }
  return false;
}

/** Columns `text` takes in a terminal: wide characters count 2, combining and zero-width ones 0, others 1. */
export function displayWidth(text: string): number {
  if (/^[\x20-\x7e]*$/.test(text)) return text.length; // printable ASCII: one column each
  let width = 0;
  for (const ch of text) {
    const cp = ch.codePointAt(0) ?? 0; // ch is one whole code point here
    if (cp < 0x20 || (cp >= 0x7f && cp < 0xa0) || ZERO_WIDTH.test(ch)) continue;
    width += isWide(cp) || EMOJI_PRESENTATION.test(ch) ? 2 : 1;
  }
  return width;
}

/**
 * Word-wraps one paragraph to `width` display columns (unlimited when undefined). Continuation lines
 * start with `indent`; a word longer than a line stays whole on its own line (never cut).
 */
export function wrapText(text: string, width: number | undefined, indent = ''): string[] {
  if (width === undefined || displayWidth(text) <= width) return [text];
  // Break only at spaces, keeping the spacing inside a line as written (aligned key/value pairs stay aligned).
  const parts = text.split(/( +)/);
  const lines: string[] = [];
  let line = parts[0] ?? '';
  let lineHasWord = line.trim() !== '';
  for (let k = 1; k < parts.length; k += 2) {
    const gap = parts[k] ?? '';
    const word = parts[k + 1] ?? '';
    if (word === '') continue;
    if (lineHasWord && displayWidth(line + gap + word) > width) {
      lines.push(line);
      line = indent + word;
    } else line += gap + word;
    lineHasWord = true;
  }
  lines.push(line);
  return lines;
}

/**
 * Wraps every line of `text` to `width` (unlimited when undefined); keeps a trailing newline. A line's
 * continuation is indented like the line plus two columns (none for an unindented line).
 */
export function wrapLines(text: string, width: number | undefined): string {
  if (width === undefined) return text;
  return text
    .split('\n')
    .map((l) => {
      const lead = /^ */.exec(l)?.[0] ?? '';
      return wrapText(l, width, lead === '' ? '' : `${lead}  `).join('\n');
    })
    .join('\n');
}

/** An `out` that wraps what it is given to `width` (see {@link wrapLines}); tables already fitted pass unchanged. */
export function wrappedOut(out: (text: string) => void, width: number | undefined): (text: string) => void {
  return (text) => out(wrapLines(text, width));
}

/** Whether a cell reads as a number (aligned right): optional sign (ASCII or U+2212), then a digit or a point. */
const NUMERIC = /^[-+\u2212]?[\d.]/;
/** Cells that stand for "no value" and do not decide a column's alignment. */
const NO_VALUE = new Set(['—', '', 'n/a']);

/** How {@link fitTable} lays a table out. */
export interface TableOptions {
  /** Display width to fit (default {@link TABLE_WIDTH}); undefined means no limit (the `--wide` form). */
  width?: number | undefined;
  /**
   * Columns (indices) that may leave the row when the table is too wide even with wrapped headers: they
   * are printed, in this order, on lines under their row as `header: value`, wrapped to the width.
   */
  below?: readonly number[];
  /** Of the `below` columns, those printed without their header (e.g. a reason that reads on its own). */
  unlabelled?: readonly number[];
  /**
   * Last resort when the table is still too wide: the columns after the first `keys` form these groups
   * (each kept whole), and the table is printed as several panels, one under the other, each repeating the
   * first `keys` columns and holding as many groups as fit.
   */
  panels?: { keys: number; groups: readonly (readonly number[])[] };
  /** Text printed under each row (wrapped) whatever the width; undefined or '' for none. */
  notes?: readonly (string | undefined)[];
}

/** One column of a table being fitted. */
interface Column {
  /** Its index in the caller's headers and rows. */
  index: number;
  header: string;
  /** Widest cell, in display columns. */
  dataWidth: number;
  /** Holds numbers only (and empty marks): right-aligned. */
  numeric: boolean;
}

/** A planned layout: the columns kept, each with its header lines. */
interface Plan {
  columns: { column: Column; headerLines: string[] }[];
  /** Display width of the widest possible row. */
  width: number;
}

/** Whether column `i` holds numbers and empty marks ("—") only, at least one number; an empty table counts as numeric. */
function isNumericColumn(cells: readonly (readonly string[])[], i: number): boolean {
  let any = false;
  for (const r of cells) {
    const c = r[i] ?? '';
    if (NO_VALUE.has(c)) continue;
    if (!NUMERIC.test(c)) return false;
    any = true;
  }
  return any || cells.length === 0;
}

/**
 * Renders rows as an aligned text table that fits `options.width`: numbers right-aligned (a column of
 * numbers and "—" counts as numeric), headers wrapped onto several lines when that makes it fit, then the
 * `below` columns moved under their rows (or, with `panels`, the table split). Ends with a newline.
 * Cell widths are measured once; layouts are planned on column widths and only the chosen one is drawn.
 */
export function fitTable(
  headers: readonly string[],
  rows: readonly (readonly (string | number)[])[],
  options: TableOptions = {},
): string {
  const width = 'width' in options ? options.width : TABLE_WIDTH;
  // Control characters from input files are escaped before measuring, so the columns stay aligned.
  const cells = rows.map((r) => r.map((c) => escapeControlCharacters(String(c))));
  const measured = cells.map((texts) => ({ texts, widths: texts.map(displayWidth) }));
  const columns: Column[] = headers.map((header, index) => ({
    index,
    header,
    dataWidth: 0,
    numeric: isNumericColumn(cells, index),
  }));
  // Widest cell of each column, by a loop: spreading a long column into Math.max overflows the call stack (~125 000 rows).
  for (const { widths } of measured) {
    widths.forEach((w, i) => {
      const column = columns[i];
      if (column !== undefined && w > column.dataWidth) column.dataWidth = w;
    });
  }
  const planWidth = (kept: Plan['columns']) =>
    kept.reduce((sum, k) => sum + columnWidth(k.column, k.headerLines), 0) + 2 * Math.max(0, kept.length - 1);
  const pick = (indices: readonly number[]): Column[] => indices.flatMap((i) => columns[i] ?? []);

  // The columns in `keep`, their headers wrapped one at a time (the one overhanging its column most first) until the table fits.
  const plan = (keep: readonly Column[]): Plan => {
    const kept = keep.map((column) => ({ column, headerLines: [column.header] }));
    let w = planWidth(kept);
    if (width === undefined) return { columns: kept, width: w };
    const overhang = kept
      .map((k) => ({
        k,
        short: wrapText(k.column.header, Math.max(k.column.dataWidth, ...k.column.header.split(' ').map(displayWidth))),
      }))
      .map((o) => ({ ...o, saved: displayWidth(o.k.column.header) - Math.max(...o.short.map(displayWidth)) }))
      .filter((o) => o.saved > 0)
      .sort((x, y) => y.saved - x.saved);
    for (const { k, short } of overhang) {
      if (w <= width) break;
      k.headerLines = short;
      w = planWidth(kept);
    }
    return { columns: kept, width: w };
  };

  const draw = (p: Plan, moved: readonly Column[]): string => drawTable(p, moved, measured, width, options);

  const moved: Column[] = [];
  let chosen = plan(columns);
  for (const column of pick(options.below ?? [])) {
    if (width === undefined || chosen.width <= width) break;
    moved.push(column);
    chosen = plan(columns.filter((c) => !moved.includes(c)));
  }
  if (width !== undefined && chosen.width > width && options.panels && moved.length === 0) {
    const { keys, groups } = options.panels;
    const lead = columns.slice(0, keys);
    const panels: Column[][] = [];
    let current: Column[] = [];
    for (const group of groups.map(pick)) {
      if (current.length > 0 && plan([...lead, ...current, ...group]).width > width) {
        panels.push(current);
        current = [];
      }
      current.push(...group);
    }
    if (current.length > 0) panels.push(current);
    // Notes and moved columns are not combined with panels: a table uses one or the other.
    return panels.map((p) => draw(plan([...lead, ...p]), [])).join('\n');
  }
  return draw(chosen, moved);
}

/** A column's width: its widest cell or header line. */
function columnWidth(c: Column, lines: readonly string[]): number {
  return Math.max(c.dataWidth, ...lines.map(displayWidth));
}

/** Draws a planned table: header lines, rule, rows, and under each row its moved columns and note. */
function drawTable(
  p: Plan,
  moved: readonly Column[],
  measured: readonly { texts: readonly string[]; widths: readonly number[] }[],
  width: number | undefined,
  options: TableOptions,
): string {
  const laid = p.columns.map((k) => ({ ...k, width: columnWidth(k.column, k.headerLines) }));
  /** One line: each kept column's text (`known`: its display width when measured already) padded to the column. */
  const fmt = (cell: (l: (typeof laid)[number]) => { text: string; known?: number }) =>
    laid
      .map((l) => {
        const { text, known } = cell(l);
        const fill = ' '.repeat(Math.max(0, l.width - (known ?? displayWidth(text))));
        return l.column.numeric ? fill + text : text + fill;
      })
      .join('  ')
      .trimEnd();
  const out: string[] = [];
  // Multi-line headers sit at the bottom of their block, next to the rule.
  const depth = Math.max(...laid.map((l) => l.headerLines.length));
  for (let k = 0; k < depth; k++)
    out.push(fmt((l) => ({ text: l.headerLines[k - (depth - l.headerLines.length)] ?? '' })));
  out.push(laid.map((l) => '─'.repeat(l.width)).join('  '));
  // Text under a row starts under its second column (at most 8 columns in).
  const indent = ' '.repeat(Math.min(8, (laid[0]?.width ?? 0) + 2));
  measured.forEach(({ texts: r, widths }, k) => {
    out.push(fmt((l) => ({ text: r[l.column.index] ?? '', known: widths[l.column.index] ?? 0 })));
    const under: string[] = [];
    const movedText = moved
      .filter((c) => !NO_VALUE.has(r[c.index] ?? ''))
      .map((c) => (options.unlabelled?.includes(c.index) ? (r[c.index] ?? '') : `${c.header} ${r[c.index]}`))
      .join(', ');
    if (movedText !== '') under.push(movedText);
    const note = options.notes?.[k];
    if (note) under.push(note);
    for (const text of under) out.push(...wrapText(indent + text, width, `${indent}  `));
  });
  return `${out.join('\n')}\n`;
}

/** The display width the table output of a command fits: {@link TABLE_WIDTH}, or none with `--wide`. */
export function outputWidth(args: ParsedArgs): number | undefined {
  return args.values.wide === true ? undefined : TABLE_WIDTH;
}
