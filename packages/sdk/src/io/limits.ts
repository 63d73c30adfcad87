/**
 * Resource limits shared by every reader and by every function that builds a uniform series from
 * stamped samples. They keep memory and time bounded on hostile input (an endless line, a year-9999
 * epoch, a time gap of 10^12 samples); input beyond them is refused with a ParseError or an
 * InvalidArgumentError that names the limit. Values are design choices (common practice, no source).
 *
 * @module
 */

/** Longest line a reader accepts, in characters (1 MiB of text); the longest line of any format read is 4 KiB. */
export const MAX_LINE_CHARACTERS = 1_048_576;

/**
 * Largest number of samples a uniform series may span (gaps included): 5·10^7 samples (about 400 MB
 * as Float64Array phase plus flags), e.g. 1.6 years at 1 s or 475 years at 300 s.
 */
export const MAX_SERIES_SAMPLES = 50_000_000;
