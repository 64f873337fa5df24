// Who a comment mentions: "@Full Name" or "@e-mail" of a project member, matched case-insensitively and only
// as a whole name (so "@Ann" does not mention "Anneliese"). Pure: the server resolves, the thread highlights.

export interface Mentionable {
  userId: string;
  name: string;
  email: string;
}

const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");

export function extractMentions(body: string, members: readonly Mentionable[]): string[] {
  const found = new Set<string>();
  for (const m of members) {
    for (const handle of [m.name, m.email]) {
      if (!handle.trim()) continue;
      if (new RegExp(`(^|[^\\w@])@${escape(handle)}(?![\\w@.-]*\\w)`, "i").test(body)) found.add(m.userId);
    }
  }
  return [...found];
}

/** The word being typed after an "@" at the caret, if any: what the autocomplete searches for. */
export function mentionQuery(text: string, caret: number): { start: number; query: string } | null {
  const before = text.slice(0, caret);
  const m = before.match(/(^|\s)@([^\s@]{0,40}(?: [^\s@]{0,40})?)$/);
  if (!m) return null;
  return { start: caret - m[2]!.length - 1, query: m[2]! };
}
