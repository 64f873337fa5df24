// Reads what the app sent through the mail fake (maildev's REST API).
import { MAIL_API_URL } from "./env";

export interface FakeMail {
  id: string;
  subject: string;
  text: string;
  html: string;
  to: { address: string }[];
}

/** The newest mail to `to` whose subject matches (and whose text matches `text`, when given), waiting for it. */
export async function waitForMail(to: string, match: RegExp = /./, timeoutMs = 10_000, text?: RegExp): Promise<FakeMail> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const res = await fetch(`${MAIL_API_URL}/api/email`);
    const all = (await res.json()) as FakeMail[];
    const found = all.reverse().find((m) => m.to.some((t) => t.address.toLowerCase() === to.toLowerCase()) && match.test(m.subject) && (!text || text.test(m.text)));
    if (found) return found;
    await new Promise((r) => setTimeout(r, 150));
  }
  throw new Error(`no mail to ${to} matching ${match} within ${timeoutMs} ms`);
}

export async function mailsTo(to: string): Promise<FakeMail[]> {
  const all = (await (await fetch(`${MAIL_API_URL}/api/email`)).json()) as FakeMail[];
  return all.filter((m) => m.to.some((t) => t.address.toLowerCase() === to.toLowerCase()));
}

export function linkIn(mail: FakeMail, pathPrefix: string): string {
  const match = mail.text.match(new RegExp(`https?://[^\\s]+${pathPrefix.replace(/[/]/g, "\\/")}[^\\s]*`));
  if (!match) throw new Error(`no ${pathPrefix} link in mail "${mail.subject}"`);
  return new URL(match[0]).pathname;
}
