// Owns the Darcy friction factor: Colebrook–White solved by Newton iteration, laminar 64/Re, and the
// transition zone between them; Swamee–Jain and Haaland as explicit cross-checks.
//
// Transition zone (2000 ≤ Re ≤ 4000): flow there is intermittent and no correlation is reliable. We interpolate
// linearly in Re between the laminar value at Re = 2000 (0.032) and Colebrook at Re = 4000. That keeps f
// continuous, and because Colebrook at 4000 exceeds 0.032 for every roughness, the loss still rises with flow
// through the zone and sits above the laminar value (the cautious side for residual pressure).

import { requireFinite, requireNonNegative, requirePositive } from "./guards";

export const LAMINAR_LIMIT_RE = 2000;
export const TURBULENT_LIMIT_RE = 4000;
/** Colebrook is fitted to commercial pipe up to about this relative roughness. */
export const MAX_RELATIVE_ROUGHNESS = 0.1;

const LN10 = Math.LN10;

function checkArgs(reynolds: number, relativeRoughness: number): void {
  requirePositive("reynolds", reynolds);
  requireNonNegative("relativeRoughness", relativeRoughness);
  if (relativeRoughness > MAX_RELATIVE_ROUGHNESS) {
    throw new RangeError(`relativeRoughness above ${MAX_RELATIVE_ROUGHNESS} is outside the friction correlations (got ${relativeRoughness})`);
  }
}

/**
 * Swamee & Jain (1976) explicit approximation to Colebrook: within about 1 % over most of 5e3 < Re < 1e8,
 * 1e-6 < ε/D < 1e-2, worst (about 3 %) at low Re with high roughness.
 */
export function swameeJain(reynolds: number, relativeRoughness: number): number {
  checkArgs(reynolds, relativeRoughness);
  const l = Math.log10(relativeRoughness / 3.7 + 5.74 / reynolds ** 0.9);
  return 0.25 / (l * l);
}

/** Haaland (1983) explicit approximation to Colebrook: within about 1.5 % in turbulent flow. */
export function haaland(reynolds: number, relativeRoughness: number): number {
  checkArgs(reynolds, relativeRoughness);
  const x = -1.8 * Math.log10((relativeRoughness / 3.7) ** 1.11 + 6.9 / reynolds);
  return 1 / (x * x);
}

/**
 * Colebrook–White, 1/√f = −2 log10(ε/3.7D + 2.51/(Re √f)), solved by Newton iteration on x = 1/√f to a
 * relative change below 1e-12 (f to about 2e-12). Applied at any Re; darcyFrictionFactor decides where.
 */
export function colebrook(reynolds: number, relativeRoughness: number): number {
  checkArgs(reynolds, relativeRoughness);
  return colebrookUnchecked(reynolds, relativeRoughness);
}

function colebrookUnchecked(reynolds: number, relativeRoughness: number): number {
  const a = relativeRoughness / 3.7;
  const b = 2.51 / reynolds;
  const start = Math.log10(a + 5.74 / Math.max(reynolds, 1) ** 0.9);
  // Swamee–Jain's estimate, 1/√f = −2 log10(…), is within a few per cent: Newton then needs about three steps.
  let x = -2 * start;
  for (let i = 0; i < 50; i++) {
    const inner = a + b * x;
    const g = x + 2 * Math.log10(inner);
    const dg = 1 + (2 / LN10) * (b / inner);
    let next = x - g / dg;
    // Concavity means one overshoot at most, to the left; keep the logarithm's argument positive.
    if (!(next > 0) || !(a + b * next > 0)) next = x / 2;
    const done = Math.abs(next - x) <= 1e-12 * Math.abs(next);
    x = next;
    if (done) break;
  }
  return 1 / (x * x);
}

/** Fully rough limit (von Kármán–Nikuradse): 1/√f = −2 log10(ε/3.7D). */
export function fullyRoughFrictionFactor(relativeRoughness: number): number {
  requirePositive("relativeRoughness", relativeRoughness);
  const x = -2 * Math.log10(relativeRoughness / 3.7);
  return 1 / (x * x);
}

/** Darcy friction factor: 64/Re below Re 2000, Colebrook above 4000, linear in Re between. */
export function darcyFrictionFactor(reynolds: number, relativeRoughness: number): number {
  requireFinite("reynolds", reynolds);
  checkArgs(reynolds, relativeRoughness);
  return darcyFrictionFactorUnchecked(reynolds, relativeRoughness);
}

/** For callers that have already validated their input (the balance solver's inner loop). */
export function darcyFrictionFactorUnchecked(reynolds: number, relativeRoughness: number): number {
  if (reynolds <= LAMINAR_LIMIT_RE) return 64 / reynolds;
  if (reynolds >= TURBULENT_LIMIT_RE) return colebrookUnchecked(reynolds, relativeRoughness);
  const fLaminar = 64 / LAMINAR_LIMIT_RE;
  const fTurbulent = colebrookUnchecked(TURBULENT_LIMIT_RE, relativeRoughness);
  const w = (reynolds - LAMINAR_LIMIT_RE) / (TURBULENT_LIMIT_RE - LAMINAR_LIMIT_RE);
  return fLaminar + w * (fTurbulent - fLaminar);
}
