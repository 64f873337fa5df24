import { describe, expect, it } from "vitest";
import { syntheticNetwork } from "./bench/networks";
import type { DischargePipeInput } from "./discharge";
import type { BalanceNetwork } from "./network";
import type { HeatingTimeInput } from "./heating";
import type { SegmentLossInput } from "./losses";
import {
  balanceNetworkSchema,
  balanceOptionsSchema,
  deliveryTemperatureInputSchema,
  dischargePipeInputSchema,
  heatingTimeInputSchema,
  pipeSpecSchema,
  segmentLossInputSchema,
  valveRatingsInputSchema,
} from "./schemas";
import { pipeCatalogue } from "./pipes";

const issues = (r: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) =>
  (r.error?.issues ?? []).map((i) => ({ path: i.path.join("."), message: i.message }));

describe("input schemas", () => {
  it("accept what the engine accepts, with types the engine takes", () => {
    const net = balanceNetworkSchema.parse(syntheticNetwork(4));
    const asEngineInput: BalanceNetwork = net;
    expect(asEngineInput.segments.length).toBeGreaterThan(0);
    const seg: SegmentLossInput = segmentLossInputSchema.parse({ flowLps: 0.2, internalDiameterMm: 20, lengthM: 5, roughnessMm: 0.0015, tempC: 60 });
    expect(seg.tempC).toBe(60);
    const discharge: DischargePipeInput = dischargePipeInputSchema.parse({
      valve: "tp",
      valveConnectionMm: 22,
      pipeDiameterMm: 22,
      lengthM: 3,
      bends: [],
      elbows: 0,
      enlargedFromValveOutlet: false,
    });
    expect(discharge.valve).toBe("tp");
    for (const p of pipeCatalogue) expect(pipeSpecSchema.safeParse(p).success).toBe(true);
    expect(balanceOptionsSchema.safeParse({ balanceLimitPercent: 20, pipeCatalogue: [...pipeCatalogue] }).success).toBe(true);
  });

  it("name a negative length at its field", () => {
    const r = segmentLossInputSchema.safeParse({ flowLps: 0.2, internalDiameterMm: 20, lengthM: -3, roughnessMm: 0.0015, tempC: 20 });
    expect(issues(r)).toContainEqual({ path: "lengthM", message: "Length cannot be negative" });
  });

  it("name a PRV set above the supply, a rise longer than the pipe, and pressure under flow above static", () => {
    const net = syntheticNetwork(2);
    net.supply.prv = { nodeId: "M", settingKpa: 700 };
    net.segments[1].riseM = 9;
    net.supply.dynamicPressureKpa = 600;
    const found = issues(balanceNetworkSchema.safeParse(net));
    expect(found).toContainEqual({
      path: "supply.prv.settingKpa",
      message: "A PRV cannot be set to 700 kPa, above the 550 kPa supply: it can only reduce pressure",
    });
    expect(found).toContainEqual({ path: "segments.1.riseM", message: "A pipe 6 m long cannot rise or fall 9 m" });
    expect(found).toContainEqual({
      path: "supply.dynamicPressureKpa",
      message: "The pressure under flow (600 kPa) cannot exceed the static pressure (550 kPa)",
    });
  });

  it("name a segment with both or neither of pipe and bore, and an outlet with no demand", () => {
    const net = syntheticNetwork(2);
    net.segments[0].internalDiameterMm = 50;
    delete net.segments[1].pipeId;
    net.outlets[0] = { id: "x", nodeId: net.outlets[0].nodeId };
    const found = issues(balanceNetworkSchema.safeParse(net)).map((i) => i.path);
    expect(found).toEqual(expect.arrayContaining(["segments.0.pipeId", "segments.1.pipeId", "outlets.0.flowLps"]));
  });

  it("name other impossible values", () => {
    expect(issues(heatingTimeInputSchema.safeParse({ volumeL: 150, fromC: 60, toC: 15, powerKw: 3 }))).toEqual([
      { path: "toC", message: "The final temperature (15 °C) cannot be below the starting one (60 °C)" },
    ]);
    const ok: HeatingTimeInput = heatingTimeInputSchema.parse({ volumeL: 150, fromC: 15, toC: 60, powerKw: 3 });
    expect(ok.powerKw).toBe(3);
    expect(issues(valveRatingsInputSchema.safeParse({ heaterRatingKpa: -600, pressureControlValveKpa: 400, expansionValveKpa: 400, staticPressureKpa: 400 }))).toEqual([
      { path: "heaterRatingKpa", message: "Heater rating must be greater than zero" },
    ]);
    expect(issues(dischargePipeInputSchema.safeParse({ valve: "tp", valveConnectionMm: 22, pipeDiameterMm: 22, lengthM: 2, bends: [{ angleDeg: 270 }], elbows: 0.5, enlargedFromValveOutlet: false })).map((i) => i.path)).toEqual([
      "bends.0.angleDeg",
      "elbows",
    ]);
    expect(issues(deliveryTemperatureInputSchema.safeParse({ thermostatC: 60, maxDeliveryC: 55, minStorageC: 70, maxStorageC: 65 }))[0].path).toBe("minStorageC");
    expect(issues(pipeSpecSchema.safeParse({ ...pipeCatalogue[0], wallThicknessMm: 8 }))[0].message).toMatch(/leaves no bore/);
  });
});
