// Text comparison of two revisions of a sheet: the page's text runs joined in reading order, whitespace
// normalised (pdf.js splits runs at spaces), then a word diff. Pure and isomorphic.
import { diffWords } from "diff";
import type { TextRun } from "../../db/models/drawing-revision";

export interface TextDiffPart {
  value: string;
  added?: boolean;
  removed?: boolean;
}

export interface TextDiff {
  parts: TextDiffPart[];
  addedWords: string[];
  removedWords: string[];
}

export function normaliseWhitespace(s: string) {
  return s.replace(/\s+/g, " ").trim();
}

/** Runs in reading order: by line (runs whose tops are within half a line height), then left to right. */
export function pageTextInOrder(runs: readonly TextRun[] | null | undefined): string {
  if (!runs?.length) return "";
  const sorted = [...runs].sort((a, b) => a.y - b.y || a.x - b.x);
  const lines: TextRun[][] = [];
  for (const run of sorted) {
    const line = lines[lines.length - 1];
    if (line && Math.abs(line[0]!.y - run.y) <= Math.max(2, line[0]!.h / 2)) line.push(run);
    else lines.push([run]);
  }
  return normaliseWhitespace(lines.map((l) => l.sort((a, b) => a.x - b.x).map((r) => r.s).join(" ")).join("\n"));
}

export function diffText(before: string, after: string): TextDiff {
  const parts = diffWords(normaliseWhitespace(before), normaliseWhitespace(after)).map((p) => ({
    value: p.value,
    ...(p.added ? { added: true } : {}),
    ...(p.removed ? { removed: true } : {}),
  }));
  const words = (ps: TextDiffPart[]) => ps.flatMap((p) => p.value.split(/\s+/).filter(Boolean));
  return {
    parts,
    addedWords: words(parts.filter((p) => p.added)),
    removedWords: words(parts.filter((p) => p.removed)),
  };
}
