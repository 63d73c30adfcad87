// Fleet fixtures built by the SDK: the VESPER example fleet (packages/sdk/examples/fleet, invented)
// planned with planFleet (in the JSON form the element takes, fleetPlanToJson), and a variant in which one satellite loses its passes of the first four days.
import { type FleetDocument, type FleetPlanJson, fleetPlanToJson, planFleet } from '@tauline/sdk/fleet';

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
