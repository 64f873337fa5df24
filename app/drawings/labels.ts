// The project's revision labels: P1, P2 … while preliminary, then A, B … for construction (I and O are skipped,
// as they read as 1 and 0 on a printed sheet — common practice). Isomorphic: the upload form suggests the same
// next label that the server assigns.

export type LabelKind = "preliminary" | "construction";

const LETTERS = "ABCDEFGHJKLMNPQRSTUVWXYZ";
const PRELIMINARY = /^P([1-9]\d{0,2})$/;
const CONSTRUCTION = /^([A-HJ-NP-Z]{1,2})$/;

export function normaliseLabel(label: string) {
  return label.trim().toUpperCase();
}

export function isValidLabel(label: string) {
  const l = normaliseLabel(label);
  return PRELIMINARY.test(l) || CONSTRUCTION.test(l);
}

export function labelKind(label: string): LabelKind | null {
  const l = normaliseLabel(label);
  if (PRELIMINARY.test(l)) return "preliminary";
  if (CONSTRUCTION.test(l)) return "construction";
  return null;
}

/** Position in the sequence: every preliminary label sorts before every construction label. */
export function labelRank(label: string): number {
  const l = normaliseLabel(label);
  const p = l.match(PRELIMINARY);
  if (p) return Number(p[1]);
  if (CONSTRUCTION.test(l)) {
    let n = 0;
    for (const ch of l) n = n * LETTERS.length + LETTERS.indexOf(ch) + 1;
    return 10_000 + n;
  }
  return Number.MAX_SAFE_INTEGER;
}

/** Sheet numbers in the same order as String#localeCompare, with one collator instead of one per comparison. */
export const compareSheetNumbers = new Intl.Collator().compare;

export function compareLabels(a: string, b: string) {
  return labelRank(a) - labelRank(b);
}

function letters(n: number): string {
  let s = "";
  while (n > 0) {
    n -= 1;
    s = LETTERS[n % LETTERS.length] + s;
    n = Math.floor(n / LETTERS.length);
  }
  return s;
}

/** The label after the highest one of that kind already used on the sheet. */
export function nextLabel(existing: readonly string[], kind: LabelKind): string {
  if (kind === "preliminary") {
    const highest = existing.map(normaliseLabel).filter((l) => PRELIMINARY.test(l)).map((l) => Number(l.slice(1)));
    return `P${Math.max(0, ...highest) + 1}`;
  }
  const highest = existing.map(normaliseLabel).filter((l) => CONSTRUCTION.test(l)).map((l) => labelRank(l) - 10_000);
  return letters(Math.max(0, ...highest) + 1);
}
