// Owns the shape every check returns: a pass/fail flag, the findings behind it, and the caution.

import { CAUTION } from "./caution";

export type Severity = "fail" | "warn" | "info";

export interface Finding {
  severity: Severity;
  /** Stable machine code, e.g. "discharge-too-long". */
  code: string;
  /** The rule in plain words, with the numbers that matter. */
  rule: string;
  /** The numbers behind the finding, in SI units named by key. */
  values: Record<string, number>;
  /** The element the finding is about (segment, node, mixing point, bend…), when there is one. */
  elementId?: string;
}

export interface CheckResult {
  ok: boolean;
  findings: Finding[];
  caution: string;
}

export function finding(
  severity: Severity,
  code: string,
  rule: string,
  values: Record<string, number> = {},
  elementId?: string,
): Finding {
  return elementId === undefined ? { severity, code, rule, values } : { severity, code, rule, values, elementId };
}

/** A check passes when nothing in it fails; warnings and notes do not block. */
export function checkResult(findings: Finding[]): CheckResult {
  return { ok: findings.every((f) => f.severity !== "fail"), findings, caution: CAUTION };
}
