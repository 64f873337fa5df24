// The conversation on a request: messages oldest first, a box that offers project members as you type "@",
// and files attached to a message (uploaded first, sent with it).
import { useEffect, useRef, useState } from "react";
import { useFetcher } from "react-router";
import { Button } from "~/ui/button";
import { AttachmentGallery, AttachmentPicker, type Uploaded } from "./attachment-panel";
import type { CommentView } from "./comments.server";
import { inputClass } from "./fields";
import { formatWhen } from "./format";
import { mentionQuery } from "./mentions";

interface Member { userId: string; name: string; email: string }

export function Thread({ projectId, requestId, comments, maxBytes }: { projectId: string; requestId: string; comments: CommentView[]; maxBytes: number }) {
  const fetcher = useFetcher<{ ok: boolean; message?: string }>();
  const search = useFetcher<{ members: Member[] }>();
  const [body, setBody] = useState("");
  const [files, setFiles] = useState<Uploaded[]>([]);
  const [query, setQuery] = useState<{ start: number; query: string } | null>(null);
  const box = useRef<HTMLTextAreaElement>(null);

  useEffect(() => {
    if (fetcher.state === "idle" && fetcher.data?.ok) {
      setBody("");
      setFiles([]);
    }
  }, [fetcher.state, fetcher.data]);
  useEffect(() => {
    if (!query) return;
    const t = setTimeout(() => search.load(`/api/projects/${projectId}/members?q=${encodeURIComponent(query.query)}`), 120);
    return () => clearTimeout(t);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [query?.query, projectId]);

  function typed(value: string, caret: number) {
    setBody(value);
    setQuery(mentionQuery(value, caret));
  }
  function pick(m: Member) {
    if (!query || !box.current) return;
    const caret = box.current.selectionStart ?? body.length;
    const next = `${body.slice(0, query.start)}@${m.name} ${body.slice(caret)}`;
    setBody(next);
    setQuery(null);
    box.current.focus();
  }
  const suggestions = query ? (search.data?.members ?? []).slice(0, 6) : [];

  return (
    <section aria-labelledby="thread-heading" className="space-y-4">
      <h2 id="thread-heading" className="text-lg font-bold">Conversation</h2>
      {comments.length === 0 ? <p className="text-sm text-ink-soft">No messages yet.</p> : null}
      <ol className="space-y-3" data-testid="comments">
        {comments.map((c) => (
          <li key={c.id} className="rounded-md border border-rule bg-paper p-3 text-sm">
            <p className="flex flex-wrap justify-between gap-2 text-ink-soft"><span className="font-semibold text-ink">{c.author.name}</span><span>{formatWhen(c.createdAt)}</span></p>
            <p className="mt-1 whitespace-pre-line">{c.body}</p>
            {c.attachments.length ? <div className="mt-2"><AttachmentGallery attachments={c.attachments} /></div> : null}
          </li>
        ))}
      </ol>
      <fetcher.Form method="post" className="space-y-2">
        <input type="hidden" name="intent" value="comment" />
        {files.map((f) => <input key={f.id} type="hidden" name="attachmentIds" value={f.id} />)}
        <label className="block text-sm font-semibold" htmlFor="comment-body">Add a message</label>
        <div className="relative">
          <textarea
            id="comment-body" ref={box} name="body" rows={3} value={body} className={inputClass}
            aria-describedby="comment-hint" aria-autocomplete="list" aria-controls={suggestions.length ? "mention-list" : undefined}
            onChange={(e) => typed(e.target.value, e.target.selectionStart ?? e.target.value.length)}
            onKeyDown={(e) => { if (e.key === "Escape") setQuery(null); }}
          />
          {suggestions.length ? (
            <ul id="mention-list" role="listbox" aria-label="Mention a member" className="absolute left-0 right-0 z-10 mt-1 divide-y divide-rule rounded-md border border-rule bg-sheet text-sm shadow-lg">
              {suggestions.map((m) => (
                <li key={m.userId} role="option" aria-selected={false}>
                  <button type="button" onClick={() => pick(m)} className="w-full px-3 py-2 text-left hover:bg-copper-wash"><span className="font-semibold">{m.name}</span> <span className="text-ink-soft">{m.email}</span></button>
                </li>
              ))}
            </ul>
          ) : null}
        </div>
        <p id="comment-hint" className="text-sm text-ink-soft">Type @ and a name to mention a project member; they get an e-mail.</p>
        {files.length ? <AttachmentGallery attachments={files} onRemove={(id) => setFiles((all) => all.filter((f) => f.id !== id))} /> : null}
        <AttachmentPicker compact uploadUrl={`/projects/${projectId}/requests/${requestId}/attachments?for=comment`} maxBytes={maxBytes} onUploaded={(a) => setFiles((all) => [...all, a])} />
        {fetcher.data && !fetcher.data.ok ? <p role="alert" className="text-sm font-medium text-fail">⚠ {fetcher.data.message}</p> : null}
        <Button type="submit" disabled={fetcher.state !== "idle" || !body.trim()}>Send message</Button>
      </fetcher.Form>
    </section>
  );
}
