// The review sheet (browser only): one page of a revision through react-pdf with a Konva stage on top in PDF
// points (layer scale = zoom). Engineers draw, select, move, resize and remove markups; everyone else sees them
// read-only, and the requester places numbered pins while the request is editable. Every change is saved
// through the API at once (optimistic); a markup someone else changed first is reloaded with a notice.
import type Konva from "konva";
import { useCallback, useEffect, useMemo, useReducer, useRef, useState } from "react";
import { Circle, Group, Layer, Shape, Stage, Text, Transformer } from "react-konva";
import { Document, Page, pdfjs } from "react-pdf";
import workerUrl from "pdfjs-dist/build/pdf.worker.min.mjs?url";
import type { PinView } from "../requests/pins.server";
import { drawMarkup } from "./draw-markup";
import { clampToPage, emptyState, hitTest, nextEffect, reduce, thin, toolForKey, TOOLS, transformPoints, type Command, type Item, type Tool } from "./markup-state";
import type { MarkupShape } from "./markups";
import type { MarkupView } from "./markups.server";
import { calibrate, formatMetres, labelMetres, lengthLabel, metresPerPtAtScale, parseScale, pathLengthPt } from "./measure";
import { MarkupList } from "./markup-list";

if (typeof window !== "undefined" && !pdfjs.GlobalWorkerOptions.workerPort) {
  pdfjs.GlobalWorkerOptions.workerPort = new Worker(workerUrl, { type: "module" });
}

export const COLOURS = [
  { name: "Copper", value: "#9a4a20" },
  { name: "Ink", value: "#1f2a33" },
  { name: "Green", value: "#2f6b3a" },
  { name: "Blue", value: "#1f5d8a" },
  { name: "Amber", value: "#c58a00" },
];
const WEIGHTS = [0.75, 1.5, 3];
const ZOOMS = [0.5, 0.75, 1, 1.5, 2, 3];

export interface CanvasProps {
  apiBase: string;
  calculatorUrl: string;
  revision: { id: string; scaleText: string | null; pages: { widthPt: number; heightPt: number }[]; fileUrl: string };
  markups: MarkupView[];
  pins: PinView[];
  me: { id: string; name: string };
  canMarkUp: boolean;
  canPin: boolean;
}

const toItem = (m: MarkupView): Item => ({ key: m.id, id: m.id, version: m.version, page: m.page, shape: m.shape, author: m.author });
let keys = 0;
const newKey = () => `new-${Date.now().toString(36)}-${keys++}`;

async function send(url: string, method: string, body?: unknown) {
  const res = await fetch(url, { method, headers: { accept: "application/json", ...(body ? { "content-type": "application/json" } : {}) }, body: body ? JSON.stringify(body) : undefined });
  const json = await res.json().catch(() => ({ message: "The server's answer could not be read." }));
  return { status: res.status, body: json };
}

