// The drawing register over real HTTP against the built app, PostgreSQL, the S3 fake and the mail fake:
// uploads (and every refusal, leaving no row and no object), background processing and its retry,
// superseding, compare with a change known in advance, transmittals by e-mail, the API, and access.
import { execFileSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { createHash } from "node:crypto";
import { GetObjectCommand, PutObjectCommand } from "@aws-sdk/client-s3";
import { PDFDocument, PDFName } from "pdf-lib";
import sharp from "sharp";
import { beforeAll, describe, expect, it } from "vitest";
import { AuditEvent, Drawing, DrawingRevision, TransmittalRecipient } from "../../db/models";
import { s3 } from "../../app/platform/storage.server";
import { A1_LANDSCAPE, encrypt, makeSheet, objectKeys, until, upload } from "../support/drawings";
import { makeProjectTeam, PASSWORD } from "../support/factory";
import { Client } from "../support/http";
import { linkIn, waitForMail } from "../support/mail";

type Who = "manager" | "architect" | "engineer" | "site_plumber" | "outsider";
let team: Awaited<ReturnType<typeof makeProjectTeam>>;
const as = {} as Record<Who, Client>;
let sheetNo = 0;
const nextSheet = (prefix = "T") => `${prefix}-${String(++sheetNo).padStart(3, "0")}`;

beforeAll(async () => {
  team = await makeProjectTeam();
  for (const role of ["manager", "architect", "engineer", "site_plumber"] as const) {
    as[role] = new Client();
    await as[role].signIn(team.users[role].email, PASSWORD);
  }
  as.outsider = new Client();
  await as.outsider.signIn(team.outsider.email, PASSWORD);
});

const projectId = () => team.project.id;

async function processed(revisionId: string, timeoutMs = 30_000) {
  return until(async () => {
    const r = await DrawingRevision.findByPk(revisionId);
    return r && (r.processing === "done" || r.processing === "failed") ? r : null;
  }, timeoutMs, `processing of ${revisionId}`);
}

async function uploadOk(who: Who, bytes: Uint8Array, fields: Parameters<typeof upload>[3]) {
  const res = await upload(as[who], projectId(), bytes, fields);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.stored as { drawingId: string; revisionId: string; label: string; status: string; sha256: string; sheetNumber: string; pageCount: number }[];
}

async function snapshot() {
  return {
    revisions: await DrawingRevision.count({ where: { projectId: projectId() } }),
    drawings: await Drawing.count({ where: { projectId: projectId() } }),
    objects: (await objectKeys(`projects/${projectId()}/revisions/`)).length,
  };
}

describe("upload", () => {
  it("stores a PDF by its SHA-256, records a draft revision, and processes it in the background", async () => {
    const bytes = await makeSheet({ lines: ["Ground floor plumbing layout", "Hot water riser DN22"], tag: "first" });
    const [stored] = await uploadOk("architect", bytes, { sheetNumber: "p-101", title: "Ground floor plumbing", scaleText: "1:50", description: "First issue" });
    expect(stored).toMatchObject({ sheetNumber: "P-101", label: "P1", status: "draft", pageCount: 1 });
    expect(await objectKeys(`projects/${projectId()}/revisions/${stored!.sha256}.pdf`)).toHaveLength(1);
    const done = await processed(stored!.revisionId);
    expect(done.processing).toBe("done");
    expect(done.pages).toEqual([{ widthPt: 1191, heightPt: 842 }]);
    const runs = (done.text ?? [])[0]!;
    const riser = runs.find((r) => r.s.includes("Hot water riser"));
    expect(riser).toBeDefined();
    // Text positions are in points from the top-left corner: the second line sits 80 + 36 pt from the top.
    expect(riser!.y).toBeGreaterThan(842 - (842 - 80 - 36) - 30);
    expect(riser!.y).toBeLessThan(842 - (842 - 80 - 36) + 5);
    expect(await objectKeys(`projects/${projectId()}/thumbs/${stored!.sha256}-p1.webp`)).toHaveLength(1);
    const thumb = await as.engineer.get(`/projects/${projectId()}/drawings/${stored!.drawingId}/revisions/${stored!.revisionId}/thumbs/1`);
    expect(thumb.status).toBe(200);
    expect(thumb.headers.get("content-type")).toBe("image/webp");
    expect(await AuditEvent.count({ where: { subjectId: stored!.revisionId, action: "revision.uploaded" } })).toBe(1);
  });

  it("stores a large sheet (sent to the store in parts) byte for byte", async () => {
    // A one-page sheet carrying an unused 40 MB stream: over the size that goes up as a multipart upload.
    const doc = await PDFDocument.load(await makeSheet({ tag: `large-${Date.now()}` }));
    const filler = new Uint8Array(40 * 1024 * 1024);
    for (let i = 0; i < filler.length; i += 4096) filler[i] = i & 0xff;
    doc.catalog.set(PDFName.of("Filler"), doc.context.register(doc.context.stream(filler)));
    const bytes = await doc.save({ useObjectStreams: false });
    const [stored] = await uploadOk("architect", bytes, { sheetNumber: nextSheet("BIG"), title: "Large sheet" });
    const rev = (await DrawingRevision.findByPk(stored!.revisionId))!;
    const body = (await s3.send(new GetObjectCommand({ Bucket: process.env.S3_BUCKET ?? "countersign-test", Key: rev.objectKey }))).Body!;
    const back = Buffer.from(await body.transformToByteArray());
    expect(back.length).toBe(bytes.length);
    expect(createHash("sha256").update(back).digest("hex")).toBe(stored!.sha256);
  }, 60_000);

  it("recognises the same bytes uploaded twice and stores nothing new", async () => {
    const bytes = await makeSheet({ tag: "dedupe" });
    const sheet = nextSheet();
    const [first] = await uploadOk("architect", bytes, { sheetNumber: sheet, title: "Dedupe" });
    const before = await snapshot();
    const again = await upload(as.manager, projectId(), bytes, { sheetNumber: nextSheet(), title: "Same bytes, other name" }, "renamed.pdf");
    expect(again.status).toBe(409);
    expect(again.body.message).toContain(`revision ${first!.label} of sheet ${sheet}`);
    expect(again.body.duplicates[0]).toMatchObject({ revisionId: first!.revisionId });
    expect(await snapshot()).toEqual(before);
  });

  it("keeps one revision and its object when the same bytes arrive twice at the same moment", async () => {
    const bytes = await makeSheet({ tag: `race-${Date.now()}` });
    const results = await Promise.all(
      [nextSheet("RACE"), nextSheet("RACE"), nextSheet("RACE")].map((sheetNumber) => upload(as.architect, projectId(), bytes, { sheetNumber, title: "Same bytes at once" })),
    );
    const statuses = results.map((r) => r.status).sort();
    expect(statuses.filter((s) => s === 201), JSON.stringify(results.map((r) => r.body))).toHaveLength(1);
    expect(statuses.every((s) => s === 201 || s === 409)).toBe(true);
    const stored = results.find((r) => r.status === 201)!.body.stored[0];
    const rev = (await DrawingRevision.findByPk(stored.revisionId))!;
    // The losers' clean-up must not take the object the winner's row names.
    expect(await objectKeys(rev.objectKey)).toEqual([rev.objectKey]);
    await processed(stored.revisionId);
  });

  it("adds a revision to an existing sheet with the next label, or the label given", async () => {
    const sheet = nextSheet();
    await uploadOk("architect", await makeSheet({ tag: `${sheet}-1` }), { sheetNumber: sheet, title: "Revisions" });
    const [second] = await uploadOk("architect", await makeSheet({ tag: `${sheet}-2` }), { sheetNumber: sheet });
    expect(second!.label).toBe("P2");
    const [third] = await uploadOk("manager", await makeSheet({ tag: `${sheet}-3` }), { sheetNumber: sheet, label: "a" });
    expect(third!.label).toBe("A");
    const taken = await upload(as.manager, projectId(), await makeSheet({ tag: `${sheet}-4` }), { sheetNumber: sheet, label: "P2" });
    expect(taken.status).toBe(409);
    expect(taken.body.message).toContain("already has a revision P2");
    expect(await DrawingRevision.count({ where: { drawingId: second!.drawingId } })).toBe(3);
  });

  it("takes a site plumber's sketch in as issued for review", async () => {
    const [s] = await uploadOk("site_plumber", await makeSheet({ tag: "sketch", lines: ["Proposed re-routing of discharge pipe"] }), { sheetNumber: nextSheet("SK"), title: "Re-routing sketch" });
    expect(s!.status).toBe("for_review");
    const row = await DrawingRevision.findByPk(s!.revisionId);
    expect(row!.issuedById).toBe(team.users.site_plumber.id);
  });

  it("splits a multi-sheet set per page, or keeps it as one sheet, as chosen", async () => {
    const set = await makeSheet({ pages: 3, tag: "set" });
    const base = nextSheet("SET");
    const split = await uploadOk("architect", set, { sheetNumber: base, title: "Set", mode: "split" });
    expect(split.map((s) => s.sheetNumber)).toEqual([`${base}-01`, `${base}-02`, `${base}-03`]);
    expect(split.every((s) => s.pageCount === 1)).toBe(true);
    expect(new Set(split.map((s) => s.sha256)).size).toBe(3);
    const whole = await uploadOk("architect", await makeSheet({ pages: 3, tag: "set-whole" }), { sheetNumber: nextSheet("SET"), mode: "single" });
    expect(whole).toHaveLength(1);
    expect(whole[0]!.pageCount).toBe(3);
  });

  it("accepts a real PDF whatever its file name says", async () => {
    const res = await upload(as.architect, projectId(), await makeSheet({ tag: "named-png" }), { sheetNumber: nextSheet() }, "photo.png", "image/png");
    expect(res.status).toBe(201);
  });
});

describe("bad input: a clear message, no row and no object left", () => {
  const png = Buffer.from("89504e470d0a1a0a0000000d4948445200000001000000010806000000", "hex");
  const cases: [string, () => Promise<Uint8Array>, number, RegExp, string?][] = [
    ["not a PDF (a PNG named .pdf)", async () => new Uint8Array(png), 422, /not a PDF, whatever its name says/],
    ["zero bytes", async () => new Uint8Array(0), 422, /empty \(0 bytes\)/],
    ["truncated", async () => (await makeSheet({ tag: "trunc", pages: 2 })).slice(0, 900), 422, /incomplete/],
    ["corrupt", async () => new Uint8Array(Buffer.from(`%PDF-1.7\n${"garbage ".repeat(400)}\ntrailer\n<< /Root 99 0 R >>\n%%EOF\n`)), 422, /damaged/],
    ["password-protected", async () => encrypt(await makeSheet({ tag: "locked" }), "open-sesame"), 422, /password-protected/],
    ["encrypted without a password", async () => encrypt(await makeSheet({ tag: "restricted" }), ""), 422, /encrypted/],
    ["too many pages", async () => makeSheet({ pages: Number(process.env.UPLOAD_MAX_PAGES ?? 100) + 1, size: [200, 200] }), 422, /pages; the most Countersign accepts/],
  ];
  for (const [name, make, status, message] of cases) {
    it(`refuses ${name}`, async () => {
      const before = await snapshot();
      const res = await upload(as.architect, projectId(), await make(), { sheetNumber: nextSheet("BAD"), title: name });
      expect(res.status, JSON.stringify(res.body)).toBe(status);
      expect(res.body).toMatchObject({ status });
      expect(res.body.message).toMatch(message);
      expect(await snapshot()).toEqual(before);
    });
  }

  it("refuses a file over the size limit while it streams, keeping nothing", async () => {
    const limit = Number(process.env.UPLOAD_MAX_BYTES ?? 200 * 1024 * 1024);
    const before = await snapshot();
    const chunk = new Uint8Array(1024 * 1024).fill(32);
    let sent = 0;
    const head = new TextEncoder().encode("%PDF-1.7\n");
    const boundary = "----countersign-test-boundary";
    const enc = new TextEncoder();
    const body = new ReadableStream<Uint8Array>({
      start(c) {
        c.enqueue(enc.encode(`--${boundary}\r\nContent-Disposition: form-data; name="sheetNumber"\r\n\r\nBIG-1\r\n--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="big.pdf"\r\nContent-Type: application/pdf\r\n\r\n`));
        c.enqueue(head);
      },
      pull(c) {
        if (sent > limit + 2 * chunk.length) {
          c.enqueue(enc.encode(`\r\n--${boundary}--\r\n`));
          c.close();
          return;
        }
        sent += chunk.length;
        c.enqueue(chunk);
      },
    });
    // No Content-Length: the server must count the bytes itself.
    const res = await as.architect
      .request(`/projects/${projectId()}/drawings/upload`, { method: "POST", body, headers: { "content-type": `multipart/form-data; boundary=${boundary}`, accept: "application/json" }, duplex: "half" } as RequestInit)
      .catch((e: Error) => ({ status: -1, error: e }) as const);
    if ("error" in res) throw res.error;
    expect(res.status).toBe(413);
    expect((await res.json()).message).toMatch(/larger than/);
    expect(await snapshot()).toEqual(before);
  }, 60_000);

  it("refuses a bad sheet number beside the field, before taking the file", async () => {
    const before = await snapshot();
    const res = await upload(as.architect, projectId(), await makeSheet({ tag: "bad-field" }), { sheetNumber: "!!" });
    expect(res.status).toBe(422);
    expect(res.body.message).toMatch(/Sheet number: Use letters, digits/);
    expect(await snapshot()).toEqual(before);
  });

  it("tells the user when the file store is down, and records nothing", async () => {
    const run = process.env.COUNTERSIGN_RUN ?? "test";
    const pidFile = `.run/${run}/s3.pid`;
    const before = await snapshot();
    const pid = Number(readFileSync(pidFile, "utf8"));
    process.kill(pid, "SIGKILL");
    try {
      await until(async () => { try { process.kill(pid, 0); return false; } catch { return true; } }, 5_000, "the S3 fake to stop");
      const res = await upload(as.architect, projectId(), await makeSheet({ tag: "s3-down" }), { sheetNumber: nextSheet("DOWN"), title: "While storage is down" });
      expect(res.status).toBe(503);
      expect(res.body.message).toMatch(/file store is not answering, so nothing was stored or recorded/);
    } finally {
      execFileSync("bash", ["storage/fakes.sh", "up", run], { stdio: "pipe" });
    }
    expect(await snapshot()).toEqual(before);
  });
});

describe("processing", () => {
  it("shows why processing failed, and a retry processes it", async () => {
    const bytes = await makeSheet({ tag: "retry" });
    const [s] = await uploadOk("architect", bytes, { sheetNumber: nextSheet("RT"), title: "Retry" });
    await processed(s!.revisionId);
    const key = `projects/${projectId()}/revisions/${s!.sha256}.pdf`;
    const bucket = process.env.S3_BUCKET ?? "countersign-test";
    // Damage the stored object (same length), mark the revision failed, and ask for a retry.
    const junk = Buffer.alloc(bytes.length, 0x41);
    await s3.send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: junk, ContentLength: junk.length }));
    await DrawingRevision.update({ processing: "failed", processingError: "earlier failure" }, { where: { id: s!.revisionId } });
    const page = `/projects/${projectId()}/drawings/${s!.drawingId}`;
    expect((await as.architect.post(page, { intent: "retry", revisionId: s!.revisionId })).status).toBe(200);
    const failed = await until(async () => {
      const r = await DrawingRevision.findByPk(s!.revisionId);
      return r?.processing === "failed" && r.processingError !== "earlier failure" ? r : null;
    }, 30_000, "a failed processing");
    expect(failed.processingError).toMatch(/could not be read|damaged|Processing stopped/);
    const html = await (await as.architect.get(page)).text();
    expect(html).toContain("Processing failed");
    expect(html).toContain("Retry processing");

    await s3.send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: Buffer.from(bytes), ContentLength: bytes.length }));
    expect((await as.engineer.post(page, { intent: "retry", revisionId: s!.revisionId })).status).toBe(403);
    expect((await as.architect.post(page, { intent: "retry", revisionId: s!.revisionId })).status).toBe(200);
    expect((await processed(s!.revisionId)).processing).toBe("done");
  }, 60_000);
});

