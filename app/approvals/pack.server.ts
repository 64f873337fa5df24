// The approval pack: each affected sheet with the engineer's markups drawn in as vector graphics and an approval
// stamp (decision, number and version, engineer and registration, date, short hash, QR to the verification
// page), then a record page. Returns the unsaved document: signing adds its placeholder and is the last write.
import { PDFArray, PDFDocument, PDFPage, PDFRef, rgb, type PDFEmbeddedPage, type PDFFont } from "pdf-lib";
import QRCode from "qrcode";
import { embedFonts, printable, type PdfFonts } from "../platform/pdf-fonts.server";
import { a4Writer, COPPER, INK, SOFT, wrap } from "../platform/pdf-writer.server";
import { markupPath, type MarkupShape } from "../review/markups";

export interface PackSheet {
  sheetNumber: string;
  title: string;
  revisionLabel: string;
  sha256: string;
  pdf: Uint8Array;
  /** 1-based pages of the revision to include (all when omitted). */
  pages?: number[];
  markups: (MarkupShape & { page: number })[];
}

export interface PackInput {
  approval: { reference: string; version: number; decision: string; signedAt: Date; verifyUrl: string; snapshotSha256: string };
  engineer: { name: string; registrationNumber: string; registrationBody: string };
  project: { name: string; siteAddress: string };
  request: { title: string; provision: string; clauseRef: string; constraint: string; proposal: string };
  principles: { label: string; outcome: string; reasoning: string }[];
  conditions: string[];
  calculations: { title: string; lines: string[]; engineVersion: string }[];
  sheets: PackSheet[];
  caution: string;
}

const PAPER = rgb(1, 0.992, 0.973);

function hexColor(hex: string) {
  const n = Number.parseInt(hex.slice(1), 16);
  return rgb(((n >> 16) & 255) / 255, ((n >> 8) & 255) / 255, (n & 255) / 255);
}

function drawMarkup(page: PDFPage, m: MarkupShape, fonts: PdfFonts) {
  const height = page.getHeight();
  const color = hexColor(m.color);
  const common = { x: 0, y: height, borderColor: color, borderWidth: m.strokeWidthPt };
  if (m.kind === "highlighter") {
    page.drawSvgPath(markupPath({ ...m, kind: "polyline" }), { ...common, borderWidth: Math.max(m.strokeWidthPt, 8), borderOpacity: 0.35 });
    return;
  }
  if (m.kind === "callout") {
    const [ax, ay, bx, by] = m.points as [number, number, number, number];
    page.drawSvgPath(`M ${ax} ${ay} L ${bx} ${by}`, common);
    const lines = wrap(printable(m.text ?? ""), fonts.regular, 9, 180);
    const boxH = lines.length * 11 + 8;
    page.drawRectangle({ x: bx, y: height - by - boxH, width: 190, height: boxH, color: PAPER, borderColor: color, borderWidth: m.strokeWidthPt });
    lines.forEach((line, i) => page.drawText(line, { x: bx + 5, y: height - by - 13 - i * 11, size: 9, font: fonts.regular, color: INK }));
    return;
  }
  page.drawSvgPath(markupPath(m), common);
  if (m.kind === "measure" && m.text) {
    const [x1, y1, x2, y2] = m.points as [number, number, number, number];
    page.drawText(printable(m.text), { x: (x1 + x2) / 2 + 4, y: height - (y1 + y2) / 2 + 4, size: 9, font: fonts.semibold, color });
  }
}

function drawQr(page: PDFPage, url: string, x: number, y: number, size: number) {
  const qr = QRCode.create(url, { errorCorrectionLevel: "M" });
  const n = qr.modules.size;
  const cell = size / n;
  page.drawRectangle({ x: x - cell, y: y - cell, width: size + 2 * cell, height: size + 2 * cell, color: rgb(1, 1, 1) });
  // Every dark module as one square of a single path: one fill instead of a drawing operation per module.
  let path = "";
  for (let r = 0; r < n; r++) {
    for (let c = 0; c < n; c++) if (qr.modules.get(r, c)) path += `M${c * cell} ${r * cell}h${cell}v${cell}h${-cell}Z`;
  }
  page.drawSvgPath(path, { x, y: y + size, color: INK, borderWidth: 0 });
}

const STAMP = { width: 300, height: 112, margin: 18 };

/**
 * The part of the stamp that is the same on every sheet (box, decision, engineer, record hash, QR), drawn once
 * as a form XObject that each sheet's page places: a pack of fifty sheets lays out, subsets and stores it once
 * instead of fifty times. The form is drawn on a page that never joins the page tree and is removed once the
 * form holds its content and resources.
 */
