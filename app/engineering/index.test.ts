import { describe, expect, it } from "vitest";
import * as engine from "./index";

describe("public entry point", () => {
  it("exports the version and the caution", () => {
    expect(engine.ENGINE_VERSION).toMatch(/^\d+\.\d+\.\d+$/);
    expect(engine.CAUTION).toMatch(/registered professional engineer/);
    expect(engine.CAUTION).toMatch(/local by-laws and licensed practice/);
  });

  it("puts the caution on every check result", () => {
    const results = [
      engine.checkDischargePipe({ valve: "tp", valveConnectionMm: 22, pipeDiameterMm: 22, lengthM: 2, bends: [], elbows: 0, enlargedFromValveOutlet: false }),
      engine.checkVacuumBreakers({ hot: { fitted: true, distanceFromOutletMm: 800, onRiser: false }, cold: { fitted: true, distanceFromOutletMm: 800, onRiser: false } }),
      engine.checkValveRatings({ heaterRatingKpa: 600, pressureControlValveKpa: 400, expansionValveKpa: 400, tpValveChanged: false, staticPressureKpa: 400 }),
      engine.checkStaticPressure({ staticPressureKpa: 400 }),
      engine.storageSizing({ occupants: 3, volumeL: 150 }),
      engine.checkDeadLeg({ legs: [{ internalDiameterMm: 13.6, lengthM: 5 }], flowLps: 0.1 }),
      engine.checkDeliveryTemperature({ thermostatC: 60, maxDeliveryC: 60 }),
      engine.pressureBalance({
        supply: { nodeId: "S", staticPressureKpa: 300 },
        segments: [{ id: "a", fromNodeId: "S", toNodeId: "O", service: "cold", lengthM: 3, pipeId: "cu-c0-15" }],
        outlets: [{ id: "o", nodeId: "O", fixture: "washbasin" }],
        mixingPoints: [],
      }),
    ];
    for (const r of results) {
      expect(r.caution).toBe(engine.CAUTION);
      expect(typeof r.ok).toBe("boolean");
      for (const f of r.findings) {
        expect(["fail", "warn", "info"]).toContain(f.severity);
        expect(f.rule.length).toBeGreaterThan(10);
        expect(f.code).toMatch(/^[a-z0-9-]+$/);
        for (const v of Object.values(f.values)) expect(Number.isFinite(v)).toBe(true);
      }
    }
  });

  it("keeps results plain data that survive JSON", () => {
    const r = engine.pressureBalance({
      supply: { nodeId: "S", staticPressureKpa: 300 },
      segments: [{ id: "a", fromNodeId: "S", toNodeId: "O", service: "cold", lengthM: 3, pipeId: "cu-c0-15" }],
      outlets: [{ id: "o", nodeId: "O", flowLps: 0.1 }],
      mixingPoints: [],
    });
    expect(JSON.parse(JSON.stringify(r))).toEqual(r);
  });
});
