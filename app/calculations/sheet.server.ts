// The printable calculation sheet: one A4 page in our own plain layout — what was calculated, for which
// project, by whom, with which engine; the inputs, method, sources, results and findings; and the caution.
// Set in Inter Tight, embedded like every Countersign PDF. Long inputs are cut to fit the page; the saved record
// has them all.
import { PDFDocument, rgb, type PDFFont, type PDFPage } from "pdf-lib";
import { embedFonts } from "~/platform/pdf-fonts.server";
import { wrap } from "~/platform/pdf-writer.server";
import type { BalanceInput, Figure } from "./kinds";
import { flatten } from "./compare";
import { formatDateTime, formatFigure, formatNumber } from "./format";
import { KIND_DEFINITIONS } from "./kinds";
import type { CalculationView } from "./calculations.server";

const A4 = { w: 595.28, h: 841.89 };
const MARGIN = 40;
const INK = rgb(0.11, 0.1, 0.09);
const SOFT = rgb(0.35, 0.32, 0.28);
const COPPER = rgb(0.6, 0.29, 0.13);
const RULE = rgb(0.85, 0.8, 0.72);

// Characters outside the embedded face's latin subset, spelt so a reader (and pdftotext) still gets them.
const SPELL: Record<string, string> = { "−": "-", "≤": "<=", "≥": ">=", "ρ": "rho", "Δ": "delta ", "→": "->", "Σ": "sum ", "π": "pi", "∫": "integral ", "√": "sqrt", "⚠": "!", "≈": "~", "✓": "ok", " ": " " };

class Writer {
  y = A4.h - MARGIN;
  private chars: Set<number>;
  constructor(
    readonly page: PDFPage,
    readonly regular: PDFFont,
    readonly bold: PDFFont,
    /** Lowest y the body may reach: the caution and footer sit below it. */
    readonly floor: number,
  ) {
    this.chars = new Set(regular.getCharacterSet());
  }

  clean(text: string): string {
    let out = "";
    for (const ch of text) out += this.chars.has(ch.codePointAt(0)!) ? ch : (SPELL[ch] ?? "?");
    return out;
  }

  /** The text as one paragraph, wrapped by the platform's writer (nothing for empty text). */
  wrap(text: string, size: number, width: number, font = this.regular): string[] {
    const flat = this.clean(text).split(/\s+/).filter(Boolean).join(" ");
    return flat ? wrap(flat, font, size, width) : [];
  }

  fits(height: number) {
    return this.y - height >= this.floor;
  }

  /** Writes wrapped text; false (and nothing written) when it does not fit. */
  text(text: string, { size = 8, font = this.regular, color = INK, x = MARGIN, width = A4.w - 2 * MARGIN, gap = 1.5 } = {}): boolean {
    const lines = this.wrap(text, size, width, font);
    const lh = size * 1.25;
    if (!this.fits(lines.length * lh)) return false;
    for (const l of lines) {
      this.y -= lh;
      this.page.drawText(l, { x, y: this.y, size, font, color });
    }
    this.y -= gap;
    return true;
  }

  heading(text: string) {
    if (!this.fits(20)) return false;
    this.y -= 6;
    this.text(text.toUpperCase(), { size: 8.5, font: this.bold, color: COPPER, gap: 2 });
    this.page.drawLine({ start: { x: MARGIN, y: this.y + 1 }, end: { x: A4.w - MARGIN, y: this.y + 1 }, thickness: 0.5, color: RULE });
    this.y -= 2;
    return true;
  }

  /** Rows in fixed columns; rows that do not fit are counted in a closing note. */
  table(columns: { label: string; width: number }[], rows: string[][], size = 7) {
    const lh = size * 1.3;
    const drawRow = (cells: string[], font: PDFFont) => {
      this.y -= lh;
      let x = MARGIN;
      cells.forEach((c, i) => {
        let t = this.clean(c);
        while (t.length > 1 && font.widthOfTextAtSize(t, size) > columns[i].width - 4) t = t.slice(0, -2) + "…";
        this.page.drawText(t, { x, y: this.y, size, font, color: INK });
        x += columns[i].width;
      });
    };
    if (!this.fits(lh * 2)) return;
    drawRow(columns.map((c) => c.label), this.bold);
    let shown = 0;
    for (const r of rows) {
      if (!this.fits(lh * (shown < rows.length - 1 ? 2 : 1))) break;
      drawRow(r, this.regular);
      shown++;
    }
    if (shown < rows.length) this.text(`… and ${rows.length - shown} more rows, in the saved record.`, { size, color: SOFT });
    this.y -= 3;
  }

