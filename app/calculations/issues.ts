// Owns the one shape every rejected calculation input takes, in the browser and on the server alike:
// `{ path, message }`, the path pointing into the input so the message can stand beside its field.
import type { z } from "zod";

export type IssuePath = (string | number)[];

export interface InputIssue {
  path: IssuePath;
  message: string;
}

export function fromZod(error: z.ZodError): InputIssue[] {
  return error.issues.map((i) => ({ path: i.path.filter((p): p is string | number => typeof p !== "symbol"), message: i.message }));
}

export const pathKey = (path: IssuePath) => path.join(".");

/** Issues grouped by their path (joined with dots), for looking up the ones beside a field. */
export function issuesByPath(issues: readonly InputIssue[]): Map<string, string[]> {
  const map = new Map<string, string[]>();
  for (const i of issues) {
    const key = pathKey(i.path);
    const list = map.get(key) ?? [];
    if (!list.includes(i.message)) list.push(i.message);
    map.set(key, list);
  }
  return map;
}

/** Issues at or below a path prefix (a table row collects every issue about its element). */
export function issuesUnder(issues: readonly InputIssue[], prefix: IssuePath): InputIssue[] {
  return issues.filter((i) => prefix.every((p, k) => i.path[k] === p));
}