describe("issuing, superseding and transmittals", () => {
  it("accepting a revision supersedes the previous accepted one in one audited step, and mails each recipient", async () => {
    const sheet = nextSheet("IS");
    const [p1] = await uploadOk("architect", await makeSheet({ tag: `${sheet}-1` }), { sheetNumber: sheet, title: "Issue test" });
    const [p2] = await uploadOk("architect", await makeSheet({ tag: `${sheet}-2` }), { sheetNumber: sheet, description: "Discharge re-routed" });
    const tx = `/projects/${projectId()}/transmittals`;
    const first = await as.architect.request(tx, {
      method: "POST",
      body: new URLSearchParams([["intent", "issue"], ["revisionIds", p1!.revisionId], ["status", "accepted"], ["recipientIds", team.users.engineer.id], ["reason", "For construction"]]),
    });
    expect(first.status).toBe(302);
    expect((await DrawingRevision.findByPk(p1!.revisionId))!.status).toBe("accepted");

    const second = await as.architect.request(tx, {
      method: "POST",
      body: new URLSearchParams([
        ["intent", "issue"], ["revisionIds", p2!.revisionId], ["status", "accepted"],
        ["recipientIds", team.users.engineer.id], ["recipientIds", team.users.site_plumber.id], ["reason", "Discharge route changed on site"],
      ]),
    });
    expect(second.status).toBe(302);
    const transmittalPath = second.headers.get("location")!;
    const [old, current] = await Promise.all([DrawingRevision.findByPk(p1!.revisionId), DrawingRevision.findByPk(p2!.revisionId)]);
    expect(old!.status).toBe("superseded");
    expect(old!.supersededById).toBe(p2!.revisionId);
    expect(current!.status).toBe("accepted");
    expect(current!.supersedesId).toBe(p1!.revisionId);
    expect(await DrawingRevision.count({ where: { drawingId: p1!.drawingId, status: "accepted" } })).toBe(1);
    expect(await AuditEvent.count({ where: { subjectId: p1!.revisionId, action: "revision.superseded" } })).toBe(1);

    // The register and the API show the accepted revision as current.
    const api = await as.site_plumber.json(`/api/projects/${projectId()}/drawings/${p1!.drawingId}`);
    expect(api.body.drawing.current.id).toBe(p2!.revisionId);

    for (const who of ["engineer", "site_plumber"] as const) {
      // The earlier P1 transmittal has the same subject: wait for the one about P2.
      const mail = await waitForMail(team.users[who].email, /Transmittal \d+: 1 revision\(s\) accepted for construction/, 10_000, /revision P2/);
      expect(mail.text).toContain(`${sheet} revision P2`);
      expect(mail.text).toContain("Discharge route changed on site");
      expect(linkIn(mail, "/transmittals/")).toBe(transmittalPath);
    }

    // New to the plumber until opened; opening records seen_at.
    const listBefore = await (await as.site_plumber.get(tx)).text();
    expect(listBefore).toMatch(/data-testid="new"/);
    expect((await as.site_plumber.get(transmittalPath)).status).toBe(200);
    const seen = await TransmittalRecipient.findOne({ where: { userId: team.users.site_plumber.id, transmittalId: transmittalPath.split("/").pop()! } });
    expect(seen!.seenAt).toBeInstanceOf(Date);
    const listAfter = await (await as.site_plumber.get(tx)).text();
    expect(listAfter).not.toMatch(/data-testid="new"/);
    // A member it was not sent to does not see it.
    expect((await as.manager.get(transmittalPath)).status).toBe(200); // issuers see all
    const outsiderView = await as.outsider.get(transmittalPath);
    expect(outsiderView.status).toBe(403);
  });

  it("refuses issuing by a role without the right, a superseded revision, or to a non-member", async () => {
    const sheet = nextSheet("IS");
    const [p1] = await uploadOk("architect", await makeSheet({ tag: `${sheet}-x` }), { sheetNumber: sheet, title: "Refusals" });
    const tx = `/projects/${projectId()}/transmittals`;
    const body = (rev: string, to: string) => new URLSearchParams([["intent", "issue"], ["revisionIds", rev], ["status", "for_review"], ["recipientIds", to], ["reason", "Check"]]);
    expect((await as.site_plumber.request(tx, { method: "POST", body: body(p1!.revisionId, team.users.engineer.id) })).status).toBe(403);
    const toOutsider = await as.architect.request(tx, { method: "POST", body: body(p1!.revisionId, team.outsider.id) });
    expect(toOutsider.status).toBe(422);
    expect(await toOutsider.text()).toContain("members of this project only");
    expect((await DrawingRevision.findByPk(p1!.revisionId))!.status).toBe("draft");
  });
});