  /** key: value pairs in two columns. */
  pairs(items: [string, string][], size = 7.5) {
    const colW = (A4.w - 2 * MARGIN) / 2;
    const lh = size * 1.3;
    let shown = 0;
    for (let i = 0; i < items.length; i += 2) {
      if (!this.fits(lh * 2)) break;
      this.y -= lh;
      for (let k = 0; k < 2 && i + k < items.length; k++) {
        const [key, value] = items[i + k];
        const x = MARGIN + k * colW;
        const label = this.clean(`${key}: `);
        this.page.drawText(label, { x, y: this.y, size, font: this.bold, color: SOFT });
        let v = this.clean(value);
        const room = colW - 8 - this.bold.widthOfTextAtSize(label, size);
        while (v.length > 1 && this.regular.widthOfTextAtSize(v, size) > room) v = v.slice(0, -2) + "…";
        this.page.drawText(v, { x: x + this.bold.widthOfTextAtSize(label, size), y: this.y, size, font: this.regular, color: INK });
        shown++;
      }
    }
    if (shown < items.length) this.text(`… and ${items.length - shown} more inputs, in the saved record.`, { size, color: SOFT });
    this.y -= 3;
  }
}

function balanceInputs(w: Writer, input: BalanceInput) {
  const net = input.network;
  const prv = net.supply.prv;
  w.pairs([
    ["Supply", `node ${net.supply.nodeId}, static ${net.supply.staticPressureKpa} kPa${net.supply.dynamicPressureKpa ? `, under flow ${net.supply.dynamicPressureKpa} kPa` : ""}`],
    ["Main PRV", prv ? `node ${prv.nodeId}, set to ${prv.settingKpa} kPa` : "none"],
    ["Heater", net.heater ? `node ${net.heater.nodeId}, loss ${net.heater.pressureLossKpa} kPa${net.heater.ratedFlowLps ? ` at ${net.heater.ratedFlowLps} L/s` : ""}` : "none"],
    ["Temperatures", `hot ${net.hotTempC ?? 60} °C, cold ${net.coldTempC ?? 20} °C`],
    ["Further PRVs", (net.prvs ?? []).map((p) => `${p.nodeId} ${p.settingKpa} kPa`).join("; ") || "none"],
    ["Balance limit", `${input.options?.balanceLimitPercent ?? 20} %`],
  ]);
  w.table(
    [{ label: "Segment", width: 78 }, { label: "From → to", width: 110 }, { label: "Service", width: 38 }, { label: "Pipe / bore", width: 70 }, { label: "Length m", width: 44 }, { label: "Rise m", width: 38 }, { label: "Fittings", width: 137 }],
    net.segments.map((s) => [
      s.id,
      `${s.fromNodeId} → ${s.toNodeId}`,
      s.service,
      s.pipeId ?? `${s.internalDiameterMm} mm bore`,
      String(s.lengthM),
      String(s.riseM ?? 0),
      [...(s.fittings ?? []).map((f) => `${f.count}× ${f.fittingId}`), ...(s.kTotal ? [`K ${s.kTotal}`] : [])].join(", ") || "—",
    ]),
  );
  w.table(
    [{ label: "Outlet", width: 90 }, { label: "Node", width: 80 }, { label: "Demand", width: 120 }, { label: "Mixing point", width: 225 }],
    net.outlets.map((o) => {
      const mp = net.mixingPoints.find((m) => m.hotOutletId === o.id || m.coldOutletId === o.id);
      return [o.id, o.nodeId, o.flowLps !== undefined ? `${o.flowLps} L/s stated` : o.loadingUnits !== undefined ? `${o.loadingUnits} LU` : `${o.fixture}`, mp ? `${mp.id} (${mp.hotOutletId === o.id ? "hot" : "cold"})` : "—"];
    }),
  );
}

