// Loads the demo scenario once (skips when the demo manager already exists). `tsx db/seed.ts`, or from db/start.ts.
import { hashPassword } from "../app/accounts/password.server";
import { DEMO_PASSWORD, DEMO_PEOPLE, DEMO_PROJECT, DEMO_REQUESTS } from "./demo";
import { createHash } from "node:crypto";
import { pathToFileURL } from "node:url";
import { processRevision } from "../app/drawings/processing.server";
import { putObject } from "../app/platform/storage.server";
import { drawDemoSheet, DEMO_SHEETS } from "./demo-sheets";
import { DeviationRequest, Drawing, DrawingRevision, Project, ProjectMember, RequestVersion, sequelize, User } from "./models";

/** Loads whatever part of the demo is missing; leaves the connection open for the caller. */
export async function loadDemo() {
  const manager = DEMO_PEOPLE.find((p) => p.role === "manager")!;
  if (await User.findOne({ where: { email: manager.email } })) {
    console.log("demo data: already loaded");
  } else {
    const passwordHash = await hashPassword(DEMO_PASSWORD);
    await sequelize.transaction(async (transaction) => {
      const users = new Map<string, User>();
      for (const p of DEMO_PEOPLE) {
        users.set(
          p.email,
          await User.create(
            {
              email: p.email,
              name: p.name,
              phone: p.phone ?? null,
              profession: p.profession,
              passwordHash,
              registrationNumber: p.registrationNumber ?? null,
              registrationBody: p.registrationBody ?? null,
              registrationState: p.registrationNumber ? "unverified" : null,
              verifiedById: null,
              verifiedAt: null,
            },
            { transaction },
          ),
        );
      }
      const project = await Project.create({ ...DEMO_PROJECT, createdById: users.get(manager.email)!.id }, { transaction });
      for (const p of DEMO_PEOPLE) {
        await ProjectMember.create({ projectId: project.id, userId: users.get(p.email)!.id, role: p.role }, { transaction });
      }
    });
    console.log("demo data: loaded");
  }
  await seedRequests();
  await seedSheets();
}

// Run as a command (`tsx db/seed.ts`), not when imported by db/start.ts.
if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  try {
    await loadDemo();
  } finally {
    await sequelize.close();
  }
}

/** The demo requests, added once (also to a demo project loaded before requests existed). */
async function seedRequests() {
  const project = await Project.findOne({ where: { name: DEMO_PROJECT.name } });
  if (!project || (await DeviationRequest.count({ where: { projectId: project.id } }))) return;
  const byRole = async (role: string) => (await User.findOne({ where: { email: DEMO_PEOPLE.find((p) => p.role === role)!.email } }))!;
  const [plumber, engineer] = [await byRole("site_plumber"), await byRole("engineer")];
  await sequelize.transaction(async (transaction) => {
    for (const [i, r] of DEMO_REQUESTS.entries()) {
      const sent = r.state !== "draft";
      const submittedAt = sent ? new Date(Date.now() - 2 * 86_400_000) : null;
      const request = await DeviationRequest.create(
        {
          projectId: project.id, number: i + 1, title: r.title, provision: r.provision, clauseRef: r.clauseRef, state: r.state,
          assigneeId: sent ? engineer.id : null, submittedAt, dueAt: sent ? new Date(Date.now() + 3 * 86_400_000) : null,
          stateChangedAt: submittedAt ?? new Date(), createdById: plumber.id, lockVersion: sent ? 2 : 0,
        },
        { transaction },
      );
      await RequestVersion.create(
        { requestId: request.id, n: 1, title: r.title, provision: r.provision, clauseRef: r.clauseRef, siteConstraint: r.siteConstraint, proposal: r.proposal, measurements: r.measurements, createdById: plumber.id, submittedAt },
        { transaction },
      );
    }
  });
  console.log("demo data: requests loaded");
}

/** Two invented sheets in the register, stored in the object store and processed (pages, text, thumbnails). */
async function seedSheets() {
  const project = await Project.findOne({ where: { name: DEMO_PROJECT.name } });
  if (!project || (await Drawing.count({ where: { projectId: project.id } }))) return;
  const architect = (await User.findOne({ where: { email: DEMO_PEOPLE.find((p) => p.role === "architect")!.email } }))!;
  for (const sheet of DEMO_SHEETS) {
    const bytes = await drawDemoSheet(sheet);
    const sha256 = createHash("sha256").update(bytes).digest("hex");
    const objectKey = `projects/${project.id}/revisions/${sha256}.pdf`;
    await putObject(objectKey, bytes, { contentType: "application/pdf", contentLength: bytes.length });
    const drawing = await Drawing.create({ projectId: project.id, sheetNumber: sheet.sheetNumber, title: sheet.title, discipline: "Plumbing", scaleText: "1:50", createdById: architect.id });
    const revision = await DrawingRevision.create({
      projectId: project.id, drawingId: drawing.id, label: sheet.label, status: "accepted", description: sheet.description, objectKey, sha256,
      byteSize: bytes.length, originalFilename: `${sheet.sheetNumber}.pdf`, sourcePage: null, pageCount: 1, pages: [], uploadedById: architect.id,
      issuedById: architect.id, issuedAt: new Date(),
    });
    await processRevision(revision.id);
  }
  console.log("demo data: sheets loaded");
}
