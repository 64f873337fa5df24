import { Link } from "react-router";
import type { Route } from "./+types/projects.$projectId.transmittals.$transmittalId";
import { formatDate } from "~/drawings/format";
import { forPage } from "~/drawings/http.server";
import { STATUS_LABELS } from "~/drawings/status";
import { StatusBadge } from "~/drawings/status-badge";
import { openTransmittal } from "~/drawings/transmittals.server";
import { can } from "~/projects/permissions";
import { requireProjectAction } from "~/projects/projects.server";
import { CheckIcon, ClockIcon } from "~/ui/icons";
import { Panel } from "~/ui/shell";

export async function loader({ context, request, params }: Route.LoaderArgs) {
  const { project, role, user } = requireProjectAction(context, request, "drawings.view");
  const transmittal = await forPage(() => openTransmittal(project.id, user.id, params.transmittalId, can(role, "drawings.issue")));
  return { projectId: project.id, transmittal };
}

export default function TransmittalPage({ loaderData }: Route.ComponentProps) {
  const { transmittal: t, projectId } = loaderData;
  return (
    <div className="max-w-3xl space-y-6">
      <p className="text-sm"><Link to={`/projects/${projectId}/transmittals`} className="underline underline-offset-4">All transmittals</Link></p>
      <Panel>
        <h2 className="text-2xl font-bold">Transmittal {t.number}</h2>
        <p className="mt-1 text-sm text-ink-soft">Issued by {t.issuedBy}, {formatDate(t.createdAt)} · {STATUS_LABELS[t.issuedStatus]}</p>
        <p className="mt-4 whitespace-pre-line">{t.reason}</p>
        <h3 className="mt-6 font-bold">Revisions</h3>
        <ul className="mt-2 divide-y divide-rule text-sm">
          {t.items.map((i) => (
            <li key={i.revisionId} className="flex flex-wrap items-center gap-3 py-2">
              <Link to={`/projects/${projectId}/drawings/${i.drawingId}?rev=${i.revisionId}`} className="font-semibold text-copper-deep underline-offset-4 hover:underline">{i.sheetNumber} revision {i.label}</Link>
              <span>{i.title}</span>
              <StatusBadge status={i.status} />
            </li>
          ))}
        </ul>
        <h3 className="mt-6 font-bold">Sent to</h3>
        <ul className="mt-2 space-y-1 text-sm">
          {t.recipients.map((r) => (
            <li key={r.name} className="flex items-center gap-2">
              {r.seenAt ? <CheckIcon className="text-ok" /> : <ClockIcon className="text-ink-soft" />}
              {r.name} — {r.seenAt ? `seen ${formatDate(r.seenAt)}` : "not opened yet"}{r.mailedAt ? "" : " · e-mail pending"}
            </li>
          ))}
        </ul>
      </Panel>
    </div>
  );
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Transmittal ${data?.transmittal.number ?? ""} · Countersign` }];
