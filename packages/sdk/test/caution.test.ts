// Outputs that feed a flight configuration carry the project's one caution text (DEVELOPERS.md,
// "Outputs that feed a flight configuration"): the factory offset, the offset frequency and the
// tuning word, from one exported constant. Common practice, no source.

import { FLIGHT_CONFIGURATION_CAUTION, meanClockRate, nearestTuningWord, offsetFrequency } from '@tauline/sdk';
import { FLIGHT_CONFIGURATION_CAUTION as fromOscillator } from '@tauline/sdk/oscillator';
import { FLIGHT_CONFIGURATION_CAUTION as fromRelativity } from '@tauline/sdk/relativity';
import { describe, expect, it } from 'vitest';

describe('FLIGHT_CONFIGURATION_CAUTION', () => {
  it('FLIGHT_CONFIGURATION_CAUTION names the interface specification and the responsible engineering authority', () => {
    expect(FLIGHT_CONFIGURATION_CAUTION).toMatch(/^Caution: /);
    expect(FLIGHT_CONFIGURATION_CAUTION).toContain('interface specification');
    expect(FLIGHT_CONFIGURATION_CAUTION).toContain('responsible engineering authority');
    expect(fromRelativity).toBe(FLIGHT_CONFIGURATION_CAUTION);
    expect(fromOscillator).toBe(FLIGHT_CONFIGURATION_CAUTION);
  });
  it('meanClockRate(a) carries the caution with its factory offset', () => {
    expect(meanClockRate(27_412_000).caution).toBe(FLIGHT_CONFIGURATION_CAUTION);
  });
  it('offsetFrequency(f0, y) carries the caution with the frequency to set', () => {
    expect(offsetFrequency(10.23e6, -4.4647e-10).caution).toBe(FLIGHT_CONFIGURATION_CAUTION);
  });
  it('nearestTuningWord(request) carries the caution with the word', () => {
    expect(nearestTuningWord({ targetFrequency: 10.23e6, clockFrequency: 100e6, bits: 48 }).caution).toBe(
      FLIGHT_CONFIGURATION_CAUTION,
    );
  });
});
