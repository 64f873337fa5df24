// Owns reading and writing a calculator's input by field path, without mutating it: the editors hold the input
// as plain JSON and change one field at a time. Writing undefined removes the field (an optional left blank).
import type { IssuePath } from "./issues";

export function getIn(value: unknown, path: IssuePath): unknown {
  let v: any = value;
  for (const p of path) {
    if (v === null || typeof v !== "object") return undefined;
    v = v[p];
  }
  return v;
}

export function setIn<T>(value: T, path: IssuePath, next: unknown): T {
  if (path.length === 0) return next as T;
  const [head, ...rest] = path;
  const container: any = Array.isArray(value) ? [...value] : value && typeof value === "object" ? { ...value } : typeof head === "number" ? [] : {};
  const child = setIn(container[head], rest, next);
  if (child === undefined && !Array.isArray(container)) delete container[head];
  else container[head] = child;
  return container;
}

/** Text typed into a number field: blank is "not given", anything else a number (NaN when it is not one). */
export function parseNumber(text: string): number | undefined {
  const t = text.trim().replace(",", ".");
  if (t === "") return undefined;
  return Number(t);
}

export function showNumber(value: unknown): string {
  return typeof value === "number" && !Number.isNaN(value) ? String(value) : "";
}
