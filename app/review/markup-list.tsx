// The markups beside the sheet: filter by author, click one to jump to it and select it.
import { useState } from "react";
import type { Item } from "./markup-state";
import type { MarkupKind } from "./markups";

export const KIND_LABELS: Record<MarkupKind, string> = {
  freehand: "Pen stroke",
  line: "Line",
  arrow: "Arrow",
  rectangle: "Rectangle",
  ellipse: "Ellipse",
  cloud: "Revision cloud",
  callout: "Text callout",
  highlighter: "Highlight",
  measure: "Measured length",
  polyline: "Pipe run",
};

export function MarkupList({ items, selected, onPick }: { items: Item[]; selected: string | null; onPick: (item: Item) => void }) {
  const [author, setAuthor] = useState("");
  const authors = [...new Map(items.map((i) => [i.author.id, i.author.name])).entries()];
  const shown = author ? items.filter((i) => i.author.id === author) : items;
  return (
    <div>
      <div className="flex items-center justify-between gap-2">
        <h3 className="text-sm font-bold">Markups ({shown.length})</h3>
        <label className="text-xs">
          <span className="sr-only">Filter by author</span>
          <select value={author} onChange={(e) => setAuthor(e.target.value)} aria-label="Filter by author" className="rounded border border-rule bg-sheet px-1 py-0.5">
            <option value="">Everyone</option>
            {authors.map(([id, name]) => <option key={id} value={id}>{name}</option>)}
          </select>
        </label>
      </div>
      {shown.length ? (
        <ul className="mt-1 max-h-[60vh] space-y-1 overflow-y-auto text-sm" data-testid="markup-list">
          {shown.slice(0, 300).map((i) => (
            <li key={i.key}>
              <button type="button" data-testid="markup-item" aria-current={i.key === selected ? "true" : undefined} onClick={() => onPick(i)}
                className={`w-full rounded border px-2 py-1 text-left ${i.key === selected ? "border-copper bg-copper-wash" : "border-rule"}`}>
                <span className="font-semibold">{KIND_LABELS[i.shape.kind]}</span>
                {i.shape.text ? <span> · {i.shape.text.slice(0, 40)}</span> : null}
                <span className="block text-xs text-ink-soft">page {i.page} · {i.author.name}{i.id ? "" : " · saving…"}</span>
              </button>
            </li>
          ))}
          {shown.length > 300 ? <li className="text-xs text-ink-soft">…and {shown.length - 300} more (filter by author to narrow).</li> : null}
        </ul>
      ) : (
        <p className="mt-1 text-sm text-ink-soft">No markups on this sheet yet.</p>
      )}
    </div>
  );
}
