// The hot-water installation provisions a site may not be able to apply, in our own plain words. The clause
// reference itself is free text on the request: editions differ, and the engineer cites what they rely on.
export const PROVISIONS = [
  { id: "discharge", label: "Discharge pipe run and size (relief and expansion valves)", calculator: "discharge" },
  { id: "vacuum_breakers", label: "Vacuum breaker position (hot and cold sides)", calculator: "vacuum" },
  { id: "balance", label: "Hot and cold pressure balance at mixing points", calculator: "balance" },
  { id: "pressure_ratings", label: "Static pressure and valve ratings", calculator: "valves" },
  { id: "external_circulation", label: "Heat-pump or solar connection to the heater", calculator: null },
  { id: "storage_size", label: "Storage size and heat-up", calculator: "storage" },
  { id: "dead_legs", label: "Dead legs and delivery temperature", calculator: "deadleg" },
  { id: "isolation", label: "Isolating valve per building or occupancy", calculator: null },
  { id: "other", label: "Other provision", calculator: null },
] as const;

export type ProvisionId = (typeof PROVISIONS)[number]["id"];
export const PROVISION_IDS = PROVISIONS.map((p) => p.id) as [ProvisionId, ...ProvisionId[]];

export function provisionLabel(id: string) {
  return PROVISIONS.find((p) => p.id === id)?.label ?? id;
}
