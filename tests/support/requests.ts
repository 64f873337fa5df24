// Helpers for request tests: JSON calls to the API, photos made with sharp (so every test knows their bytes),
// uploads posted the way the attachment picker posts them, and a complete set of principle assessments.
import sharp from "sharp";
import { PRINCIPLES } from "../../app/review/principles";
import type { Client } from "./http";

export async function api(client: Client, method: "GET" | "POST", path: string, body?: unknown) {
  const res = await client.request(path, {
    method,
    headers: { accept: "application/json", ...(body !== undefined ? { "content-type": "application/json" } : {}) },
    body: body !== undefined ? JSON.stringify(body) : undefined,
  });
  const text = await res.text();
  let json: any;
  try {
    json = JSON.parse(text);
  } catch {
    json = { raw: text };
  }
  return { status: res.status, body: json };
}

export async function makePhoto(width = 640, height = 480, colour = "#9a4a20"): Promise<Uint8Array> {
  return new Uint8Array(await sharp({ create: { width, height, channels: 3, background: colour } }).jpeg({ quality: 80 }).toBuffer());
}

export async function attach(client: Client, projectId: string, requestId: string, bytes: Uint8Array, filename = "photo.jpg", type = "image/jpeg", forComment = false) {
  const form = new FormData();
  form.append("file", new Blob([bytes as Uint8Array<ArrayBuffer>], { type }), filename);
  const res = await client.request(`/projects/${projectId}/requests/${requestId}/attachments${forComment ? "?for=comment" : ""}`, { method: "POST", body: form, headers: { accept: "application/json" } });
  return { status: res.status, body: (await res.json()) as any };
}

export const CONTENT = {
  title: "Unit 5 discharge run on the flat roof",
  provision: "discharge",
  clauseRef: "discharge pipe clause (test)",
  siteConstraint: "The flat concrete roof leaves no route for the discharge pipe within the usual run.",
  proposal: "Run a 22 mm discharge pipe 6 m along the parapet to the gutter outlet, with two 45° bends.",
  measurements: [
    { kind: "lengthM", name: "Discharge run", value: 6 },
    { kind: "bendCount", name: "Bends", value: 2 },
    { kind: "staticPressureKpa", name: "Static pressure at meter", value: 550 },
  ],
};

export function principles(outcome: "not_affected" | "maintained" | "compromised" = "not_affected", reasoning = "") {
  return PRINCIPLES.map((p) => ({ principleId: p.id, outcome, reasoning }));
}
