// The sheet viewer (browser only): react-pdf on one shared pdf.js worker, the PDF read by range requests,
// only the pages near the viewport rendered. Fit-to-width, zoom, pan, page thumbnails, keyboard shortcuts
// (+ − 0, arrows and Page Up/Down), a selectable text layer, and a deep link to page, zoom and a point.
import { useCallback, useEffect, useLayoutEffect, useMemo, useRef, useState } from "react";
import { Document, Page, pdfjs } from "react-pdf";
import workerUrl from "pdfjs-dist/build/pdf.worker.min.mjs?url";
import "react-pdf/dist/Page/TextLayer.css";

// One worker for every document this tab opens: switching revisions does not start another.
if (typeof window !== "undefined" && !pdfjs.GlobalWorkerOptions.workerPort) {
  pdfjs.GlobalWorkerOptions.workerPort = new Worker(workerUrl, { type: "module" });
}

export interface ViewState {
  page: number;
  zoom: number;
  /** A point on `page` in PDF points from its top-left corner. */
  x?: number;
  y?: number;
}

interface ViewerProps {
  fileUrl: string;
  pages: { widthPt: number; heightPt: number }[];
  thumbUrl: (page: number) => string | null;
  initial: ViewState;
  onViewChange: (view: ViewState) => void;
}

const ZOOMS = [0.25, 0.5, 0.75, 1, 1.25, 1.5, 2, 3, 4, 6, 8];
const MAX_CANVAS_PX = 8192;
const options = { disableAutoFetch: true, disableStream: true, rangeChunkSize: 512 * 1024, isEvalSupported: false };

