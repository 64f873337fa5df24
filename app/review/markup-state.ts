// The markup canvas's state, without a canvas: the tools and their keys, the markups on screen with the history
// of changes (undo/redo as commands, each one also a write to the server), hit-testing in page points, and
// applying a drag or resize to a shape's points. Pure, so it is unit-tested.
import type { MarkupKind, MarkupShape } from "./markups";

export type Tool = "select" | "pin" | Exclude<MarkupKind, "measure"> | "measure" | "calibrate";

export const TOOLS: { tool: Tool; label: string; key?: string }[] = [
  { tool: "select", label: "Select", key: "v" },
  { tool: "freehand", label: "Pen", key: "p" },
  { tool: "line", label: "Line", key: "l" },
  { tool: "arrow", label: "Arrow", key: "a" },
  { tool: "rectangle", label: "Rectangle", key: "r" },
  { tool: "ellipse", label: "Ellipse", key: "e" },
  { tool: "cloud", label: "Revision cloud", key: "c" },
  { tool: "callout", label: "Text callout", key: "t" },
  { tool: "highlighter", label: "Highlighter", key: "h" },
  { tool: "measure", label: "Measure length", key: "m" },
  { tool: "polyline", label: "Pipe run" },
  { tool: "calibrate", label: "Calibrate scale" },
];

export function toolForKey(key: string): Tool | null {
  return TOOLS.find((t) => t.key === key.toLowerCase())?.tool ?? null;
}

export interface Item {
  /** Stable on screen, even when the server row behind it changes (undoing a removal makes a new row). */
  key: string;
  id: string | null;
  version: number;
  page: number;
  shape: MarkupShape;
  author: { id: string; name: string };
}

export type Command =
  | { op: "create"; key: string; page: number; shape: MarkupShape }
  | { op: "update"; key: string; before: MarkupShape; after: MarkupShape }
  | { op: "delete"; key: string; page: number; shape: MarkupShape };

export interface State {
  items: Item[];
  undo: Command[];
  redo: Command[];
}

export type Event =
  | { type: "load"; items: Item[] }
  | { type: "do"; command: Command; author: Item["author"] }
  | { type: "undo"; author: Item["author"] }
  | { type: "redo"; author: Item["author"] }
  | { type: "saved"; key: string; id: string; version: number }
  | { type: "replace"; key: string; item: Omit<Item, "key"> | null };

export const emptyState = (items: Item[] = []): State => ({ items, undo: [], redo: [] });

export function invert(c: Command): Command {
  if (c.op === "create") return { op: "delete", key: c.key, page: c.page, shape: c.shape };
  if (c.op === "delete") return { op: "create", key: c.key, page: c.page, shape: c.shape };
  return { op: "update", key: c.key, before: c.after, after: c.before };
}

function apply(items: Item[], c: Command, author: Item["author"]): Item[] {
  if (c.op === "create") return [...items, { key: c.key, id: null, version: 0, page: c.page, shape: c.shape, author }];
  if (c.op === "delete") return items.filter((i) => i.key !== c.key);
  return items.map((i) => (i.key === c.key ? { ...i, shape: c.after } : i));
}

export function reduce(state: State, e: Event): State {
  switch (e.type) {
    case "load":
      return emptyState(e.items);
    case "do":
      return { items: apply(state.items, e.command, e.author), undo: [...state.undo, e.command], redo: [] };
    case "undo": {
      const c = state.undo.at(-1);
      if (!c) return state;
      return { items: apply(state.items, invert(c), e.author), undo: state.undo.slice(0, -1), redo: [...state.redo, c] };
    }
    case "redo": {
      const c = state.redo.at(-1);
      if (!c) return state;
      return { items: apply(state.items, c, e.author), undo: [...state.undo, c], redo: state.redo.slice(0, -1) };
    }
    case "saved":
      return { ...state, items: state.items.map((i) => (i.key === e.key ? { ...i, id: e.id, version: e.version } : i)) };
    case "replace": {
      // The server's word wins: history about this markup no longer applies.
      const keep = (c: Command) => c.key !== e.key;
      const items = e.item ? state.items.map((i) => (i.key === e.key ? { ...e.item!, key: e.key } : i)) : state.items.filter((i) => i.key !== e.key);
      return { items, undo: state.undo.filter(keep), redo: state.redo.filter(keep) };
    }
  }
}

