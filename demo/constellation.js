// Invented demo data: the fictional "Corvane" timing constellation, its fictional ground
// stations (Isk Harbour, Vell Ridge) and fictional dates. Nothing here describes a real system.

import { BUNDLED_LEAP_SECONDS, createTimeScales } from '@tauline/sdk/time';

export const CONSTELLATION = 'Corvane';

/** Four invented MEO satellites: design semi-major axis (m), inclination (rad), clock type. */
export const SATELLITES = [
  {
    id: 'CORVANE-A1',
    designSemiMajorAxis: 27_870_000,
    inclination: 0.977,
    clock: 'rubidium',
    stationA: 'Isk Harbour',
    stationB: 'Vell Ridge',
  },
  {
    id: 'CORVANE-A2',
    designSemiMajorAxis: 27_870_000,
    inclination: 0.977,
    clock: 'rubidium',
    stationA: 'Vell Ridge',
    stationB: 'Isk Harbour',
  },
  {
    id: 'CORVANE-B1',
    designSemiMajorAxis: 27_655_000,
    inclination: 0.96,
    clock: 'passive maser',
    stationA: 'Isk Harbour',
    stationB: 'Vell Ridge',
  },
  {
    id: 'CORVANE-B2',
    designSemiMajorAxis: 27_655_000,
    inclination: 0.96,
    clock: 'passive maser',
    stationA: 'Vell Ridge',
    stationB: 'Isk Harbour',
  },
];

const EPOCH = '2027-03-08T00:00:00Z'; // inside the SDK's bundled leap-second table span
const TIME_SCALES = createTimeScales(BUNDLED_LEAP_SECONDS); // the planner's default table, as the elements use
const EPOCH_INSTANT = TIME_SCALES.parseIso(EPOCH, 'UTC');
/** The UTC stamp `s` SI seconds after the epoch, through the SDK's time scales (a leap second counts as one). */
const iso = (s) => TIME_SCALES.formatIso(EPOCH_INSTANT.plus(s), { fractionDigits: 0 });

/** Two passes a day, offset per satellite so the stations take turns. */
function contacts(index, days) {
  const out = [];
  const shift = index * 1500;
  for (let d = 0; d < days; d++) {
    out.push({ start: iso(d * 86400 + 4 * 3600 + shift), end: iso(d * 86400 + 4 * 3600 + shift + 2700) });
    out.push({ start: iso(d * 86400 + 16 * 3600 + shift), end: iso(d * 86400 + 16 * 3600 + shift + 2400) });
  }
  return out;
}

/**
 * A steering scenario for one satellite. `residualFractionalFrequency` is the clock's rate
 * left over after the factory offset (what the what-if panel changes through the orbit).
 */
export function scenarioFor(
  index,
  { residualFractionalFrequency, tolerancePhaseSeconds, method, maneuverDeltaA = 12_000, days = 7 },
) {
  const sat = SATELLITES[index];
  const rubidium = sat.clock === 'rubidium';
  return {
    name: `${sat.id} clock, ${days === 7 ? 'one week' : `${days} days`}`,
    description: `Invented ${CONSTELLATION} satellite ${sat.id} (${sat.clock}), uplinks from ${sat.stationA} and ${sat.stationB}.`,
    epoch: EPOCH,
    horizonSeconds: days * 86400,
    gridSeconds: 900,
    clock: {
      phaseSeconds: 2.5e-9,
      fractionalFrequency: residualFractionalFrequency,
      driftPerSecond: rubidium ? 4e-19 : 6e-20,
      noise: {
        stability: {
          whiteFrequency: { tau: 1, deviation: rubidium ? 2.5e-12 : 8e-13 },
          randomWalkFrequency: { tau: 86400, deviation: rubidium ? 4e-15 : 1.5e-15 },
        },
      },
    },
    tolerance: { phaseSeconds: tolerancePhaseSeconds, probability: 0.95 },
    contacts: contacts(index, days),
    actuator: {
      frequencyResolution: 5e-15,
      maxFrequencyStep: 5e-13,
      cumulativeFrequencyRange: { min: -5e-11, max: 5e-11 },
      phaseSteps: { allowed: false },
      minCommandSpacingSeconds: 3600,
      maxTimeTagSeconds: 129600,
    },
    maneuvers: [
      {
        at: iso(3 * 86400 + 14.5 * 3600),
        semiMajorAxisBefore: sat.designSemiMajorAxis,
        semiMajorAxisAfter: sat.designSemiMajorAxis + maneuverDeltaA,
      },
    ],
    strategy: { method },
    // Ground estimates of the clock offset every 15 min (0.3 ns, 1 h late), re-planned at each contact:
    // what the closed-loop what-if flies (invented operations figures).
    operations: {
      estimateIntervalSeconds: 900,
      estimateNoiseSeconds: 3e-10,
      estimateLatencySeconds: 3600,
      replan: 'each-contact',
    },
  };
}

