// Draws a markup onto a 2D canvas context in page points (browser only: Path2D). The sheet canvas draws every
// markup that is not being edited through this in one pass, which keeps thousands of markups cheap to show.
import { markupPath, type MarkupShape } from "./markups";

const paths = new WeakMap<MarkupShape, Path2D>();

function pathOf(shape: MarkupShape) {
  let p = paths.get(shape);
  if (!p) paths.set(shape, (p = new Path2D(markupPath(shape))));
  return p;
}

export function drawMarkup(ctx: CanvasRenderingContext2D, m: MarkupShape) {
  ctx.save();
  ctx.strokeStyle = m.color;
  ctx.fillStyle = m.color;
  ctx.lineCap = "round";
  ctx.lineJoin = "round";
  ctx.lineWidth = m.strokeWidthPt;
  if (m.kind === "highlighter") {
    ctx.globalAlpha = 0.35;
    ctx.lineWidth = Math.max(8, m.strokeWidthPt * 6);
  }
  ctx.stroke(pathOf(m));
  const p = m.points;
  if (m.kind === "measure" || m.kind === "callout") {
    // End ticks for a measure, a dot on the thing a callout points at.
    ctx.beginPath();
    ctx.arc(p[0]!, p[1]!, Math.max(2, m.strokeWidthPt * 1.5), 0, Math.PI * 2);
    if (m.kind === "measure") ctx.arc(p[2]!, p[3]!, Math.max(2, m.strokeWidthPt * 1.5), 0, Math.PI * 2);
    ctx.fill();
  }
  if (m.text && (m.kind === "callout" || m.kind === "measure" || m.kind === "polyline")) {
    const size = 11;
    ctx.font = `600 ${size}px "Inter Tight", sans-serif`;
    const [tx, ty] = m.kind === "callout" ? [p[2]!, p[3]!] : m.kind === "measure" ? [(p[0]! + p[2]!) / 2, (p[1]! + p[3]!) / 2] : [p[p.length - 2]!, p[p.length - 1]!];
    const lines = m.text.split("\n").slice(0, 6);
    const w = Math.max(...lines.map((l) => ctx.measureText(l).width)) + 8;
    const h = lines.length * (size + 3) + 5;
    ctx.globalAlpha = 1;
    ctx.fillStyle = "rgba(255,253,248,0.92)";
    ctx.fillRect(tx + 4, ty - h / 2, w, h);
    ctx.lineWidth = 0.75;
    ctx.strokeRect(tx + 4, ty - h / 2, w, h);
    ctx.fillStyle = m.color;
    ctx.textBaseline = "top";
    lines.forEach((l, i) => ctx.fillText(l, tx + 8, ty - h / 2 + 3 + i * (size + 3)));
  }
  ctx.restore();
}
