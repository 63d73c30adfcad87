/**
 * @tauline/sdk — satellite clock relativity, stability analysis and steering.
 * Pure TypeScript, SI units at every boundary, no DOM, no runtime dependencies.
 * Each concept is also its own subpath (`@tauline/sdk/relativity`, ...), see package.json.
 *
 * @module
 */

export { FLIGHT_CONFIGURATION_CAUTION } from './caution.js';
export * from './clock-model/index.js';
export * from './constants.js';
export * from './errors.js';
export * from './fleet/index.js';
export * from './io/index.js';
export * from './orbit/index.js';
export * from './oscillator/index.js';
export * from './relativity/index.js';
export * from './review/index.js';
export * from './signal/index.js';
export * from './stability/index.js';
export * from './steering/index.js';
export * from './time/index.js';
export * from './units.js';
