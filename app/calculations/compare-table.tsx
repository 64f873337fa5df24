// One comparison table: a row per input or figure, both values, and whether it changed — said in words with
// an icon, never by colour alone.
import { AlertIcon, CheckIcon, PlusIcon } from "~/ui/icons";
import type { CompareRow, RowState } from "./compare";

const STATE: Record<RowState, { label: string; icon: React.ReactNode; tone: string }> = {
  same: { label: "Same", icon: <CheckIcon />, tone: "text-ink-soft" },
  changed: { label: "Changed", icon: <AlertIcon />, tone: "font-semibold text-copper-deep" },
  added: { label: "Only in second", icon: <PlusIcon />, tone: "font-semibold text-copper-deep" },
  removed: { label: "Only in first", icon: <span aria-hidden>−</span>, tone: "font-semibold text-copper-deep" },
};

export function CompareTable({ rows, heads, testId }: { rows: CompareRow[]; heads: { title: string; detail: string }[]; testId: string }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full min-w-[36rem] text-sm" data-testid={testId}>
        <thead>
          <tr className="border-b border-rule text-left align-bottom">
            <th className="py-2 pr-3">Item</th>
            {heads.map((h, i) => (
              <th key={i} className="py-2 pr-3"><span className="block">{h.title}</span><span className="block text-xs font-normal text-ink-soft">{h.detail}</span></th>
            ))}
            <th className="py-2">Difference</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => {
            const s = STATE[r.state];
            return (
              <tr key={r.key} data-key={r.key} data-state={r.state} className={`border-b border-rule/50 ${r.state === "same" ? "" : "bg-copper-wash/40"}`}>
                <td className="py-1.5 pr-3 font-mono text-xs">{r.label}</td>
                <td className="py-1.5 pr-3 tabular-nums">{r.a ?? "—"}</td>
                <td className="py-1.5 pr-3 tabular-nums">{r.b ?? "—"}</td>
                <td className={`py-1.5 ${s.tone}`}><span className="inline-flex items-center gap-1.5">{s.icon}{s.label}</span></td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
