// pdf.js ships no types for its worker module; the server only hands it back to pdf.js (app/drawings/pdf.server.ts).
declare module "pdfjs-dist/legacy/build/pdf.worker.mjs" {
  export const WorkerMessageHandler: unknown;
}
