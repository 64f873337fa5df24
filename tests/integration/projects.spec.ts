// Projects, members and invitations over HTTP: creating a project, inviting by e-mail (read back from the mail
// fake), accepting by sign-up, an invitation for someone else, role changes that race, the last manager.
import { describe, expect, it } from "vitest";
import { AuditEvent, Invitation, ProjectMember } from "../../db/models";
import { makeProjectTeam, makeUser, PASSWORD } from "../support/factory";
import { Client, pageText, uniqueEmail } from "../support/http";
import { linkIn, waitForMail } from "../support/mail";

describe("projects", () => {
  it("creates a project whose creator is its manager", async () => {
    const user = await makeUser();
    const c = new Client();
    await c.signIn(user.email, PASSWORD);
    const res = await c.post("/projects/new", { name: "Harbour Terraces", siteAddress: "5 Test Lane, Testville" });
    expect(res.status).toBe(302);
    const projectId = res.headers.get("location")!.split("/").pop()!;
    const { body } = await c.json("/api/projects");
    expect(body.projects).toEqual([expect.objectContaining({ id: projectId, name: "Harbour Terraces", role: "manager" })]);
  });

  it("shows field errors and creates nothing for bad details", async () => {
    const user = await makeUser();
    const c = new Client();
    await c.signIn(user.email, PASSWORD);
    const res = await c.post("/projects/new", { name: "X", siteAddress: "" });
    expect(res.status).toBe(400);
    const html = await res.text();
    expect(html).toContain("Use at least 3 characters.");
    expect(html).toContain("Enter the site address.");
    expect((await c.json("/api/projects")).body.projects).toEqual([]);
  });
});

describe("invitations", () => {
  it("invites by e-mail; the invitee signs up with that address and joins in the invited role", async () => {
    const { project, users } = await makeProjectTeam();
    const manager = new Client();
    await manager.signIn(users.manager.email, PASSWORD);
    const email = uniqueEmail("invitee");
    const res = await manager.post(`/projects/${project.id}/members`, { intent: "invite", email, role: "engineer" });
    expect(res.status).toBe(200);
    const mail = await waitForMail(email, /invited you to Test project/);
    const link = linkIn(mail, "/invitations/");

    const invitee = new Client();
    const page = await invitee.get(link);
    expect(await pageText(page)).toContain("Join Test project");
    const signedUp = await invitee.post("/sign-up", { name: "New Engineer", email, password: "a long enough password", profession: "engineer", registrationNumber: "T-9", redirectTo: link });
    expect(signedUp.headers.get("location")).toBe(link);
    const accepted = await invitee.post(link, {});
    expect(accepted.status).toBe(302);
    expect(accepted.headers.get("location")).toBe(`/projects/${project.id}`);
    const { body } = await invitee.json("/api/projects");
    expect(body.projects[0]).toMatchObject({ id: project.id, role: "engineer" });

    const reuse = await invitee.post(link, {});
    expect(reuse.status).toBe(409);
    expect(await reuse.text()).toContain("already been used");
  });

  it("refuses an invitation for someone else and adds nobody", async () => {
    const { project, users, outsider } = await makeProjectTeam();
    const manager = new Client();
    await manager.signIn(users.manager.email, PASSWORD);
    const email = uniqueEmail("intended");
    await manager.post(`/projects/${project.id}/members`, { intent: "invite", email, role: "architect" });
    const link = linkIn(await waitForMail(email), "/invitations/");

    const wrong = new Client();
    await wrong.signIn(outsider.email, PASSWORD);
    const res = await wrong.post(link, {});
    expect(res.status).toBe(409);
    expect(await pageText(res)).toContain(`This invitation is for ${email}`);
    expect(await ProjectMember.count({ where: { projectId: project.id, userId: outsider.id } })).toBe(0);
    expect(await Invitation.count({ where: { email, acceptedAt: null } })).toBe(1);
  });

  it("refuses to invite an existing member, with the reason", async () => {
    const { project, users } = await makeProjectTeam();
    const manager = new Client();
    await manager.signIn(users.manager.email, PASSWORD);
    const res = await manager.post(`/projects/${project.id}/members`, { intent: "invite", email: users.engineer.email, role: "engineer" });
    expect(res.status).toBe(422);
    expect(await res.text()).toContain("already a member");
  });
});

describe("members", () => {
  it("changes a role once when two managers race on the same version, and audits it", async () => {
    const { project, users } = await makeProjectTeam();
    const second = await makeUser();
    await ProjectMember.create({ projectId: project.id, userId: second.id, role: "manager" });
    const a = new Client();
    const b = new Client();
    await a.signIn(users.manager.email, PASSWORD);
    await b.signIn(second.email, PASSWORD);
    const member = (await ProjectMember.findOne({ where: { projectId: project.id, userId: users.architect.id } }))!;
    const [ra, rb] = await Promise.all([
      a.post(`/projects/${project.id}/members`, { intent: "change-role", memberId: member.id, role: "engineer", version: String(member.version) }),
      b.post(`/projects/${project.id}/members`, { intent: "change-role", memberId: member.id, role: "site_plumber", version: String(member.version) }),
    ]);
    expect([ra.status, rb.status].sort()).toEqual([200, 409]);
    const loser = ra.status === 409 ? ra : rb;
    expect(await loser.text()).toContain("Someone else changed this member");
    await member.reload();
    expect(["engineer", "site_plumber"]).toContain(member.role);
    expect(await AuditEvent.count({ where: { subjectId: member.id, action: "member.role_changed" } })).toBe(1);
  });

  it("keeps at least one manager", async () => {
    const { project, users } = await makeProjectTeam();
    const c = new Client();
    await c.signIn(users.manager.email, PASSWORD);
    const me = (await ProjectMember.findOne({ where: { projectId: project.id, userId: users.manager.id } }))!;
    const res = await c.post(`/projects/${project.id}/members`, { intent: "remove", memberId: me.id });
    expect(res.status).toBe(409);
    expect(await res.text()).toContain("at least one project manager");
    expect(await ProjectMember.count({ where: { id: me.id } })).toBe(1);
  });

  it("searches members through the API", async () => {
    const { project, users } = await makeProjectTeam();
    const c = new Client();
    await c.signIn(users.site_plumber.email, PASSWORD);
    const { status, body } = await c.json(`/api/projects/${project.id}/members?q=${encodeURIComponent("engineer")}`);
    expect(status).toBe(200);
    expect(body.members.map((m: { email: string }) => m.email)).toEqual([users.engineer.email]);
  });
});
