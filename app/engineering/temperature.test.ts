// Values here are common practice: thermostat about 60 °C (lower invites Legionella), 65 °C as the upper
// setting (from memory); the maximum delivery temperature is a project setting (SANS 10252-1 figure to confirm).
import { describe, expect, it } from "vitest";
import { checkDeliveryTemperature } from "./temperature";

const codes = (r: ReturnType<typeof checkDeliveryTemperature>) => r.findings.map((f) => f.code);

describe("checkDeliveryTemperature", () => {
  it("passes 60 °C storage with a tempering valve set under the delivery limit", () => {
    const r = checkDeliveryTemperature({ thermostatC: 60, maxDeliveryC: 55, temperingValve: { fitted: true, setC: 50 } });
    expect(r.ok).toBe(true);
    expect(r.deliveryC).toBe(50);
    expect(codes(r)).toEqual([]);
  });

  it("fails delivery above the limit without a tempering valve", () => {
    const r = checkDeliveryTemperature({ thermostatC: 60, maxDeliveryC: 55 });
    expect(r.ok).toBe(false);
    expect(r.findings[0]).toMatchObject({ code: "delivery-too-hot", values: { deliveryC: 60, maxDeliveryC: 55 } });
    expect(checkDeliveryTemperature({ thermostatC: 60, maxDeliveryC: 60 }).ok).toBe(true);
  });

  it("warns of Legionella below 60 °C and of scalding and waste above 65 °C", () => {
    expect(codes(checkDeliveryTemperature({ thermostatC: 50, maxDeliveryC: 55 }))).toEqual(["legionella-risk"]);
    expect(codes(checkDeliveryTemperature({ thermostatC: 70, maxDeliveryC: 55, temperingValve: { fitted: true, setC: 50 } }))).toEqual(["thermostat-high"]);
    expect(codes(checkDeliveryTemperature({ thermostatC: 55, maxDeliveryC: 55, minStorageC: 55 }))).toEqual([]);
  });

  it("warns when a tempering valve's setting is unknown", () => {
    const r = checkDeliveryTemperature({ thermostatC: 60, maxDeliveryC: 55, temperingValve: { fitted: true } });
    expect(codes(r)).toEqual(["tempering-setting-unknown", "delivery-too-hot"]);
  });

  it("rejects impossible temperatures", () => {
    expect(() => checkDeliveryTemperature({ thermostatC: 120, maxDeliveryC: 55 })).toThrow(RangeError);
    expect(() => checkDeliveryTemperature({ thermostatC: 60, maxDeliveryC: Number.NaN })).toThrow(RangeError);
  });
});
