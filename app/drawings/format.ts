// Small display helpers shared by the register's screens. Isomorphic.
export function formatBytes(n: number) {
  if (n >= 1024 * 1024) return `${(n / (1024 * 1024)).toFixed(1)} MB`;
  return `${Math.max(1, Math.round(n / 1024))} KB`;
}

// Made once: building a formatter per call (as toLocaleString with options does) dominated long registers.
const DATE_TIME = new Intl.DateTimeFormat("en-ZA", { dateStyle: "medium", timeStyle: "short", timeZone: "Africa/Johannesburg" });

export function formatDate(iso: string | null | undefined) {
  if (!iso) return "—";
  return DATE_TIME.format(new Date(iso));
}

/** Paper size name for a page in points (ISO A series, either orientation), else its size in mm. */
export function paperSize(widthPt: number, heightPt: number) {
  const mm = (pt: number) => Math.round((pt * 25.4) / 72);
  const [a, b] = [mm(Math.min(widthPt, heightPt)), mm(Math.max(widthPt, heightPt))];
  const iso: [string, number, number][] = [["A0", 841, 1189], ["A1", 594, 841], ["A2", 420, 594], ["A3", 297, 420], ["A4", 210, 297]];
  const hit = iso.find(([, w, h]) => Math.abs(w - a) <= 3 && Math.abs(h - b) <= 3);
  return hit ? hit[0] : `${mm(widthPt)} × ${mm(heightPt)} mm`;
}
