// A request's state as an icon and a word (never by colour alone).
import { AlertIcon, CheckIcon, ClockIcon, PlusIcon } from "~/ui/icons";
import { STATE_LABELS, type RequestState } from "./workflow";

const ICONS: Record<RequestState, typeof CheckIcon> = {
  draft: PlusIcon,
  submitted: ClockIcon,
  in_review: ClockIcon,
  info_requested: AlertIcon,
  resubmitted: ClockIcon,
  decided: CheckIcon,
  withdrawn: AlertIcon,
  superseded: AlertIcon,
  closed: CheckIcon,
};

export function StateBadge({ state }: { state: RequestState }) {
  const Icon = ICONS[state];
  return (
    <span className="inline-flex items-center gap-1.5 whitespace-nowrap rounded-full border border-rule bg-paper px-2.5 py-0.5 text-xs font-semibold text-ink" data-state={state}>
      <Icon className="text-copper" />
      {STATE_LABELS[state]}
    </span>
  );
}
