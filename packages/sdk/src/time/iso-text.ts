/**
 * ISO 8601 extended date-time text: the syntax scan of `TimeScales.parseIso` (ranges are checked
 * afterwards, against the calendar and the leap-second table) and the scale-name check.
 *
 * @internal
 */
import { InvalidArgumentError } from '../errors.js';
import { TIME_SCALES, type TimeScale } from './uniform.js';

/** The accepted text form, quoted in error messages. */
export const ISO_FORM = 'YYYY-MM-DDThh:mm:ss[.fff…] followed by Z or ±hh:mm (UTC), or no designator (other scales)';

/** Throws unless `scale` is one of {@link TIME_SCALES}, naming `argument`. */
export function requireScale(argument: string, scale: unknown): TimeScale {
  const found = TIME_SCALES.find((s) => s === scale);
  if (found === undefined)
    throw new InvalidArgumentError(argument, scale, `one of ${TIME_SCALES.map((s) => `'${s}'`).join(', ')}`);
  return found;
}

/** Local date-time fields after syntax checks, before range checks. */
export interface RawFields {
  year: unknown;
  month: unknown;
  day: unknown;
  hour: unknown;
  minute: unknown;
  /** Whole seconds (0..60). */
  secondWhole: unknown;
  /** Fraction of second, [0, 1). */
  secondFraction: number;
}

/** Syntax scan of ISO 8601 extended date-time text; ranges are checked afterwards. */
export function scanIso(text: unknown): { fields: RawFields; offsetMinutes: number | undefined } {
  if (typeof text !== 'string') throw new InvalidArgumentError('text', text, `an ISO 8601 string ${ISO_FORM}`);
  let pos = 0;
  const where = () => `at character ${pos + 1} of ${JSON.stringify(text)}`;
  const digits = (field: string, count: number, form: string): number => {
    const piece = text.slice(pos, pos + count);
    if (piece.length !== count || !/^\d+$/.test(piece)) {
      throw new InvalidArgumentError(
        `text.${field}`,
        text.slice(pos, pos + count + 2) || '(end of text)',
        `${count} digits ${form} ${where()}; the form is ${ISO_FORM}`,
      );
    }
    pos += count;
    return Number(piece);
  };
  const literal = (char: string, after: string): void => {
    if (text[pos] !== char) {
      const found = pos < text.length ? `'${text[pos]}'` : 'the end of the text';
      const hint =
        after === 'day' && pos >= text.length
          ? 'date-only text is ambiguous: add a time of day, e.g. T00:00:00 (then Z for UTC; no designator for GPS, GST, BDT, TAI, TT or TCG readings)'
          : after === 'day' && (text[pos] === ' ' || text[pos] === 't')
            ? "ISO 8601 separates date and time with an upper-case 'T'"
            : undefined;
      throw new InvalidArgumentError(
        'text',
        text,
        `'${char}' after the ${after} (found ${found} ${where()}); the form is ${ISO_FORM}`,
        hint,
      );
    }
    pos += 1;
  };
  const year = digits('year', 4, 'YYYY (0001..9999)');
  literal('-', 'year');
  const month = digits('month', 2, 'MM (01..12)');
  literal('-', 'month');
  const day = digits('day', 2, 'DD (01..31)');
  literal('T', 'day');
  const hour = digits('hour', 2, 'hh (00..23)');
  literal(':', 'hour');
  const minute = digits('minute', 2, 'mm (00..59)');
  literal(':', 'minute');
  const secondWhole = digits('second', 2, 'ss (00..59, 60 in a leap second)');
  let secondFraction = 0;
  if (text[pos] === '.' || text[pos] === ',') {
    pos += 1;
    const match = /^\d+/.exec(text.slice(pos));
    if (!match)
      throw new InvalidArgumentError(
        'text.fraction',
        text.slice(pos) || '(end of text)',
        `one or more digits after the decimal sign ${where()}`,
      );
    secondFraction = Number(`0.${match[0]}`);
    pos += match[0].length;
  }
  let offsetMinutes: number | undefined;
  if (pos < text.length) {
    const sign = text[pos];
    if (sign === 'Z') {
      offsetMinutes = 0;
      pos += 1;
    } else if (sign === '+' || sign === '-') {
      pos += 1;
      const offsetHours = digits('zone', 2, 'hh of the UTC offset ±hh:mm');
      let offsetMins = 0;
      if (pos < text.length) {
        if (text[pos] === ':') pos += 1;
        offsetMins = digits('zone', 2, 'mm of the UTC offset ±hh:mm');
      }
      if (offsetHours > 23 || offsetMins > 59) {
        throw new InvalidArgumentError(
          'text.zone',
          text,
          `a UTC offset ±hh:mm with hh ≤ 23 and mm ≤ 59; the form is ${ISO_FORM}`,
        );
      }
      offsetMinutes = (sign === '-' ? -1 : 1) * (offsetHours * 60 + offsetMins);
    } else {
      throw new InvalidArgumentError(
        'text.zone',
        text,
        `Z, ±hh:mm or the end of the text ${where()}; the form is ${ISO_FORM}`,
        sign === 'z' ? "write the UTC designator as upper-case 'Z'" : undefined,
      );
    }
    if (pos < text.length) {
      throw new InvalidArgumentError(
        'text',
        text,
        `the end of the text after the zone designator ${where()}; the form is ${ISO_FORM}`,
      );
    }
  }
  return { fields: { year, month, day, hour, minute, secondWhole, secondFraction }, offsetMinutes };
}
