// Fleet fixtures built by the SDK: the VESPER example fleet (packages/sdk/examples/fleet, invented)
// planned with planFleet (in the JSON form the element takes, fleetPlanToJson), a variant in which one satellite loses its
// passes of the first four days, and one moved a year later, after the bundled leap-second table's end.
import { type FleetDocument, type FleetPlanJson, fleetPlanToJson, planFleet } from '@tauline/sdk/fleet';
import { BUNDLED_LEAP_SECONDS, createTimeScales, defineLeapSecondTable, type TimeScales } from '@tauline/sdk/time';

const EXAMPLE = '/packages/sdk/examples/fleet/vesper-constellation.json';

let cached: FleetDocument | null = null;

/** The example fleet document (a fresh copy each call). */
export async function vesperFleet(): Promise<FleetDocument> {
  if (!cached) {
    const response = await fetch(EXAMPLE);
    cached = (await response.json()) as FleetDocument;
  }
  return structuredClone(cached);
}

/** The example fleet and its plan (every satellite held). */
export async function heldFleet(): Promise<{ fleet: FleetDocument; plan: FleetPlanJson }> {
  const fleet = await vesperFleet();
  return { fleet, plan: fleetPlanToJson(planFleet(fleet)) };
}

/** VESPER-3 keeps only the passes from its ninth on: too few passes, so the plan cannot hold it. */
export async function strandedFleet(): Promise<{ fleet: FleetDocument; plan: FleetPlanJson }> {
  const fleet = await vesperFleet();
  const sat = fleet.satellites[2]!;
  sat.passes = (sat.passes ?? []).slice(8);
  return { fleet, plan: fleetPlanToJson(planFleet(fleet)) };
}

/**
 * A test leap-second table: the bundled entries (last one 2017-01-01) declared valid until MJD 63 000
 * (2031-06-24), i.e. assuming no leap second through then. Invented for the test, not a published list.
 */
export function extendedTimeScales(): TimeScales {
  const { entries } = BUNDLED_LEAP_SECONDS;
  return createTimeScales(defineLeapSecondTable({ entries, validUntilMjd: 63_000, source: 'test: no leap to 2031' }));
}

/** Every ISO 8601 stamp of `value` (deeply) moved `seconds` later, read and written through `timeScales`. */
function shifted<T>(value: T, seconds: number, timeScales: TimeScales): T {
  if (typeof value === 'string' && /^\d{4}-\d\d-\d\dT/.test(value))
    return timeScales.formatIso(timeScales.parseIso(value, 'UTC').plus(seconds), { fractionDigits: 0 }) as T;
  if (Array.isArray(value)) return value.map((v) => shifted(v, seconds, timeScales)) as T;
  if (typeof value === 'object' && value !== null)
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, shifted(v, seconds, timeScales)])) as T;
  return value;
}

/** The example fleet moved 365 days later (epoch 2028-02-01, after the bundled table's end 2027-06-28), planned on `extendedTimeScales()`. */
export async function laterFleet(): Promise<{ fleet: FleetDocument; plan: FleetPlanJson; timeScales: TimeScales }> {
  const timeScales = extendedTimeScales();
  const fleet = shifted(await vesperFleet(), 365 * 86400, timeScales);
  const plan = fleetPlanToJson(planFleet(fleet, { timeScales }), { timeScales });
  return { fleet, plan, timeScales };
}
