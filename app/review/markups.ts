// Markup shapes as stored and exported: geometry in PDF points on the page, origin at the page's top-left corner,
// y downwards (as on screen), so a markup stays registered at any zoom and prints where it was drawn.
import { z } from "zod";

export const MARKUP_KINDS = ["freehand", "line", "arrow", "rectangle", "ellipse", "cloud", "callout", "highlighter", "measure", "polyline"] as const;
export type MarkupKind = (typeof MARKUP_KINDS)[number];

export interface MarkupShape {
  kind: MarkupKind;
  /** x, y pairs in PDF points. Two-point kinds (line, arrow, rectangle, ellipse, cloud, measure): start and end corners. */
  points: number[];
  text?: string;
  color: string;
  strokeWidthPt: number;
}

const TWO_POINT: MarkupKind[] = ["line", "arrow", "rectangle", "ellipse", "cloud", "measure", "callout"];

export const markupShapeSchema = z
  .object({
    kind: z.enum(MARKUP_KINDS),
    points: z.array(z.number().finite()).min(4, "A markup needs at least two points.").max(20_000, "That markup has too many points."),
    text: z.string().max(2000).optional(),
    color: z.string().regex(/^#[0-9a-f]{6}$/i, "Colour must be a hex colour like #9a4a20."),
    strokeWidthPt: z.number().min(0.25).max(40),
  })
  .superRefine((m, ctx) => {
    if (m.points.length % 2) ctx.addIssue({ code: "custom", path: ["points"], message: "Points come in x, y pairs." });
    if (TWO_POINT.includes(m.kind) && m.points.length !== 4) {
      ctx.addIssue({ code: "custom", path: ["points"], message: `A ${m.kind} has exactly two points.` });
    }
    if (m.kind === "callout" && !m.text?.trim()) ctx.addIssue({ code: "custom", path: ["text"], message: "A callout needs its text." });
  });

/** Null when every point lies on the page, else the reason. */
export function offPage(shape: Pick<MarkupShape, "points">, page: { widthPt: number; heightPt: number }): string | null {
  for (let i = 0; i < shape.points.length; i += 2) {
    const x = shape.points[i]!;
    const y = shape.points[i + 1]!;
    if (x < 0 || y < 0 || x > page.widthPt || y > page.heightPt) return `Point ${i / 2 + 1} (${x.toFixed(1)}, ${y.toFixed(1)}) lies off the ${page.widthPt.toFixed(0)} × ${page.heightPt.toFixed(0)} pt page.`;
  }
  return null;
}

/** A revision cloud along a rectangle's edges, as an SVG path (scallops of about `arcPt`). */
export function cloudPath(x1: number, y1: number, x2: number, y2: number, arcPt = 12): string {
  const [left, right] = [Math.min(x1, x2), Math.max(x1, x2)];
  const [top, bottom] = [Math.min(y1, y2), Math.max(y1, y2)];
  const corners: [number, number][] = [[left, top], [right, top], [right, bottom], [left, bottom], [left, top]];
  let d = `M ${left} ${top}`;
  for (let i = 0; i < 4; i++) {
    const [ax, ay] = corners[i]!;
    const [bx, by] = corners[i + 1]!;
    const length = Math.hypot(bx - ax, by - ay);
    const n = Math.max(1, Math.round(length / arcPt));
    // Outward normal for a clockwise walk (y down).
    const nx = (by - ay) / (length || 1);
    const ny = -(bx - ax) / (length || 1);
    for (let k = 1; k <= n; k++) {
      const px = ax + ((bx - ax) * k) / n;
      const py = ay + ((by - ay) * k) / n;
      const mx = ax + ((bx - ax) * (k - 0.5)) / n - nx * (length / n) * 0.6;
      const my = ay + ((by - ay) * (k - 0.5)) / n - ny * (length / n) * 0.6;
      d += ` Q ${mx.toFixed(2)} ${my.toFixed(2)} ${px.toFixed(2)} ${py.toFixed(2)}`;
    }
  }
  return d;
}

/** The shape as an SVG path in page coordinates (y down), for screen and print alike; callout text aside. */
export function markupPath(m: MarkupShape): string {
  const p = m.points;
  const pairs = (from = 0) => {
    let d = "";
    for (let i = from; i < p.length; i += 2) d += `${i === from ? "M" : "L"} ${p[i]} ${p[i + 1]} `;
    return d.trim();
  };
  switch (m.kind) {
    case "rectangle":
      return `M ${p[0]} ${p[1]} L ${p[2]} ${p[1]} L ${p[2]} ${p[3]} L ${p[0]} ${p[3]} Z`;
    case "ellipse": {
      const cx = (p[0]! + p[2]!) / 2;
      const cy = (p[1]! + p[3]!) / 2;
      const rx = Math.abs(p[2]! - p[0]!) / 2;
      const ry = Math.abs(p[3]! - p[1]!) / 2;
      return `M ${cx - rx} ${cy} A ${rx} ${ry} 0 1 0 ${cx + rx} ${cy} A ${rx} ${ry} 0 1 0 ${cx - rx} ${cy} Z`;
    }
    case "cloud":
      return cloudPath(p[0]!, p[1]!, p[2]!, p[3]!);
    case "arrow": {
      const [x1, y1, x2, y2] = p as [number, number, number, number];
      const angle = Math.atan2(y2 - y1, x2 - x1);
      const head = Math.max(6, m.strokeWidthPt * 4);
      const a1 = angle + Math.PI - 0.45;
      const a2 = angle + Math.PI + 0.45;
      return `M ${x1} ${y1} L ${x2} ${y2} M ${x2 + head * Math.cos(a1)} ${y2 + head * Math.sin(a1)} L ${x2} ${y2} L ${x2 + head * Math.cos(a2)} ${y2 + head * Math.sin(a2)}`;
    }
    default:
      return pairs();
  }
}
