// Fleet planner speed: an invented constellation of 30 satellites sharing 3 stations, 7 days (target
// < 1 s) and 30 days (target < 5 s), against a baseline measured in the same run: planning the 30
// satellites one by one with every pass as a contact (no station sharing). Imports the built SDK
// (packages/sdk/dist). Prints times, ratios and the targets; asserts nothing.

import { planFleet } from '../../packages/sdk/dist/fleet/index.js';
import { predictPasses } from '../../packages/sdk/dist/orbit/index.js';
import { planSteering } from '../../packages/sdk/dist/steering/index.js';
import { BUNDLED_LEAP_SECONDS, createTimeScales } from '../../packages/sdk/dist/time/index.js';
import { growthExponent } from './baselines/native.mjs';
import { syntheticFleet } from './synthetic-fleet.mjs';

/** 30 invented satellites, 3 invented stations, each satellite seen by each station about twice a day. */
function constellation(days) {
  return syntheticFleet({
    days,
    seed: 20261203,
    epoch: '2027-03-01T00:00:00Z',
    stationIds: ['BENCH-N', 'BENCH-E', 'BENCH-S'],
    satellitePrefix: 'BENCH',
    passHours: [4, 16],
    // Over 30 days the open-loop σ alone (q2 = 1e-34 /s) reaches ≈ 24 ns, so the month uses a wider band.
    phaseToleranceSeconds: days > 7 ? 1e-7 : 3e-8,
  });
}

/** The baseline: each satellite planned alone with all its passes (merged where they overlap) as contacts. */
function oneByOne(doc) {
  for (const sat of doc.satellites) {
    const windows = sat.passes.map((p) => [Date.parse(p.start), Date.parse(p.end)]).sort((a, b) => a[0] - b[0]);
    const merged = [];
    for (const w of windows) {
      const last = merged[merged.length - 1];
      if (last && w[0] <= last[1]) last[1] = Math.max(last[1], w[1]);
      else merged.push([...w]);
    }
    const contacts = merged.map(([a, b]) => ({ start: new Date(a).toISOString(), end: new Date(b).toISOString() }));
    const { id: _id, passes: _passes, ...rest } = sat;
    planSteering({
      ...rest,
      epoch: doc.epoch,
      horizonSeconds: doc.horizonSeconds,
      gridSeconds: doc.gridSeconds,
      strategy: doc.strategy,
      contacts,
    });
  }
}

/**
 * The same 30 invented clocks with orbits instead of passes: three invented planes of ten MEO satellites (a = 28 410 km,
 * i = 58.5°) and three invented stations at invented coordinates, so planFleet computes the passes itself.
 */
function orbitConstellation(days) {
  const doc = constellation(days);
  const deg = Math.PI / 180;
  const sites = [
    [41.83, 23.05, 620, 10],
    [-29.41, 141.12, 150, 5],
    [64.91, -18.33, 310, 10],
  ];
  doc.stations = doc.stations.map((st, k) => {
    const [lat, lon, h, mask] = sites[k];
    return {
      ...st,
      position: { latitudeRadians: lat * deg, longitudeRadians: lon * deg, heightMetres: h },
      elevationMaskRadians: mask * deg,
    };
  });
  doc.satellites = doc.satellites.map(({ passes: _passes, ...sat }, i) => ({
    ...sat,
    orbit: {
      epoch: doc.epoch,
      semiMajorAxisMetres: 28_410_000,
      eccentricity: 0.001,
      inclinationRadians: 58.5 * deg,
      raanRadians: (i % 3) * 120 * deg,
      argumentOfPerigeeRadians: 0,
      meanAnomalyRadians: (Math.floor(i / 3) * 36 + (i % 3) * 12) * deg,
    },
  }));
  return doc;
}