export default function MarkupCanvas(props: CanvasProps) {
  const { apiBase, revision, me, canMarkUp, canPin } = props;
  const [state, dispatch] = useReducer(reduce, props.markups, (ms: MarkupView[]) => emptyState(ms.map(toItem)));
  const [pins, setPins] = useState(props.pins);
  const [page, setPage] = useState(1);
  const [zoom, setZoom] = useState(0.75);
  const [tool, setTool] = useState<Tool>(canMarkUp ? "select" : canPin ? "pin" : "select");
  const [colour, setColour] = useState(COLOURS[0]!.value);
  const [weight, setWeight] = useState(1.5);
  const [selected, setSelected] = useState<string | null>(null);
  const [draft, setDraft] = useState<number[] | null>(null);
  const [ask, setAsk] = useState<{ kind: "callout" | "calibrate"; points: number[] } | null>(null);
  const [notice, setNotice] = useState<{ tone: "ok" | "fail"; text: string } | null>(null);
  const stated = parseScale(revision.scaleText);
  const [scale, setScale] = useState<{ metresPerPt: number; source: string } | null>(stated ? { metresPerPt: metresPerPtAtScale(stated), source: `stated scale 1:${stated}` } : null);
  const rows = useRef(new Map(props.markups.map((m) => [m.id, { id: m.id, version: m.version }])));
  const chain = useRef(Promise.resolve());
  const stateRef = useRef(state);
  stateRef.current = state;
  const pageSize = revision.pages[page - 1] ?? revision.pages[0]!;
  const sel = state.items.find((i) => i.key === selected) ?? null;
  const pointerDown = useRef(false);

  const reloadOne = useCallback(async (key: string) => {
    const id = rows.current.get(key)?.id;
    const list = await send(`${apiBase}/markups?revisionId=${revision.id}`, "GET");
    const fresh = (list.body.markups as MarkupView[] | undefined)?.find((m) => m.id === id);
    if (fresh) rows.current.set(key, { id: fresh.id, version: fresh.version });
    else rows.current.delete(key);
    dispatch({ type: "replace", key, item: fresh ? { ...toItem(fresh) } : null });
  }, [apiBase, revision.id]);

  /** Writes one command to the server, in order after the ones before it. */
  const persist = useCallback((c: Command) => {
    chain.current = chain.current.then(async () => {
      const row = rows.current.get(c.key);
      let res;
      if (c.op === "create") res = await send(`${apiBase}/markups`, "POST", { revisionId: revision.id, page: c.page, shape: c.shape });
      else if (!row) return;
      else if (c.op === "update") res = await send(`${apiBase}/markups/${row.id}`, "PATCH", { version: row.version, shape: c.after });
      else res = await send(`${apiBase}/markups/${row.id}?version=${row.version}`, "DELETE");
      if (res.status < 300) {
        if (c.op === "delete") rows.current.delete(c.key);
        else {
          rows.current.set(c.key, { id: res.body.markup.id, version: res.body.markup.version });
          dispatch({ type: "saved", key: c.key, id: res.body.markup.id, version: res.body.markup.version });
        }
        setNotice({ tone: "ok", text: c.op === "delete" ? "Markup removed." : "Markup saved." });
      } else if (res.status === 409 && c.op !== "create") {
        setNotice({ tone: "fail", text: "Changed by someone else: this markup now shows their version." });
        await reloadOne(c.key);
      } else {
        setNotice({ tone: "fail", text: `Not saved: ${res.body.message ?? "the server refused it."}` });
        if (c.op === "create") dispatch({ type: "replace", key: c.key, item: null });
        else await reloadOne(c.key);
      }
    });
  }, [apiBase, revision.id, reloadOne]);

  const run = useCallback((c: Command) => {
    dispatch({ type: "do", command: c, author: me });
    persist(c);
  }, [me, persist]);

  const history = useCallback((which: "undo" | "redo") => {
    const effect = nextEffect(stateRef.current, which);
    if (!effect) return;
    dispatch({ type: which, author: me });
    persist(effect);
  }, [me, persist]);

  const finish = useCallback((kind: MarkupShape["kind"], points: number[], text?: string) => {
    const shape: MarkupShape = { kind, points: clampToPage(points, pageSize), color: colour, strokeWidthPt: weight, ...(text ? { text } : {}) };
    const key = newKey();
    run({ op: "create", key, page, shape });
    setSelected(null);
  }, [colour, weight, page, pageSize, run]);

  const removeSelected = useCallback(() => {
    if (!sel || !canMarkUp) return;
    run({ op: "delete", key: sel.key, page: sel.page, shape: sel.shape });
    setSelected(null);
  }, [sel, canMarkUp, run]);

  const finishPolyline = useCallback(() => {
    if (draft && draft.length >= 4) finish("polyline", draft, lengthLabel(draft, scale?.metresPerPt ?? null));
    setDraft(null);
  }, [draft, finish, scale]);

  useEffect(() => {
    function onKey(e: KeyboardEvent) {
      const t = e.target as HTMLElement;
      if (/^(INPUT|TEXTAREA|SELECT)$/.test(t.tagName) || t.isContentEditable) return;
      if (canMarkUp && (e.ctrlKey || e.metaKey) && e.key.toLowerCase() === "z") history(e.shiftKey ? "redo" : "undo");
      else if (canMarkUp && (e.ctrlKey || e.metaKey) && e.key.toLowerCase() === "y") history("redo");
      else if (e.ctrlKey || e.metaKey || e.altKey) return;
      else if (e.key === "Delete" || e.key === "Backspace") removeSelected();
      else if (e.key === "Escape") { setDraft(null); setSelected(null); setAsk(null); }
      else if (e.key === "Enter" && tool === "polyline") finishPolyline();
      else if (canMarkUp && toolForKey(e.key)) { setTool(toolForKey(e.key)!); setDraft(null); }
      else return;
      e.preventDefault();
    }
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [canMarkUp, history, removeSelected, tool, finishPolyline]);

  const pointAt = (e: Konva.KonvaEventObject<PointerEvent | MouseEvent>) => {
    const pos = e.target.getStage()!.getPointerPosition()!;
    return [Math.round((pos.x / zoom) * 100) / 100, Math.round((pos.y / zoom) * 100) / 100] as [number, number];
  };

  const onDown = async (e: Konva.KonvaEventObject<PointerEvent>) => {
    const [x, y] = pointAt(e);
    if (tool === "select") {
      if (e.target.findAncestor(".selected", true) || e.target.getParent()?.className === "Transformer") return;
      setSelected(hitTest(state.items, page, x, y, 4 / zoom));
      return;
    }
    if (tool === "pin") {
      if (!canPin) return;
      const res = await send(`${apiBase}/pins`, "POST", { revisionId: revision.id, page, xPt: x, yPt: y });
      if (res.status === 201) { setPins((p) => [...p, res.body.pin]); setNotice({ tone: "ok", text: `Pin ${res.body.pin.n} placed.` }); }
      else setNotice({ tone: "fail", text: res.body.message });
      return;
    }
    if (!canMarkUp || ask) return;
    if (tool === "polyline") { setDraft((d) => [...(d ?? [x, y]), x, y]); return; }
    pointerDown.current = true;
    setDraft([x, y, x, y]);
  };
  const onMove = (e: Konva.KonvaEventObject<PointerEvent>) => {
    if (!draft) return;
    const [x, y] = pointAt(e);
    if (tool === "polyline") setDraft([...draft.slice(0, -2), x, y]);
    else if (!pointerDown.current) return;
    else if (tool === "freehand" || tool === "highlighter") setDraft([...draft, x, y]);
    else setDraft([draft[0]!, draft[1]!, x, y]);
  };
  const onUp = () => {
    if (!draft || tool === "polyline" || !pointerDown.current) return;
    pointerDown.current = false;
    const points = tool === "freehand" || tool === "highlighter" ? thin(draft, 1.5 / zoom) : draft;
    setDraft(null);
    if (pathLengthPt(points) < 2) return;
    if (tool === "callout" || tool === "calibrate") setAsk({ kind: tool, points });
    else if (tool === "measure") {
      if (!scale) { setNotice({ tone: "fail", text: "This sheet states no scale: calibrate it first (two points a known distance apart)." }); return; }
      finish("measure", points, lengthLabel(points, scale.metresPerPt));
    } else finish(tool as MarkupShape["kind"], points);
  };

  const answer = (value: string) => {
    if (!ask) return;
    if (ask.kind === "callout") { if (value.trim()) finish("callout", ask.points, value.trim()); }
    else {
      const m = calibrate(ask.points as [number, number, number, number], Number(value.replace(",", ".")));
      if (!m) { setNotice({ tone: "fail", text: "Enter the real distance between the two points in metres, more than 0." }); return; }
      setScale({ metresPerPt: m, source: `calibrated: ${formatMetres(Number(value.replace(",", ".")))} between two points` });
      setNotice({ tone: "ok", text: "Scale calibrated." });
    }
    setAsk(null);
  };

  const group = useRef<Konva.Group>(null);
  const tr = useRef<Konva.Transformer>(null);
  useEffect(() => {
    if (tr.current) tr.current.nodes(group.current && sel && canMarkUp ? [group.current] : []);
  }, [sel, canMarkUp]);
  const onTransformed = () => {
    const g = group.current;
    if (!g || !sel) return;
    const points = clampToPage(transformPoints(sel.shape.points, { scaleX: g.scaleX(), scaleY: g.scaleY(), x: g.x(), y: g.y() }), pageSize);
    g.setAttrs({ x: 0, y: 0, scaleX: 1, scaleY: 1 });
    const text = sel.shape.kind === "measure" || sel.shape.kind === "polyline" ? (lengthLabel(points, scale?.metresPerPt ?? null) ?? sel.shape.text) : sel.shape.text;
    run({ op: "update", key: sel.key, before: sel.shape, after: { ...sel.shape, points, ...(text ? { text } : {}) } });
  };

  const onPage = useMemo(() => state.items.filter((i) => i.page === page && i.key !== selected), [state.items, page, selected]);
  const drawn = useRef(false);
  const wrapper = useRef<HTMLDivElement>(null);
  const draftShape: MarkupShape | null = draft && draft.length >= 4 ? { kind: tool === "calibrate" ? "measure" : ((TOOLS.find((t) => t.tool === tool) ? tool : "line") as MarkupShape["kind"]), points: draft, color: colour, strokeWidthPt: weight, text: tool === "polyline" || tool === "measure" ? lengthLabel(draft, scale?.metresPerPt ?? null) : undefined } : null;
  const w = pageSize.widthPt * zoom;
  const h = pageSize.heightPt * zoom;
  const selMetres = sel && (sel.shape.kind === "measure" || sel.shape.kind === "polyline") ? labelMetres(sel.shape.text) : null;

  return (
    <div className="flex flex-col gap-3 lg:flex-row" data-testid="markup-canvas">
      {canMarkUp ? (
        <div role="toolbar" aria-label="Markup tools" aria-orientation="vertical" className="flex shrink-0 flex-row flex-wrap gap-1 lg:w-36 lg:flex-col">
          {TOOLS.map((t) => (
            <button key={t.tool} type="button" aria-pressed={tool === t.tool} onClick={() => { setTool(t.tool); setDraft(null); }}
              className={`rounded border px-2 py-1 text-left text-xs ${tool === t.tool ? "border-copper bg-copper-wash font-semibold" : "border-rule"}`}>
              {tool === t.tool ? "▸ " : ""}{t.label}{t.key ? <span className="ml-1 text-ink-soft">({t.key.toUpperCase()})</span> : null}
            </button>
          ))}
          <label className="mt-2 text-xs">Colour
            <select value={colour} onChange={(e) => setColour(e.target.value)} className="mt-1 block w-full rounded border border-rule bg-sheet px-1 py-1">
              {COLOURS.map((c) => <option key={c.value} value={c.value}>{c.name}</option>)}
            </select>
          </label>
          <label className="text-xs">Line weight
            <select value={weight} onChange={(e) => setWeight(Number(e.target.value))} className="mt-1 block w-full rounded border border-rule bg-sheet px-1 py-1">
              {WEIGHTS.map((x) => <option key={x} value={x}>{x} pt</option>)}
            </select>
          </label>
          <div className="mt-2 flex gap-1">
            <button type="button" className="rounded border border-rule px-2 py-1 text-xs" disabled={!state.undo.length} onClick={() => history("undo")}>Undo</button>
            <button type="button" className="rounded border border-rule px-2 py-1 text-xs" disabled={!state.redo.length} onClick={() => history("redo")}>Redo</button>
          </div>
          <button type="button" className="rounded border border-rule px-2 py-1 text-xs" disabled={!sel} onClick={removeSelected}>Delete selected</button>
        </div>
      ) : null}
      <div className="min-w-0 flex-1 space-y-2">
        <div className="flex flex-wrap items-center gap-2 text-sm">
          <button type="button" className="rounded border border-rule px-2 py-1" disabled={page <= 1} onClick={() => setPage(page - 1)} aria-label="Previous page">←</button>
          <span data-testid="sheet-page">Page {page} of {revision.pages.length}</span>
          <button type="button" className="rounded border border-rule px-2 py-1" disabled={page >= revision.pages.length} onClick={() => setPage(page + 1)} aria-label="Next page">→</button>
          <label className="ml-2">Zoom <select value={zoom} onChange={(e) => setZoom(Number(e.target.value))} className="rounded border border-rule bg-sheet px-1 py-1">{ZOOMS.map((z) => <option key={z} value={z}>{z * 100}%</option>)}</select></label>
          <span className="text-xs text-ink-soft" data-testid="scale-source">Scale: {scale ? scale.source : "not set — calibrate to measure"}</span>
          {tool === "polyline" && draft ? <span className="text-xs font-semibold">Pipe run {lengthLabel(draft, scale?.metresPerPt ?? null) ?? `${pathLengthPt(draft).toFixed(0)} pt`} — double-click or Enter to finish</span> : null}
        </div>
        {notice ? <p role="status" data-testid="canvas-notice" className={`text-sm ${notice.tone === "fail" ? "font-semibold text-fail" : "text-ok"}`}>{notice.tone === "fail" ? "⚠ " : "✓ "}{notice.text}</p> : null}
        {!canMarkUp ? <p className="text-xs text-ink-soft">{canPin ? "Click the sheet to place a numbered pin." : "Read-only: markups are drawn by the engineer."}</p> : null}
        <div ref={wrapper} data-testid="sheet-scroller" role="region" aria-label="Sheet" tabIndex={0} className="relative max-h-[75vh] overflow-auto rounded-md border border-rule bg-paper-deep p-3">
          <div className="relative bg-white shadow" style={{ width: w, height: h }}>
            <Document file={revision.fileUrl} loading={<p className="p-6 text-ink-soft">Opening the sheet…</p>} error={<p role="alert" className="p-6 font-semibold text-fail">The sheet could not be opened. Reload the page to try again.</p>}>
              <Page pageNumber={page} width={w} renderAnnotationLayer={false} renderTextLayer={false} loading="" />
            </Document>
            <div className="absolute inset-0" data-testid="markup-stage">
              <Stage width={w} height={h} onPointerDown={onDown} onPointerMove={onMove} onPointerUp={onUp} onDblClick={() => tool === "polyline" && finishPolyline()}
                style={{ cursor: tool === "select" ? "default" : "crosshair" }}>
                <Layer scaleX={zoom} scaleY={zoom} listening={false}>
                  <Shape listening={false} perfectDrawEnabled={false} sceneFunc={(ctx) => {
                    const c = (ctx as unknown as { _context: CanvasRenderingContext2D })._context;
                    const t0 = performance.now();
                    for (const it of onPage) drawMarkup(c, it.shape);
                    // For the benchmark: when the layer first drew, and how long drawing it took.
                    if (!drawn.current && wrapper.current) {
                      drawn.current = true;
                      const t1 = performance.now();
                      wrapper.current.dataset.drawnAt = String(t1);
                      wrapper.current.dataset.drawMs = (t1 - t0).toFixed(1);
                    }
                  }} />
                </Layer>
                <Layer scaleX={zoom} scaleY={zoom}>
                  {sel && sel.page === page ? (
                    <Group ref={group} name="selected" draggable={canMarkUp} onDragEnd={onTransformed} onTransformEnd={onTransformed}>
                      <Shape perfectDrawEnabled={false} sceneFunc={(ctx) => drawMarkup((ctx as unknown as { _context: CanvasRenderingContext2D })._context, sel.shape)}
                        hitFunc={(ctx, shape) => { const p = sel.shape.points; const xs = p.filter((_, i) => i % 2 === 0); const ys = p.filter((_, i) => i % 2 === 1); ctx.beginPath(); ctx.rect(Math.min(...xs) - 4, Math.min(...ys) - 4, Math.max(...xs) - Math.min(...xs) + 8, Math.max(...ys) - Math.min(...ys) + 8); ctx.closePath(); ctx.fillStrokeShape(shape); }} />
                    </Group>
                  ) : null}
                  <Transformer ref={tr} rotateEnabled={false} ignoreStroke keepRatio={false} />
                  {draftShape ? <Shape listening={false} sceneFunc={(ctx) => drawMarkup((ctx as unknown as { _context: CanvasRenderingContext2D })._context, draftShape)} /> : null}
                  {pins.filter((p) => p.page === page).map((p) => (
                    <Group key={p.id} x={p.xPt} y={p.yPt} listening={false}>
                      <Circle radius={9 / zoom} fill="#1f2a33" stroke="#ffffff" strokeWidth={2 / zoom} />
                      <Text text={String(p.n)} fontSize={11 / zoom} fill="#ffffff" fontStyle="bold" width={18 / zoom} offsetX={9 / zoom} offsetY={5.5 / zoom} align="center" />
                    </Group>
                  ))}
                </Layer>
              </Stage>
            </div>
            {ask ? (
              <form className="absolute z-20 flex gap-1 rounded border border-rule bg-sheet p-2 shadow" style={{ left: Math.min(ask.points[2]! * zoom, w - 260), top: Math.min(ask.points[3]! * zoom, h - 50) }}
                onSubmit={(e) => { e.preventDefault(); answer(String(new FormData(e.currentTarget).get("value") ?? "")); }}>
                <label className="sr-only" htmlFor="ask-value">{ask.kind === "callout" ? "Callout text" : "Known distance (m)"}</label>
                <input id="ask-value" name="value" autoFocus aria-label={ask.kind === "callout" ? "Callout text" : "Known distance (m)"} placeholder={ask.kind === "callout" ? "Callout text" : "Distance in m"} className="w-44 rounded border border-rule px-2 py-1 text-sm" inputMode={ask.kind === "calibrate" ? "decimal" : undefined} />
                <button className="rounded bg-copper px-2 py-1 text-sm font-semibold text-white">{ask.kind === "callout" ? "Add" : "Set scale"}</button>
                <button type="button" className="rounded border border-rule px-2 py-1 text-sm" onClick={() => setAsk(null)}>Cancel</button>
              </form>
            ) : null}
          </div>
        </div>
      </div>
      <aside className="w-full shrink-0 space-y-3 lg:w-64">
        {selMetres !== null ? (
          <a href={`${props.calculatorUrl}?lengthM=${selMetres}`} className="block rounded-md border border-copper px-3 py-2 text-sm font-semibold text-copper-deep">Send {formatMetres(selMetres)} to the calculator →</a>
        ) : null}
        <MarkupList items={state.items} selected={selected} onPick={(it) => { setPage(it.page); setSelected(it.key); const b = it.shape.points; wrapper.current?.scrollTo({ left: b[0]! * zoom - 100, top: b[1]! * zoom - 100 }); }} />
        {pins.length ? (
          <div>
            <h3 className="text-sm font-bold">Pins</h3>
            <ul className="mt-1 space-y-1 text-sm" data-testid="pin-list">
              {pins.map((p) => (
                <li key={p.id} className="flex items-center justify-between gap-2">
                  <span>Pin {p.n} · page {p.page}</span>
                  {canPin ? <button type="button" className="text-xs underline" onClick={async () => {
                    const res = await send(`${apiBase}/pins/${p.id}`, "DELETE");
                    if (res.status === 200) setPins((all) => all.filter((x) => x.id !== p.id));
                    else setNotice({ tone: "fail", text: res.body.message });
                  }}>Remove pin {p.n}</button> : null}
                </li>
              ))}
            </ul>
          </div>
        ) : null}
      </aside>
    </div>
  );
}
