// Outgoing e-mail through the job queue (job "mail.send"): a mail is queued, inside the caller's transaction
// when given one (so it exists exactly when what it reports does), and sent by the worker with retries and
// exponential backoff. While the mail server is down mail waits in the queue; it goes out once it is back.
import type { Transaction } from "sequelize";
import { defineJob } from "./jobs.server";
import { sendMail, type Mail } from "./mailer.server";

const mailJob = defineJob<Mail>({
  name: "mail.send",
  // 1 s doubling (with jitter) over 14 tries: about 4½ to 9 hours of retrying before the job is given up.
  retryLimit: 14,
  retryDelaySeconds: 1,
  expireInSeconds: 5 * 60,
  handler: async (mail) => sendMail(mail),
});

export const MAIL_JOB = mailJob.name;

/** A pg-boss connection wrapper that runs its insert on the transaction's own connection. */
function inTransaction(transaction: Transaction) {
  const client = (transaction as unknown as { connection: { query: (text: string, values: unknown[]) => Promise<{ rows: any[] }> } }).connection;
  return { executeSql: (text: string, values: unknown[]) => client.query(text, values) };
}

export async function queueMail(mail: Mail, transaction?: Transaction) {
  return mailJob.send(mail, transaction ? { db: inTransaction(transaction) } : {});
}