/** Pass prediction alone for the orbit fleet: every satellite over the three stations, as planFleet calls it. */
function predictAll(doc) {
  const ts = createTimeScales(BUNDLED_LEAP_SECONDS);
  const epoch = ts.parseIso(doc.epoch, 'UTC');
  const sites = doc.stations.map((st) => ({
    position: {
      latitude: st.position.latitudeRadians,
      longitude: st.position.longitudeRadians,
      height: st.position.heightMetres,
    },
    elevationMask: st.elevationMaskRadians,
  }));
  return () => {
    for (const sat of doc.satellites) {
      const o = sat.orbit;
      const elements = {
        semiMajorAxis: o.semiMajorAxisMetres,
        eccentricity: o.eccentricity,
        inclination: o.inclinationRadians,
        raan: o.raanRadians,
        argumentOfPerigee: o.argumentOfPerigeeRadians,
        meanAnomaly: o.meanAnomalyRadians,
      };
      predictPasses({ elements, epoch: ts.parseIso(o.epoch, 'UTC') }, sites, epoch, doc.horizonSeconds, {
        timeScales: ts,
      });
    }
  };
}

/** Shortest of `runs` timings (ms) of `repeat` calls each: on a shared machine the least disturbed run. */
function best(fn, repeat, runs) {
  return Math.min(...Array.from({ length: runs }, () => time(fn, repeat)));
}

function time(fn, repeat) {
  fn(); // warm-up, so the JIT has compiled the path
  const t0 = performance.now();
  for (let i = 0; i < repeat; i++) fn();
  return (performance.now() - t0) / repeat;
}

export default function run() {
  for (const [days, target] of [
    [7, 1],
    [30, 5],
  ]) {
    const doc = constellation(days);
    const base = time(() => oneByOne(doc), 1);
    let plan;
    const ms = time(() => {
      plan = planFleet(doc);
    }, 1);
    const held = plan.satellites.filter((s) => s.feasible).length;
    process.stdout.write(
      `30 satellites × 3 stations × ${days} days: planFleet ${(ms / 1000).toFixed(2)} s (target < ${target} s), ` +
        `${held}/30 held, ${plan.stationSchedule.length} supports; baseline (each satellite alone, all passes) ${(base / 1000).toFixed(2)} s; ` +
        `×${(ms / base).toFixed(1)} of the baseline\n`,
    );
  }
  // Computed passes: the same planner on a fleet given by orbits, against the same fleet with those passes written out.
  for (const [days, target] of [
    [7, 1],
    [30, 5],
  ]) {
    const orbits = orbitConstellation(days);
    let computed;
    const msOrbits = best(
      () => {
        computed = planFleet(orbits);
      },
      1,
      3,
    );
    const given = {
      ...orbits,
      satellites: orbits.satellites.map(({ orbit: _orbit, ...sat }, i) => ({
        ...sat,
        passes: computed.satellites[i].computedPasses
          .filter((p) => p.usable)
          .map(({ station, start, end }) => ({ station, start, end })),
      })),
    };
    const msGiven = best(() => planFleet(given), 1, 3);
    const msPredict = best(predictAll(orbits), 1, 3);
    const count = computed.satellites.reduce((n, s) => n + s.computedPasses.length, 0);
    process.stdout.write(
      `30 satellites (orbits) × 3 stations (positions) × ${days} days: planFleet with computed passes ${(msOrbits / 1000).toFixed(2)} s ` +
        `(target < ${target} s), ${count} passes computed, ${computed.satellites.filter((s) => s.feasible).length}/30 held; same fleet with the passes ` +
        `given ${(msGiven / 1000).toFixed(2)} s; ×${(msOrbits / msGiven).toFixed(2)} (the pass prediction's share); ` +
        `pass prediction alone ${(msPredict / 1000).toFixed(2)} s, ×${(msPredict / msGiven).toFixed(2)} of planning with ` +
        `the passes given (best of 3 runs each)\n`,
    );
  }
  // Growth with the horizon at one tolerance band (±30 ns holds up to 7 days): 3, 5 and 7 days.
  const days = [3, 5, 7];
  const times = days.map((d) => {
    const doc = constellation(d);
    return time(() => planFleet(doc), 1);
  });
  process.stdout.write(
    `growth: planFleet ${times.map((t, k) => `${days[k]} d: ${(t / 1000).toFixed(2)} s`).join(', ')}` +
      `  → exponent ${growthExponent(days, times).toFixed(2)} (least-squares slope of log time against log horizon; 1 = linear)\n`,
  );
}