async function stampForm(doc: PDFDocument, input: PackInput, fonts: PdfFonts) {
  const { width: w, height: h, margin } = STAMP;
  const canvas = PDFPage.create(doc);
  canvas.setSize(w, h);
  canvas.drawRectangle({ x: 0, y: 0, width: w, height: h, color: PAPER, borderColor: COPPER, borderWidth: 2, opacity: 0.96 });
  const text = stampText(canvas, 0, 0);
  text("COUNTERSIGN · RATIONAL DESIGN", 16, 7.5, fonts.bold, COPPER);
  text(input.approval.decision.toUpperCase(), 32, 12, fonts.bold);
  text(`${input.approval.reference} · approval v${input.approval.version}`, 46, 9, fonts.semibold);
  text(`${input.engineer.name}`, 60, 8.5, fonts.regular);
  text(`Reg. ${input.engineer.registrationNumber} (${input.engineer.registrationBody})`, 71, 7.5, fonts.regular, SOFT);
  text(`Record ${input.approval.snapshotSha256.slice(0, 12)} · verify by scanning`, 95, 7.5, fonts.regular, SOFT);
  text("Digitally signed; a printed copy is only a copy.", 106, 6.5, fonts.regular, SOFT);
  drawQr(canvas, input.approval.verifyUrl, w - 88, 14, 78);
  // The margin keeps the box's border and any wrapped line inside the form's clip, as when drawn on the sheet.
  const form = await doc.embedPage(canvas, { left: -margin, bottom: -margin, right: w + margin, top: h + margin });
  await form.embed();
  const contents = canvas.node.Contents();
  for (const ref of [...(contents instanceof PDFArray ? contents.asArray() : []), canvas.ref]) if (ref instanceof PDFRef) doc.context.delete(ref);
  return form;
}

/** A stamp line; one too long for the space left of the QR continues on the lines below. */
function stampText(page: PDFPage, x: number, y: number) {
  return (s: string, dy: number, size: number, font: PDFFont, color = INK) =>
    page.drawText(wrap(printable(s), font, size, STAMP.width - 100).join("\n"), { x: x + 10, y: y + STAMP.height - dy, size, font, color });
}

/** Places the shared stamp at the sheet's bottom right and adds the one line that names the sheet. */
function drawStamp(page: PDFPage, form: PDFEmbeddedPage, input: PackInput, sheet: PackSheet, fonts: PdfFonts) {
  const x = page.getWidth() - STAMP.width - STAMP.margin;
  const y = STAMP.margin;
  page.drawPage(form, { x: x - STAMP.margin, y: y - STAMP.margin });
  stampText(page, x, y)(`Signed ${input.approval.signedAt.toISOString().slice(0, 10)} · sheet ${sheet.sheetNumber} rev ${sheet.revisionLabel}`, 83, 7.5, fonts.regular, SOFT);
}

function recordPages(doc: PDFDocument, input: PackInput, fonts: PdfFonts) {
  const { para, heading } = a4Writer(doc, fonts);
  para("COUNTERSIGN · APPROVAL RECORD", 8, fonts.bold, COPPER);
  para(`${input.approval.reference}: ${input.request.title}`, 17, fonts.bold);
  para(`${input.approval.decision} · approval version ${input.approval.version} · signed ${input.approval.signedAt.toISOString().replace("T", " ").slice(0, 16)} UTC`, 10, fonts.semibold);
  para(`${input.project.name} · ${input.project.siteAddress}`, 9.5, fonts.regular, SOFT);
  para(`Engineer: ${input.engineer.name}, registration ${input.engineer.registrationNumber} (${input.engineer.registrationBody})`, 9.5, fonts.regular, SOFT);
  para(`Verify at ${input.approval.verifyUrl} · record hash ${input.approval.snapshotSha256}`, 8, fonts.regular, SOFT);

  heading("Request");
  para(`Provision: ${input.request.provision}${input.request.clauseRef ? ` (clause ${input.request.clauseRef})` : ""}`, 9.5, fonts.semibold);
  para(`Site constraint: ${input.request.constraint}`);
  para(`Proposal: ${input.request.proposal}`);

  heading("Safety and performance principles");
  for (const p of input.principles) {
    para(`${p.label} — ${p.outcome}`, 9.5, fonts.semibold);
    if (p.reasoning) para(p.reasoning, 9, fonts.regular, SOFT, 12);
  }

  heading("Conditions");
  if (input.conditions.length) input.conditions.forEach((c, i) => para(`${i + 1}. ${c}`));
  else para("None.");

  heading("Calculations");
  if (!input.calculations.length) para("None attached.");
  for (const c of input.calculations) {
    para(`${c.title} (engine ${c.engineVersion})`, 9.5, fonts.semibold);
    for (const l of c.lines) para(l, 9, fonts.regular, INK, 12);
  }

  heading("Drawings this approval rests on");
  for (const s of input.sheets) para(`${s.sheetNumber} rev ${s.revisionLabel} — ${s.title}\nSHA-256 ${s.sha256}`, 8.5);

  heading("Caution");
  para(input.caution, 8.5, fonts.regular, SOFT);
}

export async function buildApprovalPack(input: PackInput): Promise<PDFDocument> {
  const doc = await PDFDocument.create();
  doc.setTitle(`${input.approval.reference} approval v${input.approval.version}`);
  doc.setAuthor(input.engineer.name);
  doc.setCreator("Countersign");
  doc.setProducer("Countersign");
  doc.setCreationDate(input.approval.signedAt);
  doc.setModificationDate(input.approval.signedAt);
  const fonts = await embedFonts(doc);
  let stamp: PDFEmbeddedPage | undefined;
  for (const sheet of input.sheets) {
    const source = await PDFDocument.load(sheet.pdf, { updateMetadata: false });
    const wanted = (sheet.pages?.length ? sheet.pages : source.getPageIndices().map((i) => i + 1)).map((p) => p - 1);
    const copied = await doc.copyPages(source, wanted);
    for (const [i, page] of copied.entries()) {
      doc.addPage(page);
      const pageNo = wanted[i]! + 1;
      for (const m of sheet.markups.filter((x) => x.page === pageNo)) drawMarkup(page, m, fonts);
      stamp ??= await stampForm(doc, input, fonts);
      drawStamp(page, stamp, input, sheet, fonts);
    }
  }
  recordPages(doc, input, fonts);
  return doc;
}
