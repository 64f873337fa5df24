// Paper for the certificate of compliance: the compliance record of an approval (what was approved, on which
// drawings, by whom, and that it was installed), and the non-compliance notice a plumber gives an owner in writing
// for every non-compliance found on an existing installation — generated as PDF and e-mailed to the owner.
import { createHash } from "node:crypto";
import { PDFDocument } from "pdf-lib";
import { Approval, InstallationRecord, NoncomplianceNotice, Project, sequelize, User, type NoticeItem } from "../../db/models";
import { CAUTION } from "../engineering";
import { audit } from "../platform/audit.server";
import { queueMail } from "../platform/mail-queue.server";
import { appLink } from "../platform/mailer.server";
import { embedFonts } from "../platform/pdf-fonts.server";
import { a4Writer, SOFT } from "../platform/pdf-writer.server";
import { deleteObject, putObject } from "../platform/storage.server";
import { DECISION_LABELS, type DecisionOutcome } from "../review/principles";
import { OWNER_DECISIONS } from "./notice-schema";
import { SiteError } from "./site.server";

type Snapshot = {
  request: { title: string; provision: string; clauseRef: string; proposal: string };
  decision: { conditions: string[] };
  drawings: { sheetNumber: string; revisionLabel: string; title: string; sha256: string }[];
  engineer: { name: string; registrationNumber: string; registrationBody: string };
  project: { name: string; siteAddress: string };
};

export async function complianceRecordPdf(projectId: string, approvalId: string): Promise<{ bytes: Uint8Array; filename: string }> {
  const a = await Approval.findOne({ where: { id: approvalId, projectId } });
  if (!a) throw new SiteError("No such approval on this project.", 404);
  const installs = await InstallationRecord.findAll({ where: { approvalId }, include: [{ model: User, as: "recordedBy", attributes: ["name"] }] });
  const s = a.snapshot as unknown as Snapshot;
  const doc = await PDFDocument.create();
  doc.setTitle(`${a.reference} compliance record`);
  doc.setCreator("Countersign");
  const fonts = await embedFonts(doc);
  const { para, heading } = a4Writer(doc, fonts);
  para("COUNTERSIGN · COMPLIANCE RECORD", 8, fonts.bold);
  para(`${a.reference} approval v${a.n}: ${s.request.title}`, 16, fonts.bold);
  if (s.project) para(`${s.project.name} · ${s.project.siteAddress}`, 9.5, fonts.regular, SOFT);
  para("For the plumber's certificate of compliance: the work below departs from a deemed-to-satisfy provision and rests on a rational design approved and digitally signed by the registered engineer named here.", 9.5);
  heading("Approval");
  para(`${DECISION_LABELS[a.outcome as DecisionOutcome]} · signed ${a.signedAt.toISOString().slice(0, 10)} · state: ${a.state.replace("_", " ")}`, 10, fonts.semibold);
  para(`Engineer: ${s.engineer.name}, registration ${s.engineer.registrationNumber} (${s.engineer.registrationBody})`);
  para(`Provision: ${s.request.provision}${s.request.clauseRef ? ` (clause ${s.request.clauseRef})` : ""}`);
  if (s.request.proposal) para(`Approved design: ${s.request.proposal}`);
  para(`Check the signed pack: ${appLink(`/verify/${a.verifyCode}`)}`, 9, fonts.regular, SOFT);
  para(`Signed pack SHA-256 ${a.packSha256}`, 8, fonts.regular, SOFT);
  heading("Conditions to be met");
  if (s.decision.conditions.length) s.decision.conditions.forEach((c, i) => para(`${i + 1}. ${c}`));
  else para("None.");
  heading("Drawings");
  for (const d of s.drawings) para(`${d.sheetNumber} rev ${d.revisionLabel} — ${d.title}\nSHA-256 ${d.sha256}`, 8.5);
  heading("Installation");
  if (installs.length) {
    for (const i of installs) para(`Installed as approved on ${i.installedOn}, recorded by ${(i as unknown as { recordedBy?: User }).recordedBy?.name ?? ""}${i.note ? `: ${i.note}` : ""}${i.photoKeys.length ? ` (${i.photoKeys.length} photo${i.photoKeys.length > 1 ? "s" : ""} on record)` : ""}.`);
  } else para("Not yet recorded as installed.");
  heading("Caution");
  para(CAUTION, 8.5, fonts.regular, SOFT);
  return { bytes: await doc.save(), filename: `${a.reference}-v${a.n}-compliance-record.pdf` };
}