/** The command an undo or redo is about to apply (what to send to the server). */
export function nextEffect(state: State, which: "undo" | "redo"): Command | null {
  const c = which === "undo" ? state.undo.at(-1) : state.redo.at(-1);
  return c ? (which === "undo" ? invert(c) : c) : null;
}

export function bbox(points: number[]) {
  let [x1, y1, x2, y2] = [Infinity, Infinity, -Infinity, -Infinity];
  for (let i = 0; i + 1 < points.length; i += 2) {
    x1 = Math.min(x1, points[i]!);
    x2 = Math.max(x2, points[i]!);
    y1 = Math.min(y1, points[i + 1]!);
    y2 = Math.max(y2, points[i + 1]!);
  }
  return { x1, y1, x2, y2 };
}

function segmentDistance(px: number, py: number, ax: number, ay: number, bx: number, by: number) {
  const dx = bx - ax;
  const dy = by - ay;
  const len2 = dx * dx + dy * dy;
  const t = len2 ? Math.max(0, Math.min(1, ((px - ax) * dx + (py - ay) * dy) / len2)) : 0;
  return Math.hypot(px - (ax + t * dx), py - (ay + t * dy));
}

const AREA_KINDS: MarkupKind[] = ["rectangle", "ellipse", "cloud"];

/** The topmost markup under a point (page points), allowing `tolPt` of slack; null if none. */
export function hitTest(items: readonly Item[], page: number, x: number, y: number, tolPt: number): string | null {
  for (let k = items.length - 1; k >= 0; k--) {
    const it = items[k]!;
    if (it.page !== page) continue;
    const p = it.shape.points;
    const b = bbox(p);
    const slack = tolPt + it.shape.strokeWidthPt / 2;
    if (x < b.x1 - slack || x > b.x2 + slack || y < b.y1 - slack || y > b.y2 + slack) continue;
    if (AREA_KINDS.includes(it.shape.kind) || it.shape.kind === "callout") return it.key;
    for (let i = 2; i + 1 < p.length; i += 2) if (segmentDistance(x, y, p[i - 2]!, p[i - 1]!, p[i]!, p[i + 1]!) <= slack) return it.key;
  }
  return null;
}

/** Points moved and scaled as a drag or resize left the node: x' = a·x + e, y' = d·y + f (no rotation). */
export function transformPoints(points: number[], t: { scaleX: number; scaleY: number; x: number; y: number }): number[] {
  return points.map((v, i) => Math.round((i % 2 ? v * t.scaleY + t.y : v * t.scaleX + t.x) * 100) / 100);
}

/** Keeps every point on the page (a drag past the edge stops at it). */
export function clampToPage(points: number[], page: { widthPt: number; heightPt: number }): number[] {
  return points.map((v, i) => Math.max(0, Math.min(i % 2 ? page.heightPt : page.widthPt, v)));
}

/** Drops points closer than `minPt` to the previous one, so a pen stroke stays small. */
export function thin(points: number[], minPt: number): number[] {
  if (points.length <= 4) return points;
  const out = [points[0]!, points[1]!];
  for (let i = 2; i + 1 < points.length; i += 2) {
    const last = i + 2 >= points.length;
    if (last || Math.hypot(points[i]! - out[out.length - 2]!, points[i + 1]! - out[out.length - 1]!) >= minPt) out.push(points[i]!, points[i + 1]!);
  }
  return out;
}
