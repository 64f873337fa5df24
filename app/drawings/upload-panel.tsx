// Choosing and sending PDFs: one row per file (sheet number from the file name, editable), one request per
// file with its own progress bar (XMLHttpRequest upload progress), and a plain outcome per file. The server
// checks everything again; the form only saves a wasted upload.
import { useRef, useState } from "react";
import { useRevalidator } from "react-router";
import { Button } from "~/ui/button";
import { AlertIcon, CheckIcon, ClockIcon } from "~/ui/icons";
import { formatBytes } from "./format";
import { uploadSchema } from "./schemas";
import { DISCIPLINES } from "./status";

type State = "ready" | "uploading" | "checking" | "done" | "duplicate" | "failed";
interface Item {
  key: string;
  file: File;
  sheetNumber: string;
  title: string;
  label: string;
  description: string;
  discipline: string;
  scaleText: string;
  mode: "single" | "split";
  state: State;
  sent: number;
  message: string;
  error?: string;
}

const guessSheet = (name: string) => name.replace(/\.[^.]*$/, "").toUpperCase().replace(/[^A-Z0-9 ._/-]+/g, "-").replace(/^[^A-Z0-9]+/, "").slice(0, 40);

function send(url: string, item: Item, onProgress: (sent: number) => void): Promise<{ status: number; body: { message?: string } }> {
  return new Promise((resolve) => {
    const form = new FormData();
    // Fields first: the server checks them before it takes in the file.
    for (const f of ["sheetNumber", "title", "label", "description", "discipline", "scaleText", "mode"] as const) form.append(f, item[f]);
    form.append("file", item.file, item.file.name);
    const xhr = new XMLHttpRequest();
    xhr.open("POST", url);
    xhr.setRequestHeader("Accept", "application/json");
    xhr.upload.onprogress = (e) => onProgress(e.loaded);
    xhr.onload = () => {
      let body: { message?: string } = {};
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        body = { message: `The server answered ${xhr.status} without an explanation.` };
      }
      resolve({ status: xhr.status, body });
    };
    xhr.onerror = () => resolve({ status: 0, body: { message: "The connection dropped during the upload. Nothing was stored; try again." } });
    xhr.send(form);
  });
}

