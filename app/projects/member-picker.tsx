// Search-as-you-type over a project's members, read from the JSON API on the client.
import { useEffect, useId, useState } from "react";
import { useFetcher } from "react-router";
import { ROLE_LABELS, type Role } from "./permissions";

interface ApiMember { id: string; name: string; email: string; role: Role }

export function MemberPicker({ projectId, label = "Find a member" }: { projectId: string; label?: string }) {
  const fetcher = useFetcher<{ members: ApiMember[] }>();
  const [q, setQ] = useState("");
  const id = useId();
  useEffect(() => {
    const timer = setTimeout(() => {
      fetcher.load(`/api/projects/${projectId}/members?q=${encodeURIComponent(q)}`);
    }, 150);
    return () => clearTimeout(timer);
    // fetcher is stable enough for this purpose; re-run only when the query changes.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [q, projectId]);
  const members = fetcher.data?.members ?? [];
  return (
    <div>
      <label htmlFor={id} className="block text-sm font-semibold">{label}</label>
      <input
        id={id}
        type="search"
        value={q}
        onChange={(e) => setQ(e.target.value)}
        placeholder="Name or e-mail"
        aria-controls={`${id}-results`}
        className="mt-1 block w-full rounded-md border border-rule bg-sheet px-3 py-2.5 focus:border-copper focus:outline-none focus:ring-2 focus:ring-copper/30"
      />
      <ul id={`${id}-results`} aria-live="polite" aria-busy={fetcher.state !== "idle"} className="mt-2 divide-y divide-rule rounded-md border border-rule bg-sheet text-sm" data-testid="member-picker-results">
        {members.length === 0 ? (
          <li className="px-3 py-2 text-ink-soft">{fetcher.state === "idle" ? "No member matches." : "Searching…"}</li>
        ) : (
          members.map((m) => (
            <li key={m.id} className="px-3 py-2">
              <p className="flex flex-wrap justify-between gap-x-2"><span className="font-semibold">{m.name}</span><span className="text-ink-soft">{ROLE_LABELS[m.role]}</span></p>
              <p className="break-all text-ink-soft">{m.email}</p>
            </li>
          ))
        )}
      </ul>
    </div>
  );
}
