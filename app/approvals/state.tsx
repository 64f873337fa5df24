// An approval's state as an icon and a word (never by colour alone).
import { AlertIcon, CheckIcon, ClockIcon } from "../ui/icons";

const STATES = {
  current: { label: "Current", Icon: CheckIcon },
  needs_reapproval: { label: "Needs re-approval", Icon: AlertIcon },
  superseded: { label: "Superseded", Icon: ClockIcon },
  withdrawn: { label: "Withdrawn", Icon: AlertIcon },
} as const;

export function ApprovalState({ state }: { state: string }) {
  const s = STATES[state as keyof typeof STATES] ?? STATES.superseded;
  return (
    <span className="inline-flex items-center gap-1.5 whitespace-nowrap rounded-full border border-rule bg-paper px-2.5 py-0.5 text-xs font-semibold text-ink" data-state={state}>
      <s.Icon className="text-copper" /> {s.label}
    </span>
  );
}