export interface NoticeInput {
  ownerName: string;
  ownerEmail: string;
  property: string;
  inspectedOn: string;
  items: NoticeItem[];
}

async function noticePdf(project: Project, plumber: User, number: number, input: NoticeInput) {
  const doc = await PDFDocument.create();
  doc.setTitle(`Non-compliance notice ${number}`);
  doc.setCreator("Countersign");
  const fonts = await embedFonts(doc);
  const { para, heading } = a4Writer(doc, fonts);
  para("COUNTERSIGN · NON-COMPLIANCE NOTICE", 8, fonts.bold);
  para(`Notice ${number} to ${input.ownerName}`, 16, fonts.bold);
  para(`${input.property} · inspected ${input.inspectedOn}`, 9.5, fonts.regular, SOFT);
  para(`While working on the existing hot-water installation at this property, ${plumber.name} found the items below that do not comply with the applicable installation standard. You are told of each in writing; a copy accompanies the plumber's certificate of compliance for the work done.`, 9.5);
  heading("Items found");
  input.items.forEach((item, i) => {
    para(`${i + 1}. ${item.finding}`, 10, fonts.semibold);
    para(`Rule: ${item.rule}`, 9.5, fonts.regular, undefined, 14);
    para(`Your decision: ${OWNER_DECISIONS[item.ownerDecision]}`, 9.5, fonts.regular, undefined, 14);
  });
  heading("From");
  para(`${plumber.name} · ${plumber.email}${plumber.phone ? ` · ${plumber.phone}` : ""}`);
  para(`Project: ${project.name}`, 9, fonts.regular, SOFT);
  heading("Note");
  para("This notice records what was found; it is not a design. Where work departs from the standard, it may only proceed on a rational design by a registered engineer. Local regulations and licensed practice apply.", 8.5, fonts.regular, SOFT);
  return Buffer.from(await doc.save());
}

export async function sendNoncomplianceNotice(actorId: string, projectId: string, input: NoticeInput) {
  const [project, plumber] = await Promise.all([Project.findByPk(projectId), User.findByPk(actorId)]);
  if (!project || !plumber) throw new SiteError("No such project.", 404);
  return sequelize.transaction(async (transaction) => {
    await sequelize.query("SELECT pg_advisory_xact_lock(hashtext(:k))", { replacements: { k: `notice:${projectId}` }, transaction });
    const number = ((await NoncomplianceNotice.max("number", { where: { projectId }, transaction })) as number | null ?? 0) + 1;
    const pdf = await noticePdf(project, plumber, number, input);
    const sha = createHash("sha256").update(pdf).digest("hex");
    const key = `projects/${projectId}/notices/${number}-${sha.slice(0, 16)}.pdf`;
    await putObject(key, pdf, { contentType: "application/pdf", contentLength: pdf.length });
    try {
      const notice = await NoncomplianceNotice.create({ projectId, number, createdById: actorId, ...input, pdfKey: key, pdfSha256: sha }, { transaction });
      await audit({ action: "notice.sent", actorId, projectId, subjectType: "noncompliance_notice", subjectId: notice.id, data: { number, items: input.items.length, to: input.ownerEmail } }, transaction);
      await queueMail(
        {
          to: input.ownerEmail,
          subject: `Non-compliance notice ${number}: ${input.property}`,
          text: `Dear ${input.ownerName},\n\n${plumber.name} found ${input.items.length} item${input.items.length > 1 ? "s" : ""} on the hot-water installation at ${input.property} that do not comply with the installation standard. The notice is attached; please keep it with the certificate of compliance.`,
          attachments: [{ filename: `non-compliance-notice-${number}.pdf`, contentType: "application/pdf", contentBase64: pdf.toString("base64") }],
        },
        transaction,
      );
      return notice;
    } catch (error) {
      await deleteObject(key).catch(() => undefined);
      throw error;
    }
  });
}

export async function listNotices(projectId: string) {
  const rows = await NoncomplianceNotice.findAll({ where: { projectId }, include: [{ model: User, as: "createdBy", attributes: ["name"] }], order: [["number", "DESC"]] });
  return rows.map((n) => ({ id: n.id, number: n.number, ownerName: n.ownerName, ownerEmail: n.ownerEmail, property: n.property, inspectedOn: n.inspectedOn, items: n.items.length, by: (n as unknown as { createdBy?: User }).createdBy?.name ?? "", at: n.createdAt.toISOString() }));
}
