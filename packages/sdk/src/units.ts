/**
 * Unit aliases for the public API. They are plain `number`s (no branding) so that
 * literals and typed-array loops need no casts; their job is to make signatures and
 * hovers read like documentation. A bare number at an SDK boundary is SI.
 *
 * @module
 */

/** Time or time interval, in seconds (SI). */
export type Seconds = number;
/** Length, in metres (SI). */
export type Metres = number;
/** Speed, in metres per second. */
export type MetresPerSecond = number;
/** Angle, in radians. */
export type Radians = number;
/** Angular rate, in radians per second. */
export type RadiansPerSecond = number;
/** Frequency, in hertz. */
export type Hertz = number;
/** A dimensionless ratio, e.g. a fractional frequency offset Δf/f or an eccentricity. */
export type Dimensionless = number;
/** Gravitational parameter GM, in m³/s². */
export type CubicMetresPerSecondSquared = number;
/** Gravitational potential (energy per unit mass), in m²/s². */
export type SquareMetresPerSecondSquared = number;
/** Fractional frequency drift rate, in 1/s (fractional frequency change per second). */
export type PerSecond = number;

/** A 3-vector of SI components. */
export type Vector3 = readonly [number, number, number];
