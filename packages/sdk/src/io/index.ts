/**
 * Readers: string (or chunk stream) in, typed records out. Malformed input throws ParseError
 * with the source name, line and column.
 *
 * @module
 */
export { MAX_LINE_CHARACTERS, MAX_SERIES_SAMPLES } from './limits.js';
export { parsePhaseText, readPhaseText, type PhaseTextSeries, type PhaseTextOptions, type SampleGap } from './phase-text.js';
export {
  RinexClockParser, parseRinexClock, readRinexClock,
  type RinexClockFile, type RinexClockHeader, type RinexClockRecord, type RinexClockEvent, type RinexClockReadOptions,
} from './rinex-clock.js';
export {
  RinexClockSeriesCollector, rinexClockSeries, readRinexClockSeries, type RinexClockSeries, type RinexClockSeriesOptions,
} from './rinex-clock-series.js';
export {
  type TextLine, type TextSource, type EpochFields, type LineSplitterOptions, LineSplitter, linesOf, readLines, readLineBatches, parseFortranReal,
  scaleSecondsFromFields, fieldsFromScaleSeconds, formatEpochFields,
} from './line-reader.js';
export {
  type RinexSystemCode, type RinexNavRecordType, type RinexLeapSeconds, type RinexIonosphereParameters,
  type RinexTimeSystemCorrection, type RinexNavHeader, type RinexNavEphemeris,
  type SkippedNavRecord, type RinexNavEvent, type RinexNavReadOptions, type RinexNavFile, RinexNavParser, readRinexNav,
  parseRinexNav, fullYearFromTwoDigits,
} from './rinex-nav.js';
export {
  type Sp3TimeSystem, type Sp3Version, type Sp3Header, type Sp3SatelliteRecord, type Sp3Epoch, type Sp3Event, type Sp3ReadOptions,
  type Sp3File, Sp3Parser, readSp3, parseSp3,
} from './sp3.js';
