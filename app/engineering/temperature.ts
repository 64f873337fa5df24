// Owns the storage and delivery temperature check: a thermostat near 60 °C (lower invites Legionella, higher
// scalds and wastes energy) and a maximum delivery temperature at the outlets, which the caller sets because
// the figure must be confirmed against SANS 10252-1.

import { checkResult, finding, type CheckResult, type Finding } from "./findings";
import { requireFinite } from "./guards";
import { DEFAULT_LIMITS } from "./limits";

export interface DeliveryTemperatureInput {
  thermostatC: number;
  /** Highest temperature allowed at the outlets (a project setting). */
  maxDeliveryC: number;
  /** A tempering (thermostatic mixing) valve between the heater and the outlets. */
  temperingValve?: { fitted: boolean; setC?: number };
  /** Default 60 °C (common practice). */
  minStorageC?: number;
  /** Default 65 °C (common practice, from memory). */
  maxStorageC?: number;
}

export interface DeliveryTemperatureResult extends CheckResult {
  deliveryC: number;
}

export function checkDeliveryTemperature(input: DeliveryTemperatureInput): DeliveryTemperatureResult {
  const { thermostatC, maxDeliveryC } = input;
  const minStorageC = input.minStorageC ?? DEFAULT_LIMITS.thermostatMinC;
  const maxStorageC = input.maxStorageC ?? DEFAULT_LIMITS.thermostatMaxC;
  for (const [name, v] of [
    ["thermostatC", thermostatC],
    ["maxDeliveryC", maxDeliveryC],
    ["minStorageC", minStorageC],
    ["maxStorageC", maxStorageC],
  ] as const) {
    requireFinite(name, v);
    if (v <= 0 || v >= 100) throw new RangeError(`${name} must be between 0 and 100 °C (got ${v})`);
  }
  if (minStorageC > maxStorageC) throw new RangeError("minStorageC cannot be above maxStorageC");
  const findings: Finding[] = [];
  if (thermostatC < minStorageC) {
    findings.push(
      finding(
        "warn",
        "legionella-risk",
        `A thermostat at ${thermostatC} °C is below ${minStorageC} °C: stored water that cool invites Legionella`,
        { thermostatC, minStorageC },
      ),
    );
  } else if (thermostatC > maxStorageC) {
    findings.push(
      finding(
        "warn",
        "thermostat-high",
        `A thermostat at ${thermostatC} °C is above ${maxStorageC} °C: it scalds and wastes energy`,
        { thermostatC, maxStorageC },
      ),
    );
  }
  const valve = input.temperingValve;
  let deliveryC = thermostatC;
  if (valve?.fitted) {
    if (valve.setC === undefined) {
      findings.push(
        finding("warn", "tempering-setting-unknown", "A tempering valve is fitted but its setting is not given; delivery is taken at the thermostat setting", {
          thermostatC,
        }),
      );
    } else {
      requireFinite("temperingValve.setC", valve.setC);
      deliveryC = Math.min(valve.setC, thermostatC);
    }
  }
  if (deliveryC > maxDeliveryC) {
    findings.push(
      finding(
        "fail",
        "delivery-too-hot",
        `Water reaches the outlets at up to ${deliveryC} °C, above the ${maxDeliveryC} °C maximum delivery temperature` +
          (valve?.fitted ? "" : "; fit a tempering valve or lower the setting"),
        { deliveryC, maxDeliveryC },
      ),
    );
  }
  return { ...checkResult(findings), deliveryC };
}
