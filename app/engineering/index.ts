// The calculation engine's public entry point: the rest of the app imports only from here. Everything is
// pure and isomorphic, so the browser previews exactly what the server recomputes before anything is signed.

export { CAUTION, ENGINE_VERSION } from "./caution";
export type { CheckResult, Finding, Severity } from "./findings";
export { DEFAULT_LIMITS } from "./limits";

export { STANDARD_GRAVITY_MS2, WATER_TEMPERATURE_RANGE_C, waterProperties, type WaterProperties } from "./water";
export {
  colebrook,
  darcyFrictionFactor,
  fullyRoughFrictionFactor,
  haaland,
  LAMINAR_LIMIT_RE,
  swameeJain,
  TURBULENT_LIMIT_RE,
} from "./friction";
export {
  hazenWilliamsLossKpa,
  segmentLoss,
  type HazenWilliamsInput,
  type SegmentLoss,
  type SegmentLossInput,
} from "./losses";
export {
  findFitting,
  fittingCatalogue,
  fittingsAsEquivalentLength,
  fittingsK,
  type FittingCount,
  type FittingType,
} from "./fittings";
export {
  findPipe,
  internalDiameterMm,
  mergeCatalogue,
  nextLargerPipe,
  pipeCatalogue,
  pipeSpecProblems,
  seriesSizes,
  velocityMs,
  type PipeMaterial,
  type PipeSpec,
} from "./pipes";
export {
  DESIGN_FLOW_METHOD,
  designFlow,
  designFlowLpsFromLoadingUnits,
  EN806_CURVE,
  FIXTURE_DEMAND,
  LOADING_UNIT_FLOW_LPS,
  type DesignFlowInput,
  type DesignFlowResult,
  type FixtureCount,
  type FixtureDemand,
  type FixtureType,
} from "./demand";
export {
  NetworkValidationError,
  validateNetwork,
  type BalanceNetwork,
  type FittingMethod,
  type HeaterInput,
  type MixingPointInput,
  type NetworkIssue,
  type NetworkOutletInput,
  type NetworkSegmentInput,
  type PrvInput,
  type Service,
  type SupplyInput,
} from "./network";
export {
  BALANCE_DIFFERENCE_DEFINITION,
  pressureBalance,
  type BalanceOptions,
  type BalanceResult,
  type BalanceSuggestion,
  type BalancingPrvSuggestion,
  type MixingPointOutcome,
  type MixingPointResult,
  type NodeResult,
  type PipeChange,
  type ProfilePoint,
  type SegmentResult,
} from "./balance";
export { checkDischargePipe, type DischargeBend, type DischargePipeInput } from "./discharge";
export { checkVacuumBreakers, type VacuumBreakerInput, type VacuumBreakerSide } from "./vacuum";
export { checkStaticPressure, checkValveRatings, type StaticPressureInput, type ValveRatingsInput } from "./valves";
export {
  expansionVolume,
  heatingTime,
  storageSizing,
  type ExpansionVolumeInput,
  type HeatingTimeInput,
  type HeatingTimeResult,
  type StorageSizingInput,
  type StorageSizingResult,
} from "./heating";
export { checkDeadLeg, timeToHot, type DeadLegInput, type DeadLegResult, type TimeToHotInput } from "./deadleg";
export {
  checkDeliveryTemperature,
  type DeliveryTemperatureInput,
  type DeliveryTemperatureResult,
} from "./temperature";
