// Owns input guards shared by the engine's functions. Physically impossible inputs throw a RangeError naming
// the field, so a caller's bug never turns into a plausible-looking number.

export function requireFinite(name: string, value: number): number {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new RangeError(`${name} must be a finite number (got ${String(value)})`);
  }
  return value;
}

export function requireNonNegative(name: string, value: number): number {
  requireFinite(name, value);
  if (value < 0) throw new RangeError(`${name} cannot be negative (got ${value})`);
  return value;
}

export function requirePositive(name: string, value: number): number {
  requireFinite(name, value);
  if (value <= 0) throw new RangeError(`${name} must be greater than zero (got ${value})`);
  return value;
}
