// The compare screen's visual part: the overlay image with numbered boxes around changed regions, a legend
// that tells removed from added by pattern and word as well as colour, and a list to step through.
import { useEffect, useRef, useState } from "react";
import type { VisualCompare, VisualRegion } from "./compare.server";
import type { TextDiff } from "./text-diff";

const KIND_WORDS = { added: "Added", removed: "Removed", changed: "Changed" } as const;
const STROKE = { added: "#34547a", removed: "#b25622", changed: "#5a5248" } as const;
const DASH = { added: undefined, removed: "6 4", changed: "2 3" } as const;

export function Legend() {
  return (
    <ul className="flex flex-wrap gap-4 text-sm" aria-label="Legend">
      <li className="flex items-center gap-2">
        <svg width="28" height="12" aria-hidden><line x1="0" y1="6" x2="28" y2="6" stroke={STROKE.removed} strokeWidth="3" strokeDasharray="5 3" /></svg>
        <span><b>− Removed</b> (copper, broken line): in the older revision only</span>
      </li>
      <li className="flex items-center gap-2">
        <svg width="28" height="12" aria-hidden><line x1="0" y1="6" x2="28" y2="6" stroke={STROKE.added} strokeWidth="3" /></svg>
        <span><b>+ Added</b> (blue-slate, solid line): in the newer revision only</span>
      </li>
      <li className="flex items-center gap-2">
        <svg width="28" height="12" aria-hidden><line x1="0" y1="6" x2="28" y2="6" stroke="#c4beb4" strokeWidth="3" /></svg>
        <span>Unchanged (faint)</span>
      </li>
    </ul>
  );
}

export function Overlay({ visual, src }: { visual: VisualCompare; src: string }) {
  const [active, setActive] = useState(visual.regions.length ? 0 : -1);
  const boxes = useRef<(SVGGElement | null)[]>([]);
  const regions = visual.regions;
  const step = (d: number) => setActive((a) => (regions.length ? (a + d + regions.length) % regions.length : -1));
  useEffect(() => {
    if (active >= 0) boxes.current[active]?.scrollIntoView({ block: "center", inline: "center", behavior: "smooth" });
  }, [active]);

  return (
    <div className="grid gap-4 lg:grid-cols-[1fr_18rem]">
      <div role="region" aria-label="Overlay of the two revisions" tabIndex={0} className="max-h-[75vh] overflow-auto rounded-md border border-rule bg-white">
        <div className="relative" style={{ width: "100%", minWidth: 600 }}>
          <img src={src} alt={`Overlay of the two revisions, page ${visual.page}`} className="block w-full" data-testid="compare-overlay" />
          <svg viewBox={`0 0 ${visual.widthPt} ${visual.heightPt}`} className="absolute inset-0 h-full w-full" aria-hidden>
            {regions.map((r, i) => (
              <g key={r.n} ref={(el) => { boxes.current[i] = el; }}>
                <rect x={r.xPt - 4} y={r.yPt - 4} width={r.wPt + 8} height={r.hPt + 8} fill={i === active ? "rgba(154,74,32,0.08)" : "none"}
                  stroke={STROKE[r.kind]} strokeWidth={i === active ? 3 : 1.5} strokeDasharray={DASH[r.kind]} vectorEffect="non-scaling-stroke" />
                <text x={r.xPt - 4} y={r.yPt - 8} fontSize={Math.max(10, visual.widthPt / 120)} fontWeight="700" fill={STROKE[r.kind]}>
                  {r.n} {r.kind === "added" ? "+" : r.kind === "removed" ? "−" : "±"}
                </text>
              </g>
            ))}
          </svg>
        </div>
      </div>
      <div>
        <div className="mb-2 flex items-center justify-between gap-2">
          <h3 className="font-bold">Changed regions ({regions.length})</h3>
          <span className="flex gap-1">
            <button type="button" className="rounded border border-rule px-2 py-1 text-sm" onClick={() => step(-1)} disabled={!regions.length} aria-label="Previous change">↑</button>
            <button type="button" className="rounded border border-rule px-2 py-1 text-sm" onClick={() => step(1)} disabled={!regions.length} aria-label="Next change">↓</button>
          </span>
        </div>
        {regions.length ? (
          <ol className="max-h-[65vh] space-y-1 overflow-y-auto text-sm" data-testid="compare-regions">
            {regions.map((r, i) => (
              <li key={r.n}>
                <button type="button" onClick={() => setActive(i)} aria-current={i === active ? "true" : undefined}
                  className={`w-full rounded border px-2 py-1.5 text-left ${i === active ? "border-copper bg-copper-wash" : "border-rule"}`}>
                  <RegionLine r={r} />
                </button>
              </li>
            ))}
          </ol>
        ) : (
          <p className="text-sm text-ink-soft" role="status">No visual change on this page.</p>
        )}
      </div>
    </div>
  );
}

function RegionLine({ r }: { r: VisualRegion }) {
  return (
    <span>
      <b>{r.n}. {KIND_WORDS[r.kind]}</b> <span className="text-ink-soft">at {Math.round(r.xPt)}, {Math.round(r.yPt)} pt · {Math.round(r.wPt)} × {Math.round(r.hPt)} pt</span>
    </span>
  );
}

export function TextChanges({ diff }: { diff: TextDiff }) {
  if (!diff.addedWords.length && !diff.removedWords.length) return <p className="text-sm text-ink-soft" role="status">The text on this page is the same in both revisions.</p>;
  return (
    <div>
      <p className="mb-2 text-sm text-ink-soft">{diff.removedWords.length} word(s) removed, {diff.addedWords.length} added.</p>
      <p className="max-h-80 overflow-y-auto rounded-md border border-rule bg-white p-3 text-sm leading-7" data-testid="compare-text">
        {diff.parts.map((p, i) =>
          p.added ? (
            <ins key={i} className="rounded bg-[#e3e9f1] px-0.5 text-[#34547a] underline decoration-2 underline-offset-4"><span className="sr-only">added: </span>+{p.value}</ins>
          ) : p.removed ? (
            <del key={i} className="rounded bg-copper-wash px-0.5 text-copper-deep decoration-2"><span className="sr-only">removed: </span>−{p.value}</del>
          ) : (
            <span key={i}>{p.value}</span>
          ),
        )}
      </p>
    </div>
  );
}