/** An invented launch review of the four satellites; two carry classic mistakes. */
export function reviewDocument(expectedOffsets) {
  const [a1, a2, b1] = expectedOffsets; // B2 is configured for another orbit (the mistake under review)
  return {
    title: `${CONSTELLATION} launch review (fictional)`,
    nominalFrequencyHz: 10_230_000,
    constants: 'iers-2010',
    reference: 'tt',
    tolerance: { fractional: 5e-13 },
    actuator: { rangeFractional: 2e-11 },
    phaseToleranceSeconds: 1e-6,
    spacecraft: [
      {
        id: 'CORVANE-A1',
        configured: { fractionalOffset: a1 },
        orbit: { semiMajorAxis: SATELLITES[0].designSemiMajorAxis, inclination: SATELLITES[0].inclination },
      },
      {
        id: 'CORVANE-A2',
        configured: { fractionalOffset: -a2 },
        orbit: { semiMajorAxis: SATELLITES[1].designSemiMajorAxis, inclination: SATELLITES[1].inclination },
      },
      {
        id: 'CORVANE-B1',
        configured: { fractionalOffset: b1 + 4e-13 },
        orbit: { semiMajorAxis: SATELLITES[2].designSemiMajorAxis, inclination: SATELLITES[2].inclination },
      },
      {
        id: 'CORVANE-B2',
        configured: { fractionalOffset: -4.4647e-10 },
        orbit: { semiMajorAxis: SATELLITES[3].designSemiMajorAxis, inclination: SATELLITES[3].inclination },
      },
    ],
  };
}

/** Seeded generator (Park–Miller minimal standard, 16807 mod 2^31 − 1) and Box–Muller normals. */
export function normals(seed) {
  let state = seed % 2147483647;
  const uniform = () => (state = (state * 16807) % 2147483647) / 2147483647;
  return () => Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform());
}

/** Simulated fractional-frequency record of a clock (white FM plus random-walk FM), τ0 = 1 s. */
export function clockRecord(index, length = 65_536) {
  const sat = SATELLITES[index];
  const rubidium = sat.clock === 'rubidium';
  const next = normals(20_320_914 + index);
  const white = rubidium ? 2.5e-12 : 8e-13;
  const walk = rubidium ? 1.2e-17 : 5e-18;
  const y = new Float64Array(length);
  let rw = 0;
  for (let i = 0; i < length; i++) {
    rw += walk * next();
    y[i] = white * next() + rw;
  }
  return y;
}

/** The two invented uplink stations of the fleet view: a support lasts `supportSeconds`, `setupSeconds` between supports. */
export const FLEET_STATIONS = [
  { id: 'ISK-HARBOUR', setupSeconds: 900, supportSeconds: 1200 },
  { id: 'VELL-RIDGE', setupSeconds: 600, supportSeconds: 900 },
];

/**
 * Invented passes of satellite `index` over the two stations: Isk Harbour sees each satellite once a
 * day near 04:00, Vell Ridge near 16:00, 25 min apart satellite after satellite, so passes overlap
 * and the stations must be shared. CORVANE-B2 has no pass on the first day (an invented transponder
 * outage), so a fast-running clock on it leaves its band before anyone can uplink.
 */
function fleetPasses(index, days) {
  const out = [];
  const shift = index * 1500;
  for (let d = 0; d < days; d++) {
    if (index === 3 && d === 0) continue;
    out.push({
      station: 'ISK-HARBOUR',
      start: iso(d * 86400 + 4 * 3600 + shift),
      end: iso(d * 86400 + 4 * 3600 + shift + 2700),
    });
    out.push({
      station: 'VELL-RIDGE',
      start: iso(d * 86400 + 16 * 3600 + shift),
      end: iso(d * 86400 + 16 * 3600 + shift + 2400),
    });
  }
  return out;
}

/**
 * The fleet document of the fleet view (`planFleet` of @tauline/sdk/fleet): the four satellites with
 * the clocks and actuators of `scenarioFor`, their residual rates, one tolerance for all, the two
 * stations and their passes over `days` days.
 */
export function fleetDocument(residuals, { tolerancePhaseSeconds = 25e-9, method = 'optimal', days = 7 } = {}) {
  return {
    name: `${CONSTELLATION} fleet, ${days} days`,
    description: `Invented ${CONSTELLATION} satellites steered through ${FLEET_STATIONS.map((s) => s.id).join(' and ')}.`,
    epoch: EPOCH,
    horizonSeconds: days * 86400,
    gridSeconds: 900,
    stations: FLEET_STATIONS,
    satellites: SATELLITES.map((sat, index) => {
      const s = scenarioFor(index, {
        residualFractionalFrequency: residuals[index],
        tolerancePhaseSeconds,
        method,
        days,
      });
      return {
        id: sat.id,
        clock: s.clock,
        tolerance: s.tolerance,
        actuator: s.actuator,
        maneuvers: [],
        passes: fleetPasses(index, days),
      };
    }),
    strategy: { method },
  };
}