describe("compare", () => {
  // Two A1 sheets that differ in a way known in advance: one pipe run (box) added at x 1500–1800 pt,
  // y 900–1050 pt from the bottom, and one word changed (DN22 → DN28) plus one added ("insulated").
  const common = { size: A1_LANDSCAPE, boxes: [{ x: 300, y: 300, w: 400, h: 200 }] };
  let drawingId = "";
  let fromId = "";
  let toId = "";

  beforeAll(async () => {
    const sheet = nextSheet("CMP");
    const [a] = await uploadOk("architect", await makeSheet({ ...common, lines: ["Hot water supply DN22 to geyser"] }), { sheetNumber: sheet, title: "Compare", description: "Original layout" });
    const [b] = await uploadOk("architect", await makeSheet({ ...common, lines: ["Hot water supply DN28 insulated to geyser"], boxes: [...common.boxes, { x: 1500, y: 900, w: 300, h: 150 }] }), {
      sheetNumber: sheet,
      description: "Supply upsized; new branch to the second bathroom",
    });
    drawingId = a!.drawingId;
    fromId = a!.revisionId;
    toId = b!.revisionId;
    await Promise.all([processed(fromId), processed(toId)]);
  }, 60_000);

  it("finds the added run as a region and the changed words, through the API", async () => {
    const { status, body } = await as.engineer.json(`/api/projects/${projectId()}/drawings/${drawingId}/compare?from=${fromId}&to=${toId}`);
    expect(status).toBe(200);
    const h = A1_LANDSCAPE[1];
    const expected = { x: 1500, y: h - 900 - 150, w: 300, h: 150 }; // top-left origin
    const covers = body.visual.regions.find(
      (r: any) => r.xPt <= expected.x + 5 && r.yPt <= expected.y + 5 && r.xPt + r.wPt >= expected.x + expected.w - 5 && r.yPt + r.hPt >= expected.y + expected.h - 5,
    );
    expect(covers, JSON.stringify(body.visual.regions)).toBeDefined();
    expect(covers.kind).toBe("added");
    expect(covers.wPt).toBeLessThan(expected.w + 60);
    // Nothing changed near the untouched box.
    expect(body.visual.regions.some((r: any) => r.xPt < 700 && r.yPt > h - 520 && r.yPt < h - 280)).toBe(false);
    expect(body.text.available).toBe(true);
    expect(body.text.removedWords).toEqual(["DN22"]);
    expect(body.text.addedWords).toEqual(["DN28", "insulated"]);
    expect(body.descriptions).toEqual({ from: "Original layout", to: "Supply upsized; new branch to the second bathroom" });
  });

  it("renders the compare page and its overlay image", async () => {
    const page = await as.site_plumber.get(`/projects/${projectId()}/drawings/${drawingId}/compare?from=${fromId}&to=${toId}`);
    expect(page.status).toBe(200);
    const html = (await page.text()).replace(/<!-- -->/g, "");
    expect(html).toContain("Changed regions");
    expect(html).toContain("Added");
    expect(html).toContain("DN28");
    const img = await as.site_plumber.get(`/projects/${projectId()}/drawings/${drawingId}/overlay?from=${fromId}&to=${toId}&page=1`);
    expect(img.status).toBe(200);
    expect(img.headers.get("content-type")).toBe("image/png");

    // The picture itself: the size the figures speak of, the added run in the added colour, the untouched box faint.
    const { body } = await as.engineer.json(`/api/projects/${projectId()}/drawings/${drawingId}/compare?from=${fromId}&to=${toId}`);
    const { widthPx, heightPx, scale } = body.visual;
    const { data, info } = await sharp(Buffer.from(await img.arrayBuffer())).removeAlpha().raw().toBuffer({ resolveWithObject: true });
    expect([info.width, info.height]).toEqual([widthPx, heightPx]);
    const h = A1_LANDSCAPE[1];
    const coloursAround = (xPt: number, yPt: number) => {
      const found = new Set<string>();
      const [cx, cy] = [Math.round(xPt * scale), Math.round(yPt * scale)];
      for (let y = cy - 6; y <= cy + 6; y++) for (let x = cx - 6; x <= cx + 6; x++) found.add([...data.subarray((y * widthPx + x) * 3, (y * widthPx + x) * 3 + 3)].join());
      return found;
    };
    const [paper, removed, added, unchanged] = ["255,255,255", "178,86,34", "52,84,122", "196,190,180"];
    const newRun = coloursAround(1500, h - 900 - 75); // left side of the added box, halfway up
    expect(newRun).toContain(added);
    expect(newRun).not.toContain(removed);
    const oldBox = coloursAround(300, h - 300 - 100); // left side of the box in both revisions
    expect([...oldBox].sort()).toEqual([paper, unchanged].sort());
    expect(coloursAround(1000, 200)).toEqual(new Set([paper]));
  });

  it("refuses to compare a revision with itself, or with one from another sheet", async () => {
    const same = await as.engineer.json(`/api/projects/${projectId()}/drawings/${drawingId}/compare?from=${fromId}&to=${fromId}`);
    expect(same.status).toBe(422);
    const elsewhere = await DrawingRevision.findOne({ where: { projectId: projectId(), label: "P1" }, order: [["createdAt", "ASC"]] });
    const cross = await as.engineer.json(`/api/projects/${projectId()}/drawings/${drawingId}/compare?from=${elsewhere!.id}&to=${toId}`);
    expect(cross.status).toBe(404);
  });
});

