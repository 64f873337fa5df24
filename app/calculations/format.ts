// Owns how calculation numbers read on screen and on the sheet: fixed digits per figure, a real minus sign,
// thin grouping, and units after a space.
import type { Figure } from "./kinds";

export function formatNumber(value: number, digits = 2): string {
  if (!Number.isFinite(value)) return "—";
  const fixed = Math.abs(value) >= 1e6 ? value.toExponential(3) : value.toFixed(digits);
  const [whole, fraction] = fixed.split(".");
  const grouped = whole.replace(/\B(?=(\d{3})+(?!\d))/g, " ");
  const text = fraction ? `${grouped}.${fraction}` : grouped;
  return text.startsWith("-") && Number(fixed) !== 0 ? `−${text.slice(1)}` : text.replace(/^-/, "");
}

export function formatFigure(f: Figure): string {
  if (typeof f.value === "string") return f.value;
  return `${formatNumber(f.value, f.digits ?? (Number.isInteger(f.value) ? 0 : 2))}${f.unit ? ` ${f.unit}` : ""}`;
}

export function formatDateTime(iso: string | Date): string {
  const d = typeof iso === "string" ? new Date(iso) : iso;
  return d.toLocaleString("en-ZA", { timeZone: "Africa/Johannesburg", year: "numeric", month: "short", day: "numeric", hour: "2-digit", minute: "2-digit" });
}
