// Owns the default limits the checks apply, each with where it comes from. Every one is a default the caller
// may override: where a value is trade practice rather than a published clause it says so, and values marked
// "(from memory)" must be confirmed against the current standard before a project relies on them.

export const DEFAULT_LIMITS = {
  /** Hot/cold residual pressure difference at a mixing point. Common practice. */
  balanceLimitPercent: 20,
  /** System static pressure. Common practice. */
  maxStaticPressureKpa: 600,
  /**
   * Flow velocity in mains, risers and floor pipes. EN 806-3:2006 §4.4 gives 2.0 m/s for these (4.0 m/s for a
   * connection pipe to a single fitting); read in a reproduced excerpt of the standard.
   */
  maxVelocityMs: 2.0,
  /** TP valve connection and discharge pipe size. Common practice. */
  tpValveConnectionMm: 22,
  /** Discharge pipe runs. Common practice. */
  discharge: {
    baseDiameterMm: 22,
    baseMaxLengthM: 4,
    enlargedDiameterMm: 28,
    enlargedMaxLengthM: 9,
    maxBends: 3,
    maxBendAngleDeg: 45,
    minBendRadiusDiameters: 5,
  },
  /** Vacuum breakers. Common practice. */
  vacuumBreaker: {
    teeInMinDistanceMm: 700,
    riserHeightMm: 300,
  },
  /** Thermostat setting: about 60 °C. Common practice. */
  thermostatMinC: 60,
  /** Above this the water scalds and wastes energy. Common practice (from memory). */
  thermostatMaxC: 65,
  /** Time to hot water at an outlet. Common practice (from memory). */
  deadLegMaxSeconds: 30,
  /** Hot water stored per occupant. Common practice (from memory). */
  storageLitresPerPerson: 50,
  /** Storage more than this multiple of the need is flagged as excessive. Common practice (our choice). */
  storageExcessRatio: 1.5,
  /** Heater sizes commonly stocked in South Africa, litres. Common practice (from memory). */
  standardHeaterSizesL: [50, 100, 150, 200, 250, 300] as readonly number[],
} as const;