export function UploadPanel({ projectId, isPlumber, maxBytes, maxPages }: { projectId: string; isPlumber: boolean; maxBytes: number; maxPages: number }) {
  const [items, setItems] = useState<Item[]>([]);
  const [busy, setBusy] = useState(false);
  const input = useRef<HTMLInputElement>(null);
  const revalidator = useRevalidator();
  const update = (key: string, patch: Partial<Item>) => setItems((all) => all.map((i) => (i.key === key ? { ...i, ...patch } : i)));

  function choose(files: FileList | null) {
    const added = [...(files ?? [])].map((file, n) => ({
      key: `${Date.now()}-${n}-${file.name}`,
      file,
      sheetNumber: guessSheet(file.name),
      title: "",
      label: "",
      description: "",
      discipline: isPlumber ? "Site sketch" : "Plumbing",
      scaleText: "",
      mode: "single" as const,
      state: "ready" as const,
      sent: 0,
      message: "",
    }));
    setItems((all) => [...all.filter((i) => i.state !== "done" && i.state !== "duplicate"), ...added]);
    if (input.current) input.current.value = "";
  }

  async function uploadAll() {
    setBusy(true);
    for (const item of items.filter((i) => i.state === "ready" || i.state === "failed")) {
      const check = uploadSchema.safeParse({ ...item, title: item.title || undefined, label: item.label || undefined });
      if (!check.success) {
        update(item.key, { state: "failed", error: check.error.issues[0]!.message, message: "" });
        continue;
      }
      if (item.file.size > maxBytes) {
        update(item.key, { state: "failed", error: `Larger than ${formatBytes(maxBytes)}, the most Countersign accepts.`, message: "" });
        continue;
      }
      update(item.key, { state: "uploading", sent: 0, error: undefined, message: "" });
      const res = await send(`/projects/${projectId}/drawings/upload`, item, (sent) =>
        update(item.key, sent >= item.file.size ? { sent, state: "checking" } : { sent }),
      );
      if (res.status === 201) update(item.key, { state: "done", message: res.body.message ?? "Stored." });
      else if (res.status === 409 && /Already in the register/.test(res.body.message ?? "")) update(item.key, { state: "duplicate", message: res.body.message ?? "" });
      else update(item.key, { state: "failed", error: res.body.message ?? "The upload failed.", message: "" });
    }
    setBusy(false);
    revalidator.revalidate();
  }

  return (
    <section aria-labelledby="upload-heading" className="rounded-lg border border-rule bg-sheet p-5 shadow-sm">
      <h2 id="upload-heading" className="text-lg font-bold">Upload sheets</h2>
      <p className="mt-1 text-sm text-ink-soft">
        PDF only, up to {formatBytes(maxBytes)} and {maxPages} pages per file.{" "}
        {isPlumber ? "Your uploads enter the register as issued for review." : "Uploads enter as drafts until you issue them."} A new sheet
        number creates a sheet; an existing one adds a revision to it.
      </p>
      <label className="mt-4 inline-flex cursor-pointer items-center gap-2 rounded-md border border-dashed border-copper px-4 py-3 text-sm font-semibold text-copper-deep hover:bg-copper-wash">
        Choose PDF files…
        <input ref={input} type="file" accept="application/pdf,.pdf" multiple className="sr-only" onChange={(e) => choose(e.target.files)} data-testid="upload-input" />
      </label>
      {items.length ? (
        <ul className="mt-4 space-y-4">
          {items.map((item) => (
            <li key={item.key} className="rounded-md border border-rule p-3" data-testid="upload-item">
              <p className="flex flex-wrap items-center justify-between gap-2 text-sm font-semibold">
                <span className="break-all">{item.file.name}</span>
                <span className="text-ink-soft">{formatBytes(item.file.size)}</span>
              </p>
              {item.state === "ready" || item.state === "failed" ? (
                <div className="mt-3 grid gap-3 text-sm sm:grid-cols-3">
                  <Field label="Sheet number" value={item.sheetNumber} onChange={(v) => update(item.key, { sheetNumber: v })} />
                  <Field label="Title (new sheets)" value={item.title} onChange={(v) => update(item.key, { title: v })} />
                  <Field label="Revision (blank = next P)" value={item.label} onChange={(v) => update(item.key, { label: v })} />
                  <label className="flex flex-col gap-1 font-semibold">
                    Discipline
                    <select value={item.discipline} onChange={(e) => update(item.key, { discipline: e.target.value })} className="rounded-md border border-rule bg-sheet px-2 py-1.5 font-normal">
                      {DISCIPLINES.map((d) => <option key={d}>{d}</option>)}
                    </select>
                  </label>
                  <Field label="Scale(s) on the sheet" value={item.scaleText} onChange={(v) => update(item.key, { scaleText: v })} />
                  <label className="flex flex-col gap-1 font-semibold">
                    A set of several pages
                    <select value={item.mode} onChange={(e) => update(item.key, { mode: e.target.value as Item["mode"] })} className="rounded-md border border-rule bg-sheet px-2 py-1.5 font-normal">
                      <option value="single">Keep as one sheet</option>
                      <option value="split">One sheet per page</option>
                    </select>
                  </label>
                  <label className="flex flex-col gap-1 font-semibold sm:col-span-3">
                    What changed
                    <textarea rows={2} value={item.description} onChange={(e) => update(item.key, { description: e.target.value })} className="rounded-md border border-rule bg-sheet px-2 py-1.5 font-normal" />
                  </label>
                </div>
              ) : null}
              <Outcome item={item} />
            </li>
          ))}
        </ul>
      ) : null}
      {items.some((i) => i.state === "ready" || i.state === "failed") ? (
        <Button type="button" className="mt-4" onClick={uploadAll} disabled={busy}>{busy ? "Uploading…" : "Upload"}</Button>
      ) : null}
    </section>
  );
}

function Field({ label, value, onChange }: { label: string; value: string; onChange: (v: string) => void }) {
  return (
    <label className="flex flex-col gap-1 font-semibold">
      {label}
      <input value={value} onChange={(e) => onChange(e.target.value)} className="rounded-md border border-rule bg-sheet px-2 py-1.5 font-normal" />
    </label>
  );
}

function Outcome({ item }: { item: Item }) {
  if (item.state === "uploading" || item.state === "checking") {
    const pct = Math.round((item.sent / Math.max(1, item.file.size)) * 100);
    return (
      <div className="mt-3 text-sm" role="status">
        <progress max={item.file.size} value={item.sent} className="h-2 w-full accent-copper" aria-label={`Upload of ${item.file.name}`} />
        <p className="mt-1 flex items-center gap-1.5 text-ink-soft">
          <ClockIcon /> {item.state === "checking" ? "Sent; checking the PDF…" : `Uploading… ${pct}% (${formatBytes(item.sent)} of ${formatBytes(item.file.size)})`}
        </p>
      </div>
    );
  }
  if (item.state === "done") return <p className="mt-2 flex items-center gap-1.5 text-sm font-semibold text-ok" role="status"><CheckIcon /> {item.message}</p>;
  if (item.state === "duplicate") return <p className="mt-2 flex items-center gap-1.5 text-sm font-semibold text-warn" role="status"><AlertIcon /> {item.message}</p>;
  if (item.state === "failed") return <p className="mt-2 flex items-center gap-1.5 text-sm font-semibold text-fail" role="alert"><AlertIcon /> {item.error}</p>;
  return null;
}