function results(w: Writer, calc: CalculationView, figures: Figure[]) {
  if (calc.kind === "balance") {
    const out = calc.outputs;
    w.table(
      [{ label: "Mixing point", width: 110 }, { label: "Hot residual", width: 80 }, { label: "Cold residual", width: 80 }, { label: "Difference", width: 70 }, { label: "Limit", width: 50 }, { label: "Result", width: 125 }],
      out.mixingPoints.map((m: any) => [m.id, `${formatNumber(m.hotResidualKpa, 1)} kPa`, `${formatNumber(m.coldResidualKpa, 1)} kPa`, `${formatNumber(m.differencePercent, 1)} %`, `${m.limitPercent} %`, m.ok ? "PASS" : "FAIL"]),
    );
    const rest = figures.filter((f) => !f.key.startsWith("mp."));
    w.pairs(rest.map((f) => [f.label, f.ok === undefined ? formatFigure(f) : f.ok ? "PASS" : "FAIL"]));
    if (out.suggestion?.changes?.length) {
      w.text(`Suggested pipe changes: ${out.suggestion.changes.map((c: any) => `${c.segmentId} ${c.fromPipeId} -> ${c.toPipeId}`).join("; ")}${out.suggestion.resolved ? " (resolves every mixing point)" : ""}.`, { size: 7.5 });
    }
    if (out.suggestion?.balancingPrv) {
      const p = out.suggestion.balancingPrv;
      w.text(`Or a balancing PRV at node ${p.nodeId} set to ${Math.floor(p.settingKpa)} kPa: predicted ${formatNumber(p.predicted.differencePercent, 1)} %.`, { size: 7.5 });
    }
    return;
  }
  w.pairs(figures.map((f) => [f.label, f.ok === undefined ? formatFigure(f) : f.ok ? "PASS" : "FAIL"]));
}

export interface SheetContext {
  projectName: string;
  siteAddress: string;
  printedAt?: Date;
}

export async function calculationSheet(calc: CalculationView, ctx: SheetContext): Promise<Uint8Array> {
  const def = KIND_DEFINITIONS[calc.kind];
  const pdf = await PDFDocument.create();
  pdf.setTitle(`${calc.title} — calculation sheet`);
  pdf.setCreator("Countersign");
  pdf.setProducer("Countersign");
  const page = pdf.addPage([A4.w, A4.h]);
  const { regular, bold } = await embedFonts(pdf);

  // The caution and footer are laid out first, from the bottom, so the body can never push them off the page.
  const probe = new Writer(page, regular, bold, 0);
  const cautionLines = probe.wrap(`Caution. ${calc.outputs.caution}`, 8, A4.w - 2 * MARGIN - 16);
  const cautionH = cautionLines.length * 10 + 12;
  const footerY = MARGIN - 16;
  const cautionTop = footerY + 14 + cautionH;
  page.drawRectangle({ x: MARGIN, y: cautionTop - cautionH, width: A4.w - 2 * MARGIN, height: cautionH, borderColor: COPPER, borderWidth: 0.8, color: rgb(0.95, 0.89, 0.84) });
  cautionLines.forEach((l, i) => page.drawText(l, { x: MARGIN + 8, y: cautionTop - 14 - i * 10, size: 8, font: i === 0 ? bold : regular, color: INK }));
  const printed = ctx.printedAt ?? new Date();
  page.drawText(probe.clean(`Countersign calculation sheet · ${calc.id} · printed ${formatDateTime(printed)}`), { x: MARGIN, y: footerY, size: 6.5, font: regular, color: SOFT });

  const w = new Writer(page, regular, bold, cautionTop + 6);
  w.text("COUNTERSIGN · CALCULATION SHEET", { size: 7.5, font: bold, color: COPPER, gap: 3 });
  w.text(calc.title, { size: 15, font: bold, gap: 2 });
  w.text(`${def.label} — ${def.summary}`, { size: 8.5, color: SOFT });
  w.pairs([
    ["Project", `${ctx.projectName}, ${ctx.siteAddress}`],
    ["Run by", calc.createdBy.name],
    ["Date", formatDateTime(calc.createdAt)],
    ["Engine version", calc.engineVersion],
    ...(def.hasVerdict ? [["Result", calc.outputs.ok ? "PASS" : "FAIL"] as [string, string]] : []),
  ]);

  w.heading("Results");
  results(w, calc, def.figures(calc.inputs, calc.outputs));
  w.heading("Findings");
  const findings = calc.outputs.findings as { severity: string; rule: string }[];
  if (!findings.length) w.text("None: every rule checked here is met.");
  for (const f of findings) if (!w.text(`${f.severity === "fail" ? "FAILS" : f.severity === "warn" ? "WARNING" : "NOTE"} — ${f.rule}`, { size: 7.5 })) break;

  w.heading("Inputs");
  if (calc.kind === "balance") balanceInputs(w, calc.inputs as BalanceInput);
  else w.pairs([...flatten(calc.inputs)].map(([k, v]) => [k, v]));

  w.heading("Method");
  for (const m of def.method(calc.inputs, calc.outputs)) if (!w.text(m, { size: 7.5 })) break;
  w.heading("Sources");
  for (const s of def.sources(calc.inputs, calc.outputs)) if (!w.text(`• ${s}`, { size: 7 })) break;

  return pdf.save();
}
