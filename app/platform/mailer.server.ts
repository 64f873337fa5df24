// Outgoing e-mail through SMTP (the local fake by default). Messages are plain text plus simple HTML of our own.
import nodemailer from "nodemailer";
import { env } from "./env.server";

const transport = nodemailer.createTransport(env.SMTP_URL);

export interface Mail {
  to: string;
  subject: string;
  text: string;
  action?: { label: string; url: string };
  /** Small files only (they travel through the job queue): base64 content. */
  attachments?: { filename: string; contentType: string; contentBase64: string }[];
}

function escapeHtml(s: string) {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

export async function sendMail(mail: Mail) {
  const text = mail.action ? `${mail.text}\n\n${mail.action.label}: ${mail.action.url}\n` : mail.text;
  const html = `<div style="font-family:'Inter Tight',Arial,sans-serif;color:#1f1a14;max-width:560px">
<p style="font-weight:700;letter-spacing:.04em;color:#a4542a">COUNTERSIGN</p>
${mail.text.split(/\n\n+/).map((p) => `<p>${escapeHtml(p).replace(/\n/g, "<br>")}</p>`).join("\n")}
${mail.action ? `<p><a href="${escapeHtml(mail.action.url)}" style="background:#a4542a;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">${escapeHtml(mail.action.label)}</a></p><p style="font-size:12px;color:#6b6157">${escapeHtml(mail.action.url)}</p>` : ""}
</div>`;
  await transport.sendMail({
    from: env.MAIL_FROM,
    to: mail.to,
    subject: mail.subject,
    text,
    html,
    attachments: mail.attachments?.map((a) => ({ filename: a.filename, contentType: a.contentType, content: Buffer.from(a.contentBase64, "base64") })),
  });
}

export function appLink(path: string) {
  return new URL(path, env.APP_URL).toString();
}
