// A version of a request as the reader sees it, and what changed since the version before.
import { AttachmentGallery } from "./attachment-panel";
import type { AttachmentView, VersionView } from "./requests.server";
import { provisionLabel } from "./provisions";
import { formatMeasurement } from "./measurements";
import { formatWhen } from "./format";
import type { VersionDiff } from "./versions";

export function RequestContent({ version, attachments }: { version: VersionView; attachments: AttachmentView[] }) {
  return (
    <div className="space-y-5">
      <dl className="grid gap-x-6 gap-y-3 text-sm sm:grid-cols-[10rem_1fr]">
        <dt className="font-semibold text-ink-soft">Provision</dt>
        <dd>{provisionLabel(version.provision)}{version.clauseRef ? <span className="text-ink-soft"> · {version.clauseRef}</span> : null}</dd>
        <dt className="font-semibold text-ink-soft">Site constraint</dt>
        <dd className="whitespace-pre-line">{version.siteConstraint || "—"}</dd>
        <dt className="font-semibold text-ink-soft">Proposal</dt>
        <dd className="whitespace-pre-line">{version.proposal || "—"}</dd>
        <dt className="font-semibold text-ink-soft">Version</dt>
        <dd>{version.n}{version.submittedAt ? `, sent ${formatWhen(version.submittedAt)}` : ", not yet sent"}</dd>
      </dl>
      <div>
        <h3 className="mb-2 text-sm font-semibold">Measurements</h3>
        {version.measurements.length ? (
          <table className="w-full max-w-lg text-sm" data-testid="measurements">
            <tbody className="divide-y divide-rule">
              {version.measurements.map((m, i) => (
                <tr key={i}><td className="py-1.5 pr-3">{m.name}</td><td className="py-1.5 text-right font-semibold tabular-nums">{formatMeasurement(m)}</td></tr>
              ))}
            </tbody>
          </table>
        ) : <p className="text-sm text-ink-soft">None recorded.</p>}
      </div>
      <div>
        <h3 className="mb-2 text-sm font-semibold">Photos and documents</h3>
        <AttachmentGallery attachments={attachments.filter((a) => a.versionN !== null && a.versionN <= version.n)} />
      </div>
    </div>
  );
}

export function VersionDiffView({ diff }: { diff: VersionDiff }) {
  return (
    <section aria-labelledby="diff-heading" className="space-y-3" data-testid="version-diff">
      <h3 id="diff-heading" className="text-sm font-semibold">What changed from version {diff.from} to {diff.to}</h3>
      {diff.unchanged ? <p className="text-sm text-ink-soft">Nothing in the content changed.</p> : null}
      {diff.fields.map((f) => (
        <div key={f.field} className="text-sm">
          <p className="font-semibold text-ink-soft">{f.label}</p>
          <p className="whitespace-pre-line rounded-md border border-rule bg-paper p-2">
            {f.parts.map((p, i) =>
              p.added ? <ins key={i} className="bg-ok/10 font-semibold text-ok no-underline"><span className="sr-only">[added] </span>{p.value}</ins>
              : p.removed ? <del key={i} className="bg-fail/10 text-fail"><span className="sr-only">[removed] </span>{p.value}</del>
              : <span key={i}>{p.value}</span>,
            )}
          </p>
        </div>
      ))}
      {diff.measurements.length ? (
        <ul className="text-sm" data-testid="measurement-changes">
          {diff.measurements.map((m, i) => (
            <li key={i}>
              {m.change === "added" ? `+ Added ${m.name}: ${m.after}` : m.change === "removed" ? `− Removed ${m.name} (was ${m.before})` : `~ ${m.name}: ${m.before} → ${m.after}`}
            </li>
          ))}
        </ul>
      ) : null}
    </section>
  );
}
