// Owns the starting inputs for each calculator: small, plausible installations so a new calculation shows a
// result at once. The balance example is one heater, a shower mixer and a basin with pillar taps.
import type { DischargePipeInput, ValveRatingsInput, VacuumBreakerInput } from "~/engineering";
import type { BalanceInput, DeadlegInput, SegmentInput, StorageInput } from "./kinds";

export const EXAMPLES: {
  balance: BalanceInput;
  segment: SegmentInput;
  discharge: DischargePipeInput;
  vacuum: VacuumBreakerInput;
  valves: ValveRatingsInput;
  storage: StorageInput;
  deadleg: DeadlegInput;
} = {
  balance: {
    network: {
      supply: { nodeId: "supply", staticPressureKpa: 500, prv: { id: "prv-main", nodeId: "split", settingKpa: 300 } },
      heater: { nodeId: "heater", pressureLossKpa: 10, ratedFlowLps: 0.3 },
      segments: [
        { id: "main", fromNodeId: "supply", toNodeId: "split", service: "cold", lengthM: 6, pipeId: "cu-c0-22", fittings: [{ fittingId: "elbow-90", count: 2 }] },
        { id: "heater-feed", fromNodeId: "split", toNodeId: "heater", service: "cold", lengthM: 4, riseM: 2.5, pipeId: "cu-c0-22", fittings: [{ fittingId: "elbow-90", count: 3 }] },
        { id: "cold-run", fromNodeId: "split", toNodeId: "cold-tee", service: "cold", lengthM: 5, pipeId: "cu-c0-22", fittings: [{ fittingId: "tee-branch", count: 1 }] },
        { id: "cold-shower", fromNodeId: "cold-tee", toNodeId: "shower-c", service: "cold", lengthM: 2, riseM: 1.2, pipeId: "cu-c0-15", fittings: [{ fittingId: "elbow-90", count: 2 }] },
        { id: "cold-basin", fromNodeId: "cold-tee", toNodeId: "basin-c", service: "cold", lengthM: 3, riseM: 0.8, pipeId: "cu-c0-15", fittings: [{ fittingId: "elbow-90", count: 2 }] },
        { id: "hot-run", fromNodeId: "heater", toNodeId: "hot-tee", service: "hot", lengthM: 9, riseM: -2.5, pipeId: "cu-c0-22", fittings: [{ fittingId: "elbow-90", count: 4 }] },
        { id: "hot-shower", fromNodeId: "hot-tee", toNodeId: "shower-h", service: "hot", lengthM: 2, riseM: 1.2, pipeId: "cu-c0-15", fittings: [{ fittingId: "elbow-90", count: 2 }] },
        { id: "hot-basin", fromNodeId: "hot-tee", toNodeId: "basin-h", service: "hot", lengthM: 3, riseM: 0.8, pipeId: "cu-c0-15", fittings: [{ fittingId: "elbow-90", count: 2 }] },
      ],
      outlets: [
        { id: "shower-hot", nodeId: "shower-h", fixture: "shower", label: "Shower, hot" },
        { id: "shower-cold", nodeId: "shower-c", fixture: "shower", label: "Shower, cold" },
        { id: "basin-hot", nodeId: "basin-h", fixture: "washbasin", label: "Basin, hot tap" },
        { id: "basin-cold", nodeId: "basin-c", fixture: "washbasin", label: "Basin, cold tap" },
      ],
      mixingPoints: [{ id: "shower", hotOutletId: "shower-hot", coldOutletId: "shower-cold", label: "Shower mixer" }],
      prvs: [],
      hotTempC: 60,
      coldTempC: 20,
    },
    options: { balanceLimitPercent: 20 },
  },
  segment: { flowLps: 0.2, internalDiameterMm: 13.6, lengthM: 10, roughnessMm: 0.0015, tempC: 60, kTotal: 1.5, riseM: 0, hazenWilliamsC: 140 },
  discharge: { valve: "tp", valveConnectionMm: 22, pipeDiameterMm: 22, lengthM: 3.5, bends: [{ angleDeg: 45 }, { angleDeg: 45 }], elbows: 0, enlargedFromValveOutlet: false },
  vacuum: {
    hot: { fitted: true, distanceFromOutletMm: 900, onRiser: false },
    cold: { fitted: true, distanceFromOutletMm: 400, onRiser: true, riserHeightMm: 300 },
  },
  valves: { heaterRatingKpa: 600, pressureControlValveKpa: 400, expansionValveKpa: 400, tpValveChanged: false, staticPressureKpa: 450 },
  storage: {
    sizing: { occupants: 4, volumeL: 200, litresPerPersonPerDay: 50 },
    heating: { volumeL: 200, fromC: 15, toC: 60, powerKw: 3, efficiency: 1 },
  },
  deadleg: {
    deadLeg: { legs: [{ internalDiameterMm: 20.8, lengthM: 6 }, { internalDiameterMm: 14, lengthM: 3 }], flowLps: 0.15, maxSeconds: 30 },
    delivery: { thermostatC: 60, maxDeliveryC: 55, temperingValve: { fitted: true, setC: 50 } },
  },
};
