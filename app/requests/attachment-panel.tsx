// Adding photos and documents: the phone's camera or its files, one upload per file with its own progress bar
// (XMLHttpRequest upload progress), and a plain outcome per file. The server checks everything again.
import { useRef, useState } from "react";
import { AlertIcon, CheckIcon, ClockIcon } from "~/ui/icons";
import { formatBytes } from "./format";

export interface Uploaded {
  id: string;
  filename: string;
  url: string;
  thumbUrl: string | null;
  isImage: boolean;
  byteSize: number;
}

interface Item {
  key: string;
  name: string;
  size: number;
  sent: number;
  state: "uploading" | "done" | "failed";
  message?: string;
}

function send(url: string, file: File, onProgress: (sent: number) => void): Promise<{ status: number; body: { message?: string; attachment?: Uploaded } }> {
  return new Promise((resolve) => {
    const form = new FormData();
    form.append("file", file, file.name);
    const xhr = new XMLHttpRequest();
    xhr.open("POST", url);
    xhr.setRequestHeader("Accept", "application/json");
    xhr.upload.onprogress = (e) => onProgress(e.loaded);
    xhr.onload = () => {
      let body: { message?: string; attachment?: Uploaded } = {};
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

export function AttachmentPicker({ uploadUrl, maxBytes, onUploaded, compact = false }: { uploadUrl: string; maxBytes: number; onUploaded: (a: Uploaded) => void; compact?: boolean }) {
  const [items, setItems] = useState<Item[]>([]);
  const camera = useRef<HTMLInputElement>(null);
  const files = useRef<HTMLInputElement>(null);
  const update = (key: string, patch: Partial<Item>) => setItems((all) => all.map((i) => (i.key === key ? { ...i, ...patch } : i)));

  async function upload(list: FileList | null) {
    const chosen = [...(list ?? [])];
    if (camera.current) camera.current.value = "";
    if (files.current) files.current.value = "";
    for (const file of chosen) {
      const key = `${Date.now()}-${file.name}-${Math.random()}`;
      setItems((all) => [...all.filter((i) => i.state === "uploading"), { key, name: file.name, size: file.size, sent: 0, state: "uploading" }]);
      if (file.size > maxBytes) {
        update(key, { state: "failed", message: `“${file.name}” is larger than ${formatBytes(maxBytes)}, the most Countersign accepts. Take the photo at a lower resolution.` });
        continue;
      }
      const res = await send(uploadUrl, file, (sent) => update(key, { sent }));
      if (res.status === 201 && res.body.attachment) {
        update(key, { state: "done", message: `Attached ${file.name}.` });
        onUploaded(res.body.attachment);
      } else update(key, { state: "failed", message: res.body.message ?? "The upload failed." });
    }
  }

  const pick = "inline-flex cursor-pointer items-center gap-2 rounded-md border border-dashed border-copper px-4 py-3 text-sm font-semibold text-copper-deep hover:bg-copper-wash";
  return (
    <div>
      <div className="flex flex-wrap gap-2">
        <label className={pick}>
          {compact ? "Photo" : "Take a photo"}
          <input ref={camera} type="file" accept="image/*" capture="environment" className="sr-only" onChange={(e) => upload(e.target.files)} data-testid="camera-input" />
        </label>
        <label className={pick}>
          {compact ? "File" : "Choose photos or documents…"}
          <input ref={files} type="file" accept="image/jpeg,image/png,image/webp,application/pdf" multiple className="sr-only" onChange={(e) => upload(e.target.files)} data-testid="file-input" />
        </label>
      </div>
      {!compact ? <p className="mt-2 text-sm text-ink-soft">Photos (JPEG, PNG, WebP) and PDF documents, up to {formatBytes(maxBytes)} each.</p> : null}
      <ul className="mt-2 space-y-2">
        {items.map((i) => (
          <li key={i.key} className="text-sm" data-testid="upload-item">
            {i.state === "uploading" ? (
              <div role="status">
                <progress max={i.size} value={i.sent} className="h-2 w-full accent-copper" aria-label={`Upload of ${i.name}`} />
                <p className="mt-1 flex items-center gap-1.5 text-ink-soft"><ClockIcon /> Uploading {i.name}… {Math.round((i.sent / Math.max(1, i.size)) * 100)}%</p>
              </div>
            ) : i.state === "done" ? (
              <p className="flex items-center gap-1.5 font-semibold text-ok" role="status"><CheckIcon /> {i.message}</p>
            ) : (
              <p className="flex items-center gap-1.5 font-semibold text-fail" role="alert"><AlertIcon /> {i.message}</p>
            )}
          </li>
        ))}
      </ul>
    </div>
  );
}

export function AttachmentGallery({ attachments, onRemove, removable }: { attachments: Uploaded[]; onRemove?: (id: string) => void; removable?: (a: Uploaded) => boolean }) {
  if (!attachments.length) return <p className="text-sm text-ink-soft">No photos or documents.</p>;
  return (
    <ul className="grid grid-cols-2 gap-3 sm:grid-cols-4" data-testid="attachments">
      {attachments.map((a) => (
        <li key={a.id} className="overflow-hidden rounded-md border border-rule bg-paper text-xs">
          <a href={a.url} target="_blank" rel="noreferrer" className="block">
            {a.thumbUrl ? <img src={a.thumbUrl} alt={a.filename} className="aspect-[4/3] w-full object-cover" loading="lazy" /> : <span className="flex aspect-[4/3] items-center justify-center font-semibold text-copper-deep">PDF</span>}
            <span className="block truncate px-2 py-1">{a.filename} · {formatBytes(a.byteSize)}</span>
          </a>
          {onRemove && (!removable || removable(a)) ? <button type="button" onClick={() => onRemove(a.id)} className="w-full border-t border-rule px-2 py-1 text-left text-fail hover:bg-fail/5">Remove<span className="sr-only"> {a.filename}</span></button> : null}
        </li>
      ))}
    </ul>
  );
}
