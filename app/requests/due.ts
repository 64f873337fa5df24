// Due dates and waiting times for requests. Working days are Monday to Friday; public holidays are not known
// here (a manager moves the due date when one falls inside it).

export const REVIEW_WORKING_DAYS = 5;

/** `from` plus `days` working days, at the same time of day. */
export function addWorkingDays(from: Date, days: number): Date {
  const d = new Date(from);
  let left = days;
  while (left > 0) {
    d.setUTCDate(d.getUTCDate() + 1);
    const day = d.getUTCDay();
    if (day !== 0 && day !== 6) left--;
  }
  return d;
}

export function isOverdue(dueAt: Date | string | null, open: boolean, now = new Date()) {
  return !!dueAt && open && new Date(dueAt).getTime() < now.getTime();
}

/** "3 days", "5 hours", "12 minutes": how long something has waited. */
export function waitedFor(since: Date | string, now = new Date()): string {
  const ms = Math.max(0, now.getTime() - new Date(since).getTime());
  const minutes = Math.floor(ms / 60_000);
  if (minutes < 60) return minutes === 1 ? "1 minute" : `${minutes} minutes`;
  const hours = Math.floor(minutes / 60);
  if (hours < 48) return hours === 1 ? "1 hour" : `${hours} hours`;
  return `${Math.floor(hours / 24)} days`;
}

export function requestCode(number: number) {
  return `DR-${String(number).padStart(3, "0")}`;
}
