// The requester's editor: content saved as you type (a fetcher, debounced), measurements, photos and documents,
// and the button that sends it to the engineer (which saves the latest words first, so nothing typed is lost).
import { useCallback, useEffect, useRef, useState } from "react";
import { Form, useFetcher, useNavigation } from "react-router";
import { Button } from "~/ui/button";
import { AttachmentGallery, AttachmentPicker, type Uploaded } from "./attachment-panel";
import { Field, inputClass, issueAt, Notice, type Issues } from "./fields";
import { formatWhen } from "./format";
import { MeasurementRows } from "./measurement-rows";
import { PROVISIONS } from "./provisions";
import type { VersionView } from "./requests.server";

interface SaveReply {
  ok: boolean;
  intent: string;
  message?: string;
  issues?: Issues;
  value?: { savedAt: string; versionN: number };
}

export function RequestEditor(props: {
  version: VersionView;
  lockVersion: number;
  sendAction: "submit" | "resubmit";
  attachments: (Uploaded & { versionN: number | null })[];
  uploadUrl: string;
  maxBytes: number;
  reply?: SaveReply;
}) {
  const { version, lockVersion, sendAction } = props;
  const fetcher = useFetcher<SaveReply>();
  const remover = useFetcher<SaveReply>();
  const navigation = useNavigation();
  const form = useRef<HTMLFormElement>(null);
  const timer = useRef<ReturnType<typeof setTimeout>>(undefined);
  const [attachments, setAttachments] = useState(props.attachments);
  const [dirty, setDirty] = useState(false);
  // Files added now belong to the version being edited (the next one, once the engineer has seen this one).
  const editableN = version.submittedAt ? version.n + 1 : version.n;

  const save = useCallback(() => {
    if (!form.current) return;
    const data = new FormData(form.current);
    data.set("intent", "save");
    fetcher.submit(data, { method: "post" });
    setDirty(false);
  }, [fetcher]);
  const changed = useCallback(() => {
    setDirty(true);
    clearTimeout(timer.current);
    timer.current = setTimeout(save, 800);
  }, [save]);
  useEffect(() => () => clearTimeout(timer.current), []);

  const reply = fetcher.data ?? (navigation.state === "idle" ? props.reply : undefined);
  const issues = reply && !reply.ok ? reply.issues : undefined;
  const status = fetcher.state !== "idle" ? "Saving…" : dirty ? "Unsaved changes" : fetcher.data?.ok && fetcher.data.value ? `Saved ${formatWhen(fetcher.data.value.savedAt)}` : `Version ${version.n}`;

  return (
    <Form method="post" ref={form} onChange={changed} className="space-y-5" data-testid="request-editor">
      <input type="hidden" name="lockVersion" value={lockVersion} />
      <p className="text-sm text-ink-soft" aria-live="polite" data-testid="save-status">{status}</p>
      {reply && !reply.ok ? <Notice tone="fail">{reply.message}</Notice> : null}
      <Field label="Title" error={issueAt(issues, "title")}>
        {(p) => <input {...p} name="title" defaultValue={version.title} className={inputClass} />}
      </Field>
      <div className="grid gap-4 sm:grid-cols-[2fr_1fr]">
        <Field label="Provision" error={issueAt(issues, "provision")}>
          {(p) => (
            <select {...p} name="provision" defaultValue={version.provision} className={inputClass}>
              {PROVISIONS.map((x) => <option key={x.id} value={x.id}>{x.label}</option>)}
            </select>
          )}
        </Field>
        <Field label="Clause reference" error={issueAt(issues, "clauseRef")}>
          {(p) => <input {...p} name="clauseRef" defaultValue={version.clauseRef} className={inputClass} />}
        </Field>
      </div>
      <Field label="Site constraint" hint="What on site stops the provision from being applied." error={issueAt(issues, "siteConstraint")}>
        {(p) => <textarea {...p} name="siteConstraint" rows={4} defaultValue={version.siteConstraint} className={inputClass} />}
      </Field>
      <Field label="Proposal" hint="The alternative you propose, as you would build it." error={issueAt(issues, "proposal")}>
        {(p) => <textarea {...p} name="proposal" rows={4} defaultValue={version.proposal} className={inputClass} />}
      </Field>
      <MeasurementRows initial={version.measurements} issues={issues} onRowsChanged={changed} />
      <section className="space-y-3">
        <h3 className="text-sm font-semibold">Photos and documents</h3>
        <AttachmentGallery
          attachments={attachments}
          removable={(a) => (a as { versionN?: number | null }).versionN === undefined || (a as { versionN?: number | null }).versionN === editableN}
          onRemove={(id) => {
            setAttachments((all) => all.filter((a) => a.id !== id));
            remover.submit({ intent: "remove-attachment", attachmentId: id }, { method: "post" });
          }}
        />
        <AttachmentPicker uploadUrl={props.uploadUrl} maxBytes={props.maxBytes} onUploaded={(a) => setAttachments((all) => [...all, { ...a, versionN: editableN }])} />
      </section>
      <div className="flex flex-wrap items-center gap-3 border-t border-rule pt-4">
        <Button type="submit" name="intent" value="send" disabled={navigation.state !== "idle"}>
          {sendAction === "submit" ? "Submit to the engineer" : "Resubmit to the engineer"}
        </Button>
        <input type="hidden" name="move" value={sendAction} />
        <p className="text-sm text-ink-soft">Saved as you type. The engineer sees it once you submit.</p>
      </div>
    </Form>
  );
}
