// Revision status and processing state, each shown as an icon and a word (never colour alone).
import type { ReactNode } from "react";
import { AlertIcon, CheckIcon, ClockIcon } from "~/ui/icons";
import { PROCESSING_LABELS, STATUS_LABELS, type ProcessingState, type RevisionStatus } from "./status";

function Glyph({ children }: { children: ReactNode }) {
  return (
    <svg viewBox="0 0 20 20" width="1em" height="1em" fill="none" stroke="currentColor" strokeWidth={1.6} strokeLinecap="round" strokeLinejoin="round" aria-hidden>
      {children}
    </svg>
  );
}

const ICONS: Record<RevisionStatus, ReactNode> = {
  draft: <Glyph><path d="M4 16l1-4 8-8 3 3-8 8-4 1z" /></Glyph>,
  for_review: <Glyph><circle cx="10" cy="10" r="2.5" /><path d="M2.5 10S5.5 4.5 10 4.5 17.5 10 17.5 10 14.5 15.5 10 15.5 2.5 10 2.5 10z" /></Glyph>,
  accepted: <CheckIcon />,
  superseded: <Glyph><rect x="3" y="6" width="10" height="11" rx="1" /><path d="M7 3h10v11" /></Glyph>,
  withdrawn: <Glyph><circle cx="10" cy="10" r="7" /><path d="M5 15 15 5" /></Glyph>,
};

const TONE: Record<RevisionStatus, string> = {
  draft: "border-rule text-ink-soft",
  for_review: "border-warn/40 text-warn",
  accepted: "border-ok/40 text-ok",
  superseded: "border-rule text-ink-soft line-through decoration-1",
  withdrawn: "border-fail/30 text-fail",
};

export function StatusBadge({ status }: { status: RevisionStatus }) {
  return (
    <span className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-full border bg-sheet px-2 py-0.5 text-xs font-semibold ${TONE[status]}`} data-status={status}>
      {ICONS[status]}
      {STATUS_LABELS[status]}
    </span>
  );
}

export function ProcessingBadge({ state, done, total, error }: { state: ProcessingState; done?: number; total?: number; error?: string | null }) {
  if (state === "done") return null;
  const icon = state === "failed" ? <AlertIcon /> : <ClockIcon className={state === "running" ? "animate-spin [animation-duration:3s]" : ""} />;
  return (
    <span className={`inline-flex flex-col gap-1 text-xs font-semibold ${state === "failed" ? "text-fail" : "text-ink-soft"}`} role="status" data-processing={state}>
      <span className="inline-flex items-center gap-1.5">
        {icon}
        {PROCESSING_LABELS[state]}
        {state === "running" && total ? ` · page ${Math.min((done ?? 0) + 1, total)} of ${total}` : null}
      </span>
      {state === "running" && total ? <progress className="h-1.5 w-28 accent-copper" max={total} value={done ?? 0} aria-label="Processing progress" /> : null}
      {error ? <span className="font-normal">{error}</span> : null}
    </span>
  );
}
