// Invented drawing sheets for the demo register, drawn with pdf-lib: a title block, a roof outline, the heater
// and its pipework, and notes — enough to view, mark up and compare. Nothing here is a real drawing.
import { PDFDocument, rgb, StandardFonts } from "pdf-lib";

export interface DemoSheet {
  sheetNumber: string;
  title: string;
  label: string;
  description: string;
  unit: number;
  dischargeM: number;
}

export const DEMO_SHEETS: DemoSheet[] = [
  { sheetNumber: "P-105", title: "Unit 5 roof plumbing", label: "A", description: "Issued for construction.", unit: 5, dischargeM: 6.5 },
  { sheetNumber: "P-106", title: "Unit 6 roof plumbing", label: "A", description: "Issued for construction.", unit: 6, dischargeM: 3.8 },
];

export async function drawDemoSheet(s: DemoSheet): Promise<Uint8Array> {
  const doc = await PDFDocument.create();
  doc.setTitle(`${s.sheetNumber} ${s.title}`);
  const page = doc.addPage([1190.55, 841.89]);
  const font = await doc.embedFont(StandardFonts.Helvetica);
  const bold = await doc.embedFont(StandardFonts.HelveticaBold);
  const ink = rgb(0.1, 0.1, 0.1);
  page.drawRectangle({ x: 20, y: 20, width: 1150, height: 800, borderColor: ink, borderWidth: 1.2 });
  // Title block.
  page.drawRectangle({ x: 870, y: 20, width: 300, height: 130, borderColor: ink, borderWidth: 1 });
  page.drawText("KESTREL RISE TOWNHOUSES (DEMO)", { x: 880, y: 128, size: 10, font: bold });
  page.drawText(s.title.toUpperCase(), { x: 880, y: 108, size: 12, font: bold });
  page.drawText(`Sheet ${s.sheetNumber}   Rev ${s.label}   Scale 1:50`, { x: 880, y: 88, size: 10, font });
  page.drawText("Ridgeline Studio (demo practice)", { x: 880, y: 68, size: 9, font });
  page.drawText("Invented drawing for demonstration only", { x: 880, y: 34, size: 8, font });
  // Roof outline and parapet.
  page.drawRectangle({ x: 120, y: 260, width: 640, height: 440, borderColor: ink, borderWidth: 2 });
  page.drawRectangle({ x: 130, y: 270, width: 620, height: 420, borderColor: rgb(0.4, 0.4, 0.4), borderWidth: 0.8 });
  page.drawText(`UNIT ${s.unit} FLAT CONCRETE ROOF`, { x: 320, y: 670, size: 12, font: bold });
  // Heater, supply and discharge.
  page.drawRectangle({ x: 200, y: 460, width: 140, height: 60, borderColor: ink, borderWidth: 1.5 });
  page.drawText("150 L HEATER", { x: 228, y: 485, size: 10, font: bold });
  page.drawLine({ start: { x: 200, y: 470 }, end: { x: 150, y: 470 }, thickness: 2, color: rgb(0.1, 0.3, 0.7) });
  page.drawText("COLD 22", { x: 150, y: 476, size: 8, font });
  page.drawLine({ start: { x: 340, y: 500 }, end: { x: 520, y: 500 }, thickness: 2, color: rgb(0.7, 0.2, 0.1) });
  page.drawText("HOT 22", { x: 470, y: 506, size: 8, font });
  const run = 120 + s.dischargeM * 80;
  page.drawLine({ start: { x: 270, y: 460 }, end: { x: 270, y: 330 }, thickness: 1.5, dashArray: [6, 3], color: ink });
  page.drawLine({ start: { x: 270, y: 330 }, end: { x: Math.min(run, 740), y: 330 }, thickness: 1.5, dashArray: [6, 3], color: ink });
  page.drawText(`TP DISCHARGE 22 TO GUTTER OUTLET (${s.dischargeM.toFixed(1)} m)`, { x: 290, y: 338, size: 8, font });
  page.drawText("VB", { x: 350, y: 530, size: 8, font: bold });
  page.drawCircle({ x: 345, y: 525, size: 5, borderColor: ink, borderWidth: 1 });
  // Notes.
  const notes = ["NOTES", "1. Pipe sizes are copper outside diameters in mm.", "2. PRV 400 kPa at the unit's isolating valve.", "3. Drip tray with its own drain under the heater.", "4. Discharge to terminate where visible and harmless."];
  notes.forEach((n, i) => page.drawText(n, { x: 880, y: 760 - i * 16, size: i ? 9 : 10, font: i ? font : bold }));
  return doc.save();
}