describe("viewer file, downloads and the API", () => {
  let d: { drawingId: string; revisionId: string; sha256: string };
  let bytes: Uint8Array;
  beforeAll(async () => {
    bytes = await makeSheet({ size: A1_LANDSCAPE, tag: "viewer", pages: 2 });
    [d] = (await uploadOk("architect", bytes, { sheetNumber: nextSheet("V"), title: "Viewer" })) as any;
  });

  it("serves the PDF to members with Range support", async () => {
    const url = `/projects/${projectId()}/drawings/${d.drawingId}/revisions/${d.revisionId}/file`;
    const whole = await as.site_plumber.get(url);
    expect(whole.status).toBe(200);
    expect(whole.headers.get("accept-ranges")).toBe("bytes");
    expect(Buffer.from(await whole.arrayBuffer()).equals(Buffer.from(bytes))).toBe(true);
    const part = await as.site_plumber.get(url, { headers: { range: "bytes=0-99" } });
    expect(part.status).toBe(206);
    expect(part.headers.get("content-range")).toBe(`bytes 0-99/${bytes.length}`);
    expect((await part.arrayBuffer()).byteLength).toBe(100);
    const page = await as.site_plumber.get(`/projects/${projectId()}/drawings/${d.drawingId}?rev=${d.revisionId}&page=2&zoom=2&x=100&y=200`);
    expect(page.status).toBe(200);
  });

  it("lists drawings and revisions, gives metadata and a short-lived download link", async () => {
    const list = await as.engineer.json(`/api/projects/${projectId()}/drawings`);
    expect(list.status).toBe(200);
    expect(list.body.drawings.some((x: any) => x.id === d.drawingId)).toBe(true);
    const meta = await as.engineer.json(`/api/projects/${projectId()}/drawings/${d.drawingId}/revisions/${d.revisionId}`);
    expect(meta.body.revision).toMatchObject({ id: d.revisionId, sha256: d.sha256, pageCount: 2 });
    expect(JSON.stringify(meta.body)).not.toContain("objectKey");
    const dl = await as.engineer.json(`/api/projects/${projectId()}/drawings/${d.drawingId}/revisions/${d.revisionId}/download`);
    expect(dl.status).toBe(200);
    const url = new URL(dl.body.url);
    expect(Number(url.searchParams.get("X-Amz-Expires"))).toBeLessThanOrEqual(300);
    const file = await fetch(url);
    expect(file.status).toBe(200);
    expect(Buffer.from(await file.arrayBuffer()).equals(Buffer.from(bytes))).toBe(true);
  });

  it("exports the register as CSV", async () => {
    const res = await as.engineer.get(`/projects/${projectId()}/drawings/csv`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toContain("text/csv");
    const csv = await res.text();
    expect(csv.split("\r\n")[0]).toBe("Sheet,Title,Discipline,Scale,Current revision,Status,Pages,Revisions,Issued at,Updated");
    expect(csv).toContain("P-101,Ground floor plumbing,Plumbing,1:50,P1,Draft,1,P1,");
  });

  it("answers API errors as { status, message }", async () => {
    const missing = await as.engineer.json(`/api/projects/${projectId()}/drawings/00000000-0000-4000-8000-000000000000`);
    expect(missing).toEqual({ status: 404, body: { status: 404, message: "No such sheet in this project." } });
    const signedOut = await new Client().json(`/api/projects/${projectId()}/drawings`);
    expect(signedOut.status).toBe(401);
    expect(signedOut.body).toMatchObject({ status: 401 });
  });

  describe("a non-member", () => {
    it("cannot list, view, download or compare anything, by page or API", async () => {
      const p = projectId();
      const rev = `/projects/${p}/drawings/${d.drawingId}/revisions/${d.revisionId}`;
      for (const path of [`/projects/${p}/drawings`, `/projects/${p}/drawings/${d.drawingId}`, `${rev}/file`, `${rev}/thumbs/1`, `/projects/${p}/drawings/csv`, `/projects/${p}/transmittals`, `/projects/${p}/drawings/${d.drawingId}/compare`]) {
        const res = await as.outsider.get(path);
        expect(res.status, path).toBe(403);
        expect(await res.text()).not.toContain(d.sha256);
      }
      for (const path of [`/api/projects/${p}/drawings`, `/api/projects/${p}/drawings/${d.drawingId}`, `/api${rev}`, `/api${rev}/download`, `/api/projects/${p}/drawings/${d.drawingId}/compare?from=${d.revisionId}&to=${d.revisionId}`]) {
        const res = await as.outsider.json(path);
        expect(res.status, path).toBe(403);
        expect(res.body).toMatchObject({ status: 403 });
      }
      const before = await snapshot();
      const up = await upload(as.outsider, p, await makeSheet({ tag: "outsider" }), { sheetNumber: "X-1", title: "Intruder" });
      expect(up.status).toBe(403);
      expect(await snapshot()).toEqual(before);
    });

    it("gets nothing by putting guessed ids or keys under a project of their own", async () => {
      const own = team.otherProject.id;
      for (const path of [
        `/projects/${own}/drawings/${d.drawingId}`,
        `/projects/${own}/drawings/${d.drawingId}/revisions/${d.revisionId}/file`,
        `/projects/${own}/drawings/${d.drawingId}/revisions/${d.sha256}/file`,
        `/projects/${own}/drawings/not-a-uuid/revisions/${d.revisionId}/file`,
      ]) {
        const res = await as.outsider.get(path);
        expect(res.status, path).toBe(404);
      }
      for (const path of [`/api/projects/${own}/drawings/${d.drawingId}`, `/api/projects/${own}/drawings/${d.drawingId}/revisions/${d.revisionId}/download`]) {
        expect((await as.outsider.json(path)).status, path).toBe(404);
      }
      const list = await as.outsider.json(`/api/projects/${own}/drawings`);
      expect(list.body.drawings).toEqual([]);
    });

    it("a member cannot reach a revision through another sheet's id", async () => {
      const other = await Drawing.findOne({ where: { projectId: projectId(), sheetNumber: "P-101" } });
      const res = await as.engineer.get(`/projects/${projectId()}/drawings/${other!.id}/revisions/${d.revisionId}/file`);
      expect(res.status).toBe(404);
    });
  });

  it("an engineer may view but not upload", async () => {
    const before = await snapshot();
    const res = await upload(as.engineer, projectId(), await makeSheet({ tag: "engineer" }), { sheetNumber: nextSheet(), title: "No" });
    expect(res.status).toBe(403);
    expect(await snapshot()).toEqual(before);
  });
});
