// What changed between two approval versions: conditions, principle outcomes and the drawings relied on.
export interface VersionDiffInput {
  decision: { conditions: string[] };
  principles: { id: string; label: string; outcome: string | null; reasoning: string }[];
  drawings: { sheetNumber: string; revisionLabel: string; sha256: string }[];
}

export interface ApprovalDiff {
  conditionsAdded: string[];
  conditionsRemoved: string[];
  principlesChanged: { label: string; from: string | null; to: string | null }[];
  drawingsAdded: string[];
  drawingsRemoved: string[];
}

export function diffApprovals(before: VersionDiffInput, after: VersionDiffInput): ApprovalDiff {
  const sheet = (d: { sheetNumber: string; revisionLabel: string }) => `${d.sheetNumber} rev ${d.revisionLabel}`;
  const beforeP = new Map(before.principles.map((p) => [p.id, p]));
  return {
    conditionsAdded: after.decision.conditions.filter((c) => !before.decision.conditions.includes(c)),
    conditionsRemoved: before.decision.conditions.filter((c) => !after.decision.conditions.includes(c)),
    principlesChanged: after.principles
      .filter((p) => beforeP.get(p.id)?.outcome !== p.outcome || beforeP.get(p.id)?.reasoning !== p.reasoning)
      .map((p) => ({ label: p.label, from: beforeP.get(p.id)?.outcome ?? null, to: p.outcome })),
    drawingsAdded: after.drawings.filter((d) => !before.drawings.some((b) => b.sha256 === d.sha256)).map(sheet),
    drawingsRemoved: before.drawings.filter((d) => !after.drawings.some((a) => a.sha256 === d.sha256)).map(sheet),
  };
}
