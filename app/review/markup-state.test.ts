import { describe, expect, it } from "vitest";
import type { MarkupShape } from "./markups";
import { clampToPage, emptyState, hitTest, nextEffect, reduce, thin, toolForKey, transformPoints, type Item } from "./markup-state";

const me = { id: "u1", name: "Engineer" };
const shape = (kind: MarkupShape["kind"], points: number[]): MarkupShape => ({ kind, points, color: "#9a4a20", strokeWidthPt: 2 });

describe("markup history", () => {
  it("applies, undoes and redoes creates, changes and removals, naming the write each needs", () => {
    let s = reduce(emptyState(), { type: "do", command: { op: "create", key: "k1", page: 1, shape: shape("rectangle", [0, 0, 10, 10]) }, author: me });
    s = reduce(s, { type: "saved", key: "k1", id: "m1", version: 1 });
    const moved = shape("rectangle", [5, 5, 15, 15]);
    s = reduce(s, { type: "do", command: { op: "update", key: "k1", before: s.items[0]!.shape, after: moved }, author: me });
    expect(s.items[0]!.shape.points).toEqual([5, 5, 15, 15]);
    expect(nextEffect(s, "undo")).toMatchObject({ op: "update", after: { points: [0, 0, 10, 10] } });
    s = reduce(s, { type: "undo", author: me });
    expect(s.items[0]!.shape.points).toEqual([0, 0, 10, 10]);
    expect(nextEffect(s, "undo")).toMatchObject({ op: "delete", key: "k1" });
    s = reduce(s, { type: "undo", author: me });
    expect(s.items).toEqual([]);
    expect(nextEffect(s, "redo")).toMatchObject({ op: "create", key: "k1" });
    s = reduce(s, { type: "redo", author: me });
    expect(s.items).toHaveLength(1);
    s = reduce(s, { type: "redo", author: me });
    expect(s.items[0]!.shape.points).toEqual([5, 5, 15, 15]);
    expect(reduce(s, { type: "redo", author: me })).toBe(s);
    s = reduce(s, { type: "do", command: { op: "delete", key: "k1", page: 1, shape: moved }, author: me });
    expect(s.items).toEqual([]);
    expect(s.redo).toEqual([]);
  });

  it("lets the server's version replace a markup and forgets history about it", () => {
    let s = reduce(emptyState(), { type: "do", command: { op: "create", key: "k1", page: 1, shape: shape("line", [0, 0, 1, 1]) }, author: me });
    s = reduce(s, { type: "replace", key: "k1", item: { id: "m1", version: 3, page: 1, shape: shape("line", [2, 2, 3, 3]), author: { id: "u2", name: "Other" } } });
    expect(s.items[0]).toMatchObject({ key: "k1", version: 3, author: { id: "u2" } });
    expect(s.undo).toEqual([]);
    expect(reduce(s, { type: "replace", key: "k1", item: null }).items).toEqual([]);
  });
});

describe("canvas geometry", () => {
  const items: Item[] = [
    { key: "box", id: "1", version: 1, page: 1, shape: shape("rectangle", [100, 100, 200, 200]), author: me },
    { key: "line", id: "2", version: 1, page: 1, shape: shape("line", [0, 300, 400, 300]), author: me },
    { key: "other-page", id: "3", version: 1, page: 2, shape: shape("rectangle", [0, 0, 500, 500]), author: me },
  ];
  it("finds the topmost markup under a point, near lines only within the tolerance", () => {
    expect(hitTest(items, 1, 150, 150, 3)).toBe("box");
    expect(hitTest(items, 1, 200, 302, 3)).toBe("line");
    expect(hitTest(items, 1, 200, 320, 3)).toBeNull();
    expect(hitTest(items, 2, 150, 150, 3)).toBe("other-page");
  });
  it("moves and scales points, keeps them on the page and thins pen strokes", () => {
    expect(transformPoints([10, 10, 20, 30], { scaleX: 2, scaleY: 1, x: 5, y: -5 })).toEqual([25, 5, 45, 25]);
    expect(clampToPage([-5, 10, 900, 700], { widthPt: 842, heightPt: 595 })).toEqual([0, 10, 842, 595]);
    expect(thin([0, 0, 0.5, 0, 1, 0, 3, 0, 3.2, 0], 2)).toEqual([0, 0, 3, 0, 3.2, 0]);
  });
  it("maps the shortcut keys to tools", () => {
    expect(["v", "p", "l", "a", "r", "e", "c", "t", "h", "m"].map(toolForKey)).toEqual(["select", "freehand", "line", "arrow", "rectangle", "ellipse", "cloud", "callout", "highlighter", "measure"]);
    expect(toolForKey("x")).toBeNull();
  });
});
