// An invented fleet document for the benchmarks: 30 satellites sharing 3 stations, each station seeing each
// satellite about twice a day at seeded random times (passes of 15–80 min). Shared by the fleet planner and the
// fleet timeline benchmarks so both measure the same kind of input.

/** Deterministic pseudo-random numbers in [0, 1) (a linear congruential generator, fixed seed). */
export function lcg(seed) {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1_664_525) + 1_013_904_223) >>> 0;
    return s / 2 ** 32;
  };
}

/**
 * @param {object} o
 * @param {number} o.days horizon, in days
 * @param {number} o.seed generator seed
 * @param {string} o.epoch ISO 8601 UTC epoch
 * @param {string[]} o.stationIds three invented station ids
 * @param {string} o.satellitePrefix prefix of the satellite ids (`<prefix>-01` …)
 * @param {number[]} o.passHours the two daily pass times of the first station, hours after midnight
 * @param {number} o.phaseToleranceSeconds every satellite's phase tolerance, s
 */
export function syntheticFleet({ days, seed, epoch, stationIds, satellitePrefix, passHours, phaseToleranceSeconds }) {
  const rand = lcg(seed);
  const epochMs = Date.parse(epoch);
  const iso = (t) => new Date(epochMs + Math.round(t) * 1000).toISOString().replace('.000Z', 'Z');
  const stations = stationIds.map((id) => ({ id, setupSeconds: 600, supportSeconds: 900 }));
  const satellites = Array.from({ length: 30 }, (_, i) => {
    const passes = [];
    for (let d = 0; d < days; d++) {
      stations.forEach((st, k) => {
        for (const base of passHours) {
          const start = d * 86_400 + (base + 2.5 * k) * 3600 + rand() * 4 * 3600;
          const end = Math.min(days * 86_400, start + 2400 + rand() * 2400);
          if (end - start >= 900) passes.push({ station: st.id, start: iso(start), end: iso(end) });
        }
      });
    }
    return {
      id: `${satellitePrefix}-${String(i + 1).padStart(2, '0')}`,
      clock: {
        phaseSeconds: (rand() - 0.5) * 1e-8,
        fractionalFrequency: (rand() - 0.5) * 8e-13,
        driftPerSecond: (rand() - 0.5) * 1e-18,
        noise: { q1: 1e-24, q2: 1e-34, q3: 0 },
      },
      tolerance: { phaseSeconds: phaseToleranceSeconds, probability: 0.95 },
      actuator: {
        frequencyResolution: 1e-15,
        maxFrequencyStep: 5e-13,
        cumulativeFrequencyRange: { min: -5e-11, max: 5e-11 },
        minCommandSpacingSeconds: 3600,
        maxTimeTagSeconds: 43_200,
      },
      passes,
    };
  });
  return {
    epoch: iso(0),
    horizonSeconds: days * 86_400,
    gridSeconds: 900,
    stations,
    satellites,
    strategy: { method: 'optimal' },
  };
}
