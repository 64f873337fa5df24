// Verifying an engineer's registration: only a project manager may; evidence is checked by content and stored;
// a signing identity is issued with its key encrypted at rest; revocation withdraws it.
import { PDFDocument } from "pdf-lib";
import { describe, expect, it } from "vitest";
import { activeSigningIdentity } from "../../app/approvals/verification.server";
import { objectExists } from "../../app/platform/storage.server";
import { AuditEvent, ProjectMember, RegistrationVerification, SigningKey, User } from "../../db/models";
import { makeProjectTeam, PASSWORD } from "../support/factory";
import { Client } from "../support/http";

async function teamWithUnverifiedEngineer() {
  const team = await makeProjectTeam();
  await team.users.engineer.update({ registrationNumber: "ENG-4242", registrationBody: "Test board", registrationState: "unverified" });
  const member = (await ProjectMember.findOne({ where: { projectId: team.project.id, userId: team.users.engineer.id } }))!;
  return { ...team, member };
}

function verifyForm(file?: { bytes: Uint8Array; name: string; type: string }) {
  const form = new FormData();
  form.set("intent", "verify");
  form.set("registrationNumber", "ENG-4242");
  form.set("registrationBody", "Test board");
  form.set("checkedOn", "2026-11-30");
  if (file) form.set("evidence", new Blob([new Uint8Array(file.bytes)], { type: file.type }), file.name);
  return form;
}

async function pdfBytes() {
  const doc = await PDFDocument.create();
  doc.addPage();
  return doc.save();
}

describe("engineer verification", () => {
  it("lets a project manager verify with evidence, issuing an encrypted signing identity", async () => {
    const { project, users, member } = await teamWithUnverifiedEngineer();
    const c = new Client();
    await c.signIn(users.manager.email, PASSWORD);
    const res = await c.request(`/projects/${project.id}/members/${member.id}/verify`, { method: "POST", body: verifyForm({ bytes: await pdfBytes(), name: "register-extract.pdf", type: "application/pdf" }) });
    expect(res.status).toBe(302);
    const engineer = (await User.findByPk(users.engineer.id))!;
    expect(engineer.registrationState).toBe("verified");
    expect(engineer.verifiedById).toBe(users.manager.id);
    const record = (await RegistrationVerification.findOne({ where: { userId: engineer.id } }))!;
    expect(record).toMatchObject({ outcome: "verified", checkedOn: "2026-11-30", evidenceName: "register-extract.pdf" });
    expect(await objectExists(record.evidenceKey!)).toBe(true);
    const key = (await SigningKey.findOne({ where: { userId: engineer.id, revokedAt: null } }))!;
    expect(key.encryptedPrivateKey).not.toContain("PRIVATE KEY");
    expect(key.certificatePem).toContain("BEGIN CERTIFICATE");
    expect((await activeSigningIdentity(engineer.id))?.privateKeyPem).toContain("BEGIN PRIVATE KEY");
    expect(await AuditEvent.count({ where: { action: "engineer.verified", subjectId: engineer.id } })).toBe(1);
  });

  it("refuses evidence that is not a PDF or image, storing nothing", async () => {
    const { project, users, member } = await teamWithUnverifiedEngineer();
    const c = new Client();
    await c.signIn(users.manager.email, PASSWORD);
    const res = await c.request(`/projects/${project.id}/members/${member.id}/verify`, {
      method: "POST",
      body: verifyForm({ bytes: new TextEncoder().encode("MZ not a pdf at all"), name: "register.pdf", type: "application/pdf" }),
    });
    expect(res.status).toBe(422);
    expect((await res.text()).replace(/<!-- -->/g, "")).toContain("Evidence must be a PDF, PNG or JPEG file.");
    expect((await User.findByPk(users.engineer.id))!.registrationState).toBe("unverified");
    expect(await RegistrationVerification.count({ where: { userId: users.engineer.id } })).toBe(0);
    expect(await SigningKey.count({ where: { userId: users.engineer.id } })).toBe(0);
  });

  it("is for managers only, and only for engineers", async () => {
    const { project, users, member } = await teamWithUnverifiedEngineer();
    for (const role of ["engineer", "architect", "site_plumber"] as const) {
      const c = new Client();
      await c.signIn(users[role].email, PASSWORD);
      expect((await c.request(`/projects/${project.id}/members/${member.id}/verify`, { method: "POST", body: verifyForm() })).status).toBe(403);
    }
    const manager = new Client();
    await manager.signIn(users.manager.email, PASSWORD);
    const architect = (await ProjectMember.findOne({ where: { projectId: project.id, userId: users.architect.id } }))!;
    expect((await manager.get(`/projects/${project.id}/members/${architect.id}/verify`)).status).toBe(422);
    expect((await User.findByPk(users.engineer.id))!.registrationState).toBe("unverified");
  });

  it("revokes the right to sign and the key", async () => {
    const { project, users, member } = await teamWithUnverifiedEngineer();
    const c = new Client();
    await c.signIn(users.manager.email, PASSWORD);
    await c.request(`/projects/${project.id}/members/${member.id}/verify`, { method: "POST", body: verifyForm() });
    expect(await activeSigningIdentity(users.engineer.id)).not.toBeNull();
    const res = await c.post(`/projects/${project.id}/members/${member.id}/verify`, { intent: "revoke", note: "Registration lapsed on the public register." });
    expect(res.status).toBe(302);
    expect((await User.findByPk(users.engineer.id))!.registrationState).toBe("revoked");
    expect(await activeSigningIdentity(users.engineer.id)).toBeNull();
    expect(await SigningKey.count({ where: { userId: users.engineer.id, revokedAt: null } })).toBe(0);
  });
});