export default function Viewer({ fileUrl, pages: knownPages, thumbUrl, initial, onViewChange }: ViewerProps) {
  const scroller = useRef<HTMLDivElement>(null);
  const pageEls = useRef<(HTMLDivElement | null)[]>([]);
  const [width, setWidth] = useState(0);
  const [zoom, setZoom] = useState(initial.zoom);
  const [page, setPage] = useState(initial.page);
  const [point, setPoint] = useState(initial.x !== undefined && initial.y !== undefined ? { page: initial.page, x: initial.x, y: initial.y } : null);
  const [pages, setPages] = useState(knownPages);
  const [visible, setVisible] = useState<Set<number>>(() => new Set([initial.page]));
  const [pan, setPan] = useState(false);
  const [copied, setCopied] = useState(false);
  const centre = useRef<{ fx: number; fy: number } | null>(null);
  const landed = useRef(false);

  // Fit to width: the container's width, watched.
  useEffect(() => {
    const el = scroller.current;
    if (!el) return;
    const ro = new ResizeObserver(([entry]) => setWidth(Math.floor(entry!.contentRect.width) - 32));
    ro.observe(el);
    return () => ro.disconnect();
  }, []);

  const pageWidth = Math.max(100, width * zoom);
  const sizeOf = (n: number) => {
    const p = pages[n - 1] ?? pages[0] ?? { widthPt: 842, heightPt: 595 };
    return { w: pageWidth, h: (pageWidth * p.heightPt) / p.widthPt, p };
  };

  // Render only what is near the viewport; the most visible page is the current one.
  useEffect(() => {
    const root = scroller.current;
    if (!root || !width) return;
    const ratios = new Map<number, number>();
    const io = new IntersectionObserver(
      (entries) => {
        for (const e of entries) ratios.set(Number((e.target as HTMLElement).dataset.page), e.isIntersecting ? e.intersectionRatio : 0);
        const near = new Set([...ratios].filter(([, r]) => r > 0).map(([n]) => n));
        setVisible((old) => (near.size ? near : old));
        const best = [...ratios].sort((a, b) => b[1] - a[1])[0];
        if (best && best[1] > 0 && landed.current) setPage(best[0]);
      },
      { root, rootMargin: "50% 0px", threshold: [0, 0.1, 0.25, 0.5, 0.75, 1] },
    );
    pageEls.current.forEach((el) => el && io.observe(el));
    return () => io.disconnect();
  }, [pages.length, width]);

  // Land on the deep-linked page and point once the layout is known.
  useLayoutEffect(() => {
    if (landed.current || !width) return;
    const el = pageEls.current[initial.page - 1];
    const root = scroller.current;
    if (!el || !root) return;
    const { w, h, p } = sizeOf(initial.page);
    if (initial.x !== undefined && initial.y !== undefined) {
      root.scrollTo({ left: el.offsetLeft + (initial.x / p.widthPt) * w - root.clientWidth / 2, top: el.offsetTop + (initial.y / p.heightPt) * h - root.clientHeight / 2 });
    } else {
      root.scrollTo({ top: el.offsetTop - 8 });
    }
    landed.current = true;
  });

  // Zoom about the middle of the view.
  const applyZoom = useCallback((next: number) => {
    const root = scroller.current;
    if (root) centre.current = { fx: (root.scrollLeft + root.clientWidth / 2) / root.scrollWidth, fy: (root.scrollTop + root.clientHeight / 2) / root.scrollHeight };
    setZoom(Math.min(ZOOMS[ZOOMS.length - 1]!, Math.max(ZOOMS[0]!, next)));
  }, []);
  useLayoutEffect(() => {
    const root = scroller.current;
    if (!root || !centre.current) return;
    root.scrollTo({ left: centre.current.fx * root.scrollWidth - root.clientWidth / 2, top: centre.current.fy * root.scrollHeight - root.clientHeight / 2 });
    centre.current = null;
  }, [zoom]);

  const goTo = useCallback((n: number) => {
    const target = Math.min(pages.length, Math.max(1, n));
    pageEls.current[target - 1]?.scrollIntoView({ block: "start" });
    setPage(target);
  }, [pages.length]);

  useEffect(() => {
    onViewChange({ page, zoom, ...(point && point.page === page ? { x: point.x, y: point.y } : {}) });
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [page, zoom, point]);

  useEffect(() => {
    function onKey(e: KeyboardEvent) {
      const t = e.target as HTMLElement;
      if (/^(INPUT|TEXTAREA|SELECT)$/.test(t.tagName) || t.isContentEditable || e.ctrlKey || e.metaKey || e.altKey) return;
      const stepUp = ZOOMS.find((z) => z > zoom + 1e-6) ?? zoom;
      const stepDown = [...ZOOMS].reverse().find((z) => z < zoom - 1e-6) ?? zoom;
      if (e.key === "+" || e.key === "=") applyZoom(stepUp);
      else if (e.key === "-" || e.key === "_") applyZoom(stepDown);
      else if (e.key === "0") applyZoom(1);
      else if (e.key === "ArrowRight" || e.key === "PageDown") goTo(page + 1);
      else if (e.key === "ArrowLeft" || e.key === "PageUp") goTo(page - 1);
      else return;
      e.preventDefault();
    }
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [zoom, page, applyZoom, goTo]);

  // Pan by dragging when the hand tool is on.
  const drag = useRef<{ x: number; y: number } | null>(null);
  const panHandlers = pan
    ? {
        onPointerDown: (e: React.PointerEvent) => {
          drag.current = { x: e.clientX, y: e.clientY };
          (e.currentTarget as HTMLElement).setPointerCapture(e.pointerId);
        },
        onPointerMove: (e: React.PointerEvent) => {
          if (!drag.current || !scroller.current) return;
          scroller.current.scrollBy(drag.current.x - e.clientX, drag.current.y - e.clientY);
          drag.current = { x: e.clientX, y: e.clientY };
        },
        onPointerUp: () => (drag.current = null),
      }
    : {};

  const markPoint = (n: number, e: React.MouseEvent<HTMLDivElement>) => {
    const rect = e.currentTarget.getBoundingClientRect();
    const { w, h, p } = sizeOf(n);
    setPoint({ page: n, x: Math.round(((e.clientX - rect.left) / w) * p.widthPt), y: Math.round(((e.clientY - rect.top) / h) * p.heightPt) });
    setPage(n);
  };

  const dpr = typeof window === "undefined" ? 1 : Math.min(window.devicePixelRatio || 1, MAX_CANVAS_PX / pageWidth);
  const thumbs = useMemo(() => pages.map((_, i) => thumbUrl(i + 1)), [pages, thumbUrl]);

  return (
    <div className="flex flex-col gap-2" data-testid="viewer">
      <div className="flex flex-wrap items-center gap-2 text-sm" role="toolbar" aria-label="Viewer">
        <button type="button" className="rounded border border-rule px-2 py-1" onClick={() => goTo(page - 1)} disabled={page <= 1} aria-label="Previous page">←</button>
        <span className="tabular-nums" data-testid="viewer-page">Page {page} of {pages.length}</span>
        <button type="button" className="rounded border border-rule px-2 py-1" onClick={() => goTo(page + 1)} disabled={page >= pages.length} aria-label="Next page">→</button>
        <span className="mx-2 h-5 border-l border-rule" />
        <button type="button" className="rounded border border-rule px-2 py-1" onClick={() => applyZoom(ZOOMS.filter((z) => z < zoom - 1e-6).pop() ?? zoom)} aria-label="Zoom out">−</button>
        <span className="w-14 text-center tabular-nums" data-testid="viewer-zoom">{Math.round(zoom * 100)}%</span>
        <button type="button" className="rounded border border-rule px-2 py-1" onClick={() => applyZoom(ZOOMS.find((z) => z > zoom + 1e-6) ?? zoom)} aria-label="Zoom in">+</button>
        <button type="button" className="rounded border border-rule px-2 py-1" onClick={() => applyZoom(1)}>Fit width</button>
        <button type="button" className={`rounded border px-2 py-1 ${pan ? "border-copper bg-copper-wash" : "border-rule"}`} aria-pressed={pan} onClick={() => setPan(!pan)}>
          {pan ? "Pan (drag) ✓" : "Pan"}
        </button>
        <button
          type="button"
          className="rounded border border-rule px-2 py-1"
          onClick={() => navigator.clipboard?.writeText(window.location.href).then(() => { setCopied(true); setTimeout(() => setCopied(false), 1500); })}
        >
          {copied ? "Link copied ✓" : "Copy link"}
        </button>
        <span className="text-xs text-ink-soft">Double-click marks a point for the link. Keys: + − 0, ← →</span>
      </div>
      <div className="flex gap-3">
        <nav aria-label="Pages" className="hidden max-h-[75vh] w-28 shrink-0 space-y-2 overflow-y-auto sm:block">
          {pages.map((_, i) => (
            <button key={i} type="button" onClick={() => goTo(i + 1)} aria-current={page === i + 1 ? "page" : undefined}
              className={`block w-full rounded border p-1 text-center text-xs ${page === i + 1 ? "border-copper ring-2 ring-copper/30" : "border-rule"}`}>
              {thumbs[i] ? <img src={thumbs[i]!} alt="" loading="lazy" className="w-full bg-white" /> : null}
              <span>Page {i + 1}</span>
            </button>
          ))}
        </nav>
        <div ref={scroller} role="region" tabIndex={0} aria-label="Sheet" className={`relative max-h-[75vh] min-h-[50vh] flex-1 overflow-auto rounded-md border border-rule bg-paper-deep p-4 ${pan ? "cursor-grab select-none" : ""}`} {...panHandlers}>
          <Document
            file={fileUrl}
            options={options}
            onLoadSuccess={(pdf) => {
              if (pdf.numPages !== pages.length) setPages(Array.from({ length: pdf.numPages }, (_, i) => pages[i] ?? pages[0] ?? { widthPt: 842, heightPt: 595 }));
            }}
            loading={<p className="p-6 text-ink-soft">Opening the sheet…</p>}
            error={<p role="alert" className="p-6 font-semibold text-fail">The sheet could not be opened. Reload the page to try again.</p>}
          >
            {pages.map((_, i) => {
              const n = i + 1;
              const { w, h } = sizeOf(n);
              return (
                <div key={n} ref={(el) => { pageEls.current[i] = el; }} data-page={n} className="relative mx-auto mb-4 bg-white shadow" style={{ width: w, height: h }}
                  onDoubleClick={(e) => markPoint(n, e)}>
                  {visible.has(n) || Math.abs(n - page) <= 1 ? (
                    <Page pageNumber={n} width={w} devicePixelRatio={dpr} renderAnnotationLayer={false} renderTextLayer loading="" />
                  ) : null}
                  {point && point.page === n ? (
                    <span aria-label={`Marked point at ${point.x}, ${point.y} pt`} className="pointer-events-none absolute z-10 -ml-2 -mt-2 h-4 w-4 rounded-full border-2 border-white bg-copper shadow ring-2 ring-copper"
                      style={{ left: (point.x / sizeOf(n).p.widthPt) * w, top: (point.y / sizeOf(n).p.heightPt) * h }} />
                  ) : null}
                </div>
              );
            })}
          </Document>
        </div>
      </div>
    </div>
  );
}
