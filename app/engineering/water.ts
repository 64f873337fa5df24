// Owns the properties of liquid water at about one atmosphere, 1–95 °C: density, viscosity, specific heat.
//
// Density and specific heat: IAPWS-IF97 region 1 (IAPWS R7-97(2012), the industrial formulation) at
// 101.325 kPa. It reproduces the release's own verification values (Table 5) to 9 significant figures; against
// tabulated values at one atmosphere it is within 0.01 % for density and 0.1 % for specific heat over this
// range (see water.test.ts), far closer than a pipe-sizing calculation can use.
// Viscosity: IAPWS 2008 formulation (IAPWS R12-08), industrial form: IF97 density and no critical enhancement
// (μ2 = 1), which the release allows well away from the critical point. It reproduces the release's check
// values (Table 4) to 9 significant figures; the release's stated uncertainty for the liquid at these
// conditions is about 1 % (from memory).
// One atmosphere is used throughout: at plumbing pressures (≤ 1 MPa) the pressure effect on density is below
// 0.05 % and on viscosity below 0.1 %, inside the correlations' own uncertainty for our purpose.

import { requireFinite } from "./guards";

export interface WaterProperties {
  densityKgM3: number;
  dynamicViscosityPaS: number;
  kinematicViscosityM2S: number;
  specificHeatJPerKgK: number;
}

export const WATER_TEMPERATURE_RANGE_C = { min: 1, max: 95 } as const;
export const STANDARD_GRAVITY_MS2 = 9.80665;
const ATMOSPHERE_MPA = 0.101325;
const KELVIN_OFFSET = 273.15;

// IF97 region 1: specific gas constant (kJ/(kg·K)), reducing pressure (MPa) and temperature (K).
const IF97_R = 0.461526;
const IF97_P_STAR = 16.53;
const IF97_T_STAR = 1386;

// IF97 Table 2: exponents I, J and coefficients n of the region 1 Gibbs free energy.
const R1_I = [
  0, 0, 0, 0, 0, 0, 0, 0, 1, 1, 1, 1, 1, 1, 2, 2, 2, 2, 2, 3, 3, 3, 4, 4, 4, 5, 8, 8, 21, 23, 29, 30, 31, 32,
];
const R1_J = [
  -2, -1, 0, 1, 2, 3, 4, 5, -9, -7, -1, 0, 1, 3, -3, 0, 1, 3, 17, -4, 0, 6, -5, -2, 10, -8, -11, -6, -29, -31,
  -38, -39, -40, -41,
];
const R1_N = [
  0.14632971213167, -0.84548187169114, -0.3756360367204e1, 0.33855169168385e1, -0.95791963387872,
  0.15772038513228, -0.16616417199501e-1, 0.81214629983568e-3, 0.28319080123804e-3, -0.60706301565874e-3,
  -0.18990068218419e-1, -0.32529748770505e-1, -0.21841717175414e-1, -0.5283835796993e-4, -0.47184321073267e-3,
  -0.30001780793026e-3, 0.47661393906987e-4, -0.44141845330846e-5, -0.72694996297594e-15, -0.31679644845054e-4,
  -0.28270797985312e-5, -0.85205128120103e-9, -0.22425281908e-5, -0.65171222895601e-6, -0.14341729937924e-12,
  -0.40516996860117e-6, -0.12734301741641e-8, -0.17424871230634e-9, -0.68762131295531e-18, 0.14478307828521e-19,
  0.26335781662795e-22, -0.11947622640071e-22, 0.18228094581404e-23, -0.93537087292458e-25,
];

/**
 * IF97 region 1 specific volume (m³/kg) and isobaric specific heat (kJ/(kg·K)) at pressure p (MPa) and
 * temperature T (K). Exported for the verification tests; callers use waterProperties.
 */
export function if97Region1(pressureMpa: number, temperatureK: number): { specificVolumeM3Kg: number; cpKjPerKgK: number } {
  const pi = pressureMpa / IF97_P_STAR;
  const tau = IF97_T_STAR / temperatureK;
  const a = 7.1 - pi;
  const b = tau - 1.222;
  let gammaPi = 0;
  let gammaTauTau = 0;
  for (let k = 0; k < R1_N.length; k++) {
    const i = R1_I[k];
    const j = R1_J[k];
    const n = R1_N[k];
    gammaPi -= n * i * a ** (i - 1) * b ** j;
    gammaTauTau += n * a ** i * j * (j - 1) * b ** (j - 2);
  }
  // v = (R T / p) · π · γπ ; R in kJ/(kg·K) and p in MPa give 1e-3 m³/kg per unit.
  const specificVolumeM3Kg = ((IF97_R * temperatureK) / pressureMpa) * pi * gammaPi * 1e-3;
  const cpKjPerKgK = -IF97_R * tau * tau * gammaTauTau;
  return { specificVolumeM3Kg, cpKjPerKgK };
}

