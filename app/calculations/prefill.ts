// Starting a calculator from what the plumber measured on site: each measurement kind (SI unit in its name)
// lands in the matching input of the calculator the request's provision calls for. Anything that does not fit
// is left as the worked example has it, and the engineer checks every input before relying on the result.
type Measured = { kind: string; value: number }[];

const first = (m: Measured, kind: string) => m.find((x) => x.kind === kind && Number.isFinite(x.value))?.value;

export function prefillFromMeasurements(kind: string, example: unknown, measurements: Measured): unknown {
  const input = structuredClone(example) as Record<string, any>;
  const set = (target: Record<string, any> | undefined, key: string, measure: string) => {
    const v = first(measurements, measure);
    if (target && v !== undefined) target[key] = v;
  };
  switch (kind) {
    case "discharge": {
      set(input, "lengthM", "lengthM");
      set(input, "pipeDiameterMm", "pipeSizeMm");
      const bends = first(measurements, "bendCount");
      if (bends !== undefined && bends >= 0 && bends <= 20) input.bends = Array.from({ length: Math.round(bends) }, () => ({ angleDeg: first(measurements, "angleDeg") ?? 45 }));
      break;
    }
    case "valves":
      set(input, "heaterRatingKpa", "heaterRatingKpa");
      set(input, "pressureControlValveKpa", "valveRatingKpa");
      set(input, "expansionValveKpa", "valveRatingKpa");
      set(input, "staticPressureKpa", "staticPressureKpa");
      break;
    case "balance":
      set(input.network?.supply, "staticPressureKpa", "staticPressureKpa");
      break;
    case "vacuum":
      set(input.hot, "distanceFromOutletMm", "distanceMm");
      break;
    case "storage":
      set(input.sizing, "volumeL", "volumeL");
      set(input.heating, "volumeL", "volumeL");
      set(input.heating, "powerKw", "powerKw");
      break;
    case "deadleg":
      set(input.deadLeg?.legs?.[0], "lengthM", "lengthM");
      set(input.deadLeg, "flowLps", "flowLps");
      break;
    case "segment":
      set(input, "lengthM", "lengthM");
      set(input, "flowLps", "flowLps");
      set(input, "tempC", "temperatureC");
      break;
  }
  return input;
}
