// The register as CSV: the same rows the register table shows.
import { toCsv } from "./csv";
import { listRegister } from "./register.server";
import { STATUS_LABELS } from "./status";

export async function registerCsv(projectId: string) {
  const drawings = await listRegister(projectId);
  return toCsv(
    ["Sheet", "Title", "Discipline", "Scale", "Current revision", "Status", "Pages", "Revisions", "Issued at", "Updated"],
    drawings.map((d) => [
      d.sheetNumber, d.title, d.discipline, d.scaleText ?? "", d.current?.label ?? "", d.current ? STATUS_LABELS[d.current.status] : "",
      d.current?.pageCount ?? "", d.revisions.map((r) => r.label).join(" "), d.current?.issuedAt ?? "", d.updatedAt,
    ]),
  );
}