// IAPWS R12-08 Table 2 (dilute-gas term) and Table 3 (residual term, H[i][j] for (1/T̄ − 1)^i (ρ̄ − 1)^j).
const VISC_H0 = [1.67752, 2.20462, 0.6366564, -0.241605];
const VISC_H: readonly (readonly number[])[] = [
  [0.520094, 0.222531, -0.281378, 0.161913, -0.0325372, 0, 0],
  [0.0850895, 0.999115, -0.906851, 0.257399, 0, 0, 0],
  [-1.08374, 1.88797, -0.772479, 0, 0, 0, 0],
  [-0.289555, 1.26613, -0.489837, 0, 0.0698452, 0, -0.00435673],
  [0, 0, -0.25704, 0, 0, 0.00872102, 0],
  [0, 0.120573, 0, 0, 0, 0, -0.000593264],
];
const VISC_T_STAR_K = 647.096;
const VISC_RHO_STAR = 322;

/** IAPWS 2008 viscosity in µPa·s at temperature T (K) and density ρ (kg/m³), μ2 = 1. Exported for tests. */
export function iapws2008ViscosityMicroPaS(temperatureK: number, densityKgM3: number): number {
  const t = temperatureK / VISC_T_STAR_K;
  const r = densityKgM3 / VISC_RHO_STAR;
  let sum0 = 0;
  for (let i = 0; i < VISC_H0.length; i++) sum0 += VISC_H0[i] / t ** i;
  const mu0 = (100 * Math.sqrt(t)) / sum0;
  const x = 1 / t - 1;
  const y = r - 1;
  let sum1 = 0;
  for (let i = 0; i < VISC_H.length; i++) {
    let inner = 0;
    for (let j = 0; j < VISC_H[i].length; j++) inner += VISC_H[i][j] * y ** j;
    sum1 += x ** i * inner;
  }
  return mu0 * Math.exp(r * sum1);
}

// Networks hold only a handful of distinct temperatures; the cache keeps the balance solve linear and cheap.
const cache = new Map<number, WaterProperties>();
const CACHE_LIMIT = 512;

/** Properties of liquid water at tempC (°C) and one atmosphere. Throws a RangeError outside 1–95 °C. */
let lastTempC = NaN;
let lastProps: WaterProperties | undefined;

export function waterProperties(tempC: number): WaterProperties {
  // A network asks for the same one or two temperatures segment after segment: answer a repeat at once.
  if (tempC === lastTempC) return lastProps!;
  requireFinite("tempC", tempC);
  if (tempC < WATER_TEMPERATURE_RANGE_C.min || tempC > WATER_TEMPERATURE_RANGE_C.max) {
    throw new RangeError(
      `tempC must be between ${WATER_TEMPERATURE_RANGE_C.min} and ${WATER_TEMPERATURE_RANGE_C.max} °C (got ${tempC})`,
    );
  }
  const hit = cache.get(tempC);
  if (hit) {
    lastTempC = tempC;
    lastProps = hit;
    return hit;
  }
  const temperatureK = tempC + KELVIN_OFFSET;
  const { specificVolumeM3Kg, cpKjPerKgK } = if97Region1(ATMOSPHERE_MPA, temperatureK);
  const densityKgM3 = 1 / specificVolumeM3Kg;
  const dynamicViscosityPaS = iapws2008ViscosityMicroPaS(temperatureK, densityKgM3) * 1e-6;
  const props: WaterProperties = Object.freeze({
    densityKgM3,
    dynamicViscosityPaS,
    kinematicViscosityM2S: dynamicViscosityPaS / densityKgM3,
    specificHeatJPerKgK: cpKjPerKgK * 1000,
  });
  if (cache.size >= CACHE_LIMIT) cache.clear();
  cache.set(tempC, props);
  lastTempC = tempC;
  lastProps = props;
  return props;
}
