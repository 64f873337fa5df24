// Small display helpers shared by the request pages (same output on server and browser).
export function formatBytes(n: number) {
  if (n >= 1024 * 1024) return `${Math.round((n / 1024 / 1024) * 10) / 10} MB`;
  return `${Math.max(1, Math.ceil(n / 1024))} KB`;
}

/** "12 Mar 2026, 14:05" in South African time, identical on server and browser. */
// Made once each: a formatter per call dominated rendering long lists.
const WHEN = {
  date: new Intl.DateTimeFormat("en-ZA", { day: "numeric", month: "short", year: "numeric", timeZone: "Africa/Johannesburg" }),
  time: new Intl.DateTimeFormat("en-ZA", { day: "numeric", month: "short", year: "numeric", hour: "2-digit", minute: "2-digit", hour12: false, timeZone: "Africa/Johannesburg" }),
};

export function formatWhen(iso: string | null, withTime = true) {
  if (!iso) return "—";
  return WHEN[withTime ? "time" : "date"].format(new Date(iso));
}

/** YYYY-MM-DD of a moment in South African time (for date inputs). */
export function dateInputValue(iso: string | null) {
  if (!iso) return "";
  const parts = new Intl.DateTimeFormat("en-CA", { timeZone: "Africa/Johannesburg", year: "numeric", month: "2-digit", day: "2-digit" }).format(new Date(iso));
  return parts;
}
