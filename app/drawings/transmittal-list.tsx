// Transmittals in a list: newest first, what was new to the reader marked with an icon and the word "New".
import { Link } from "react-router";
import { MailIcon } from "~/ui/icons";
import { formatDate } from "./format";
import { STATUS_LABELS } from "./status";
import type { TransmittalSummary } from "./transmittals.server";

export function TransmittalList({ transmittals, projectId }: { transmittals: TransmittalSummary[]; projectId: string }) {
  if (!transmittals.length) return <p className="text-ink-soft">No transmittals yet.</p>;
  return (
    <ul className="divide-y divide-rule text-sm" data-testid="transmittals">
      {transmittals.map((t) => (
        <li key={t.id} className="py-3">
          <p className="flex flex-wrap items-center gap-2">
            <Link to={`/projects/${projectId}/transmittals/${t.id}`} className="font-bold text-copper-deep underline-offset-4 hover:underline">Transmittal {t.number}</Link>
            {t.isNew ? <span className="inline-flex items-center gap-1 rounded-full border border-copper px-2 py-0.5 text-xs font-semibold text-copper-deep" data-testid="new"><MailIcon /> New</span> : null}
            <span className="text-ink-soft">{STATUS_LABELS[t.issuedStatus]} · {formatDate(t.createdAt)} · by {t.issuedBy}</span>
          </p>
          <p className="mt-1">{t.items.map((i) => `${i.sheetNumber} ${i.label}`).join(", ")}</p>
          <p className="mt-1 text-ink-soft">{t.reason}</p>
        </li>
      ))}
    </ul>
  );
}
