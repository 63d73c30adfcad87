/**
 * Readers: string (or chunk stream) in, typed records out. Malformed input throws ParseError
 * with the source name, line and column.
 *
 * @module
 */
export { MAX_LINE_CHARACTERS, MAX_SERIES_SAMPLES } from './limits.js';
export {
  type EpochFields,
  LineSplitter,
  type LineSplitterOptions,
  linesOf,
  parseFortranReal,
  readLineBatches,
  readLines,
  type TextLine,
  type TextSource,
} from './line-reader.js';
export {
  type PhaseTextEvent,
  type PhaseTextHeader,
  type PhaseTextOptions,
  type PhaseTextSample,
  type PhaseTextSeries,
  parsePhaseText,
  readPhaseText,
  readPhaseTextSeries,
  type SampleGap,
} from './phase-text.js';
export {
  parseRinexClock,
  type RinexClockEvent,
  type RinexClockFile,
  type RinexClockHeader,
  RinexClockParser,
  type RinexClockReadOptions,
  type RinexClockRecord,
  readRinexClock,
} from './rinex-clock.js';
export {
  type RinexClockGap,
  type RinexClockSeries,
  RinexClockSeriesCollector,
  type RinexClockSeriesOptions,
  readRinexClockSeries,
  rinexClockSeries,
} from './rinex-clock-series.js';
export {
  fullYearFromTwoDigits,
  parseRinexNav,
  type RinexIonosphereParameters,
  type RinexLeapSeconds,
  type RinexNavEphemeris,
  type RinexNavEvent,
  type RinexNavFile,
  type RinexNavHeader,
  RinexNavParser,
  type RinexNavReadOptions,
  type RinexNavRecordType,
  type RinexSystemCode,
  type RinexTimeSystemCorrection,
  readRinexNav,
  type SkippedNavRecord,
} from './rinex-nav.js';
export { REFERENCE_WEEK_SYSTEM } from './rinex-time-correction.js';
export {
  parseSp3,
  readSp3,
  type Sp3Epoch,
  type Sp3Event,
  type Sp3File,
  type Sp3Header,
  Sp3Parser,
  type Sp3ReadOptions,
  type Sp3SatelliteRecord,
  type Sp3TimeSystem,
  type Sp3Version,
} from './sp3.js';
