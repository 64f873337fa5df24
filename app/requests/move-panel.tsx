// The moves the viewer may make on a request now (from the workflow table), each a small form carrying the
// request's lock version, so a move made on a stale page is refused instead of overwriting someone else's.
import { Form, Link, useNavigation } from "react-router";
import { Button } from "~/ui/button";
import { inputClass } from "./fields";
import { ACTION_LABELS, type RequestAction } from "./workflow";

const NOTE: Partial<Record<RequestAction, { label: string; required?: boolean }>> = {
  request_info: { label: "What information do you need?", required: true },
  withdraw: { label: "Why is it withdrawn? (optional)" },
  supersede: { label: "What supersedes it? (optional)" },
};

export function MovePanel({ base, moves, lockVersion, canEdit }: { base: string; moves: RequestAction[]; lockVersion: number; canEdit: boolean }) {
  const navigation = useNavigation();
  const busy = navigation.state !== "idle";
  const shown = moves.filter((m) => m !== "submit" && m !== "resubmit" && m !== "decide");
  return (
    <div className="space-y-4">
      {canEdit ? (
        <Link to={`${base}/edit`} className="inline-flex items-center rounded-md bg-copper px-4 py-2.5 text-sm font-semibold text-white hover:bg-copper-deep">
          {moves.includes("resubmit") ? "Answer and resubmit" : "Edit and submit"}
        </Link>
      ) : null}
      {moves.includes("decide") ? (
        <Link to={`${base}/review`} className="inline-flex items-center rounded-md bg-copper px-4 py-2.5 text-sm font-semibold text-white hover:bg-copper-deep">Open the review desk</Link>
      ) : null}
      {shown.map((move) => (
        <Form key={move} method="post" className="space-y-2">
          <input type="hidden" name="intent" value="move" />
          <input type="hidden" name="move" value={move} />
          <input type="hidden" name="lockVersion" value={lockVersion} />
          {NOTE[move] ? (
            <label className="block text-sm font-semibold">
              {NOTE[move]!.label}
              <textarea name="note" rows={3} required={NOTE[move]!.required} className={inputClass} />
            </label>
          ) : null}
          <Button type="submit" variant={move === "withdraw" ? "danger" : move === "start_review" ? "primary" : "quiet"} disabled={busy}>{ACTION_LABELS[move]}</Button>
        </Form>
      ))}
    </div>
  );
}

export function ManagerPanel({ engineers, assigneeId, dueOn, lockVersion }: { engineers: { userId: string; name: string }[]; assigneeId: string | null; dueOn: string; lockVersion: number }) {
  return (
    <div className="space-y-4 text-sm">
      <Form method="post" className="flex flex-wrap items-end gap-2">
        <input type="hidden" name="intent" value="assign" />
        <input type="hidden" name="lockVersion" value={lockVersion} />
        <label className="flex-1 font-semibold">Engineer
          <select name="assigneeId" defaultValue={assigneeId ?? ""} key={`${assigneeId}-${lockVersion}`} className={inputClass}>
            <option value="" disabled>Choose…</option>
            {engineers.map((e) => <option key={e.userId} value={e.userId}>{e.name}</option>)}
          </select>
        </label>
        <Button type="submit" variant="quiet">Assign</Button>
      </Form>
      <Form method="post" className="flex flex-wrap items-end gap-2">
        <input type="hidden" name="intent" value="due" />
        <input type="hidden" name="lockVersion" value={lockVersion} />
        <label className="flex-1 font-semibold">Due date
          <input type="date" name="dueOn" defaultValue={dueOn} key={`${dueOn}-${lockVersion}`} className={inputClass} />
        </label>
        <Button type="submit" variant="quiet">Set due date</Button>
      </Form>
    </div>
  );
}
