/**
 * The one caution text carried by every SDK result that feeds a flight configuration (factory
 * offsets, offset frequencies, tuning words), by the CLI's outputs of those values and by the
 * elements that show them. Steering plans and launch reviews carry their own longer cautions
 * (`STEERING_CAUTION`, `REVIEW_CAUTION`), which say the same and add what applies to them.
 *
 * @module
 */

/**
 * Caution to verify a value against the mission's own interface specification and its responsible
 * engineering authority before it enters a flight configuration. Common practice, no source.
 */
export const FLIGHT_CONFIGURATION_CAUTION =
  "Caution: verify these values against the mission's own interface specification and have them confirmed by its " +
  'responsible engineering authority before they enter a flight configuration.';
