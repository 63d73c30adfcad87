/**
 * Readers: string (or chunk stream) in, typed records out. Malformed input throws ParseError
 * with the source name, line and column.
 *
 * @module
 */
export { parsePhaseText, readPhaseText, type PhaseTextSeries, type PhaseTextOptions, type SampleGap } from './phase-text.js';
export {
  parseRinexClock, readRinexClock, rinexClockSeries,
  type RinexClockFile, type RinexClockHeader, type RinexClockRecord, type RinexClockSeries,
} from './rinex-clock.js';
