// The balance network as editable tables: supply and PRV, heater, segments (pipe from the catalogue or a stated
// bore, length, rise, fittings), outlets, mixing points and further PRVs. Each row shows the engine's problems
// for that element beside it.
import type { Dispatch, ReactNode } from "react";
import { FIXTURE_DEMAND, internalDiameterMm, pipeCatalogue, type FixtureType } from "~/engineering";
import { Button } from "~/ui/button";
import { Field, NumberInput, SelectInput, TextInput } from "./fields";
import { issuesUnder, pathKey, type InputIssue, type IssuePath } from "./issues";
import type { BalanceInput } from "./kinds";
import { demandBasis, FITTING_COLUMNS, nodeIds, type NetworkAction } from "./network-state";

const PIPE_OPTIONS = [
  ...pipeCatalogue.map((p) => ({ value: p.id, label: p.label, group: p.series })),
  { value: "bore", label: "Stated bore…", group: "Other" },
];
const FIXTURE_OPTIONS = (Object.keys(FIXTURE_DEMAND) as FixtureType[]).map((f) => ({ value: f, label: FIXTURE_DEMAND[f].label }));
const BASIS_OPTIONS = [
  { value: "fixture", label: "Fixture type" },
  { value: "loadingUnits", label: "Loading units" },
  { value: "flowLps", label: "Stated flow (L/s)" },
];
const SERVICE_OPTIONS = [
  { value: "cold", label: "Cold" },
  { value: "hot", label: "Hot" },
];

interface Props {
  input: BalanceInput;
  dispatch: Dispatch<NetworkAction>;
  issues: InputIssue[];
  errors: Map<string, string[]>;
}

const th = "px-1.5 py-2 text-left text-xs font-semibold uppercase tracking-wide text-ink-soft";
const td = "px-1 py-1 align-top";

function RowProblems({ issues, colSpan, extra }: { issues: InputIssue[]; colSpan: number; extra?: ReactNode }) {
  if (!issues.length && !extra) return null;
  return (
    <tr>
      <td colSpan={colSpan} className="px-1.5 pb-2 text-sm">
        {extra ? <p className="text-ink-soft">{extra}</p> : null}
        {issues.map((i, k) => <p key={k} className="font-medium text-fail" role="alert">⚠ {i.message}</p>)}
      </td>
    </tr>
  );
}

function Section({ title, children, action }: { title: string; children: ReactNode; action?: ReactNode }) {
  return (
    <section className="space-y-2">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h3 className="text-base font-bold">{title}</h3>
        {action}
      </div>
      {children}
    </section>
  );
}

export function NetworkEditor({ input, dispatch, issues, errors }: Props) {
  const net = input.network;
  const set = (path: IssuePath) => (value: unknown) => dispatch({ type: "set", path: ["network", ...path], value });
  const err = (path: IssuePath) => errors.get(pathKey(["network", ...path]));
  const bad = (path: IssuePath) => !!err(path);
  const nodes = nodeIds(input);
  const outletOptions = [{ value: "", label: "Choose an outlet" }, ...net.outlets.map((o) => ({ value: o.id, label: o.label ? `${o.id} (${o.label})` : o.id }))];
  const num = (path: IssuePath, label: string, value: unknown) => (
    <Field label={label} errors={err(path)}>
      {(id) => <NumberInput id={id} label={label} value={value} onChange={set(path)} invalid={bad(path)} />}
    </Field>
  );
  const prv = net.supply.prv;

  return (
    <div className="space-y-8" data-testid="network-editor">
      <datalist id="network-nodes">{nodes.map((n) => <option key={n} value={n} />)}</datalist>
      <div className="grid gap-6 md:grid-cols-3">
        <Section title="Supply">
          <Field label="Supply node" errors={err(["supply", "nodeId"])}>{() => <TextInput label="Supply node" value={net.supply.nodeId} onChange={set(["supply", "nodeId"])} invalid={bad(["supply", "nodeId"])} />}</Field>
          {num(["supply", "staticPressureKpa"], "Static pressure (kPa)", net.supply.staticPressureKpa)}
          {num(["supply", "dynamicPressureKpa"], "Pressure under flow (kPa, optional)", net.supply.dynamicPressureKpa)}
        </Section>
        <Section title="Main PRV (before the hot/cold split)">
          {prv ? (
            <>
              <Field label="PRV node" errors={err(["supply", "prv", "nodeId"])}>{() => <TextInput label="PRV node" list="network-nodes" value={prv.nodeId} onChange={set(["supply", "prv", "nodeId"])} invalid={bad(["supply", "prv", "nodeId"])} />}</Field>
              {num(["supply", "prv", "settingKpa"], "PRV setting (kPa)", prv.settingKpa)}
              <Button type="button" variant="quiet" onClick={() => set(["supply", "prv"])(undefined)}>No main PRV</Button>
            </>
          ) : (
            <Button type="button" variant="quiet" onClick={() => set(["supply", "prv"])({ id: "prv-main", nodeId: net.segments[0]?.toNodeId ?? "", settingKpa: Math.min(400, net.supply.staticPressureKpa || 400) })}>Add a main PRV</Button>
          )}
        </Section>
        <Section title="Heater and temperatures">
          {net.heater ? (
            <>
              <Field label="Heater node" errors={err(["heater", "nodeId"])}>{() => <TextInput label="Heater node" list="network-nodes" value={net.heater!.nodeId} onChange={set(["heater", "nodeId"])} invalid={bad(["heater", "nodeId"])} />}</Field>
              {num(["heater", "pressureLossKpa"], "Heater pressure loss (kPa)", net.heater.pressureLossKpa)}
              {num(["heater", "ratedFlowLps"], "At rated flow (L/s, optional)", net.heater.ratedFlowLps)}
            </>
          ) : (
            <Button type="button" variant="quiet" onClick={() => set(["heater"])({ nodeId: "", pressureLossKpa: 10 })}>Add a heater</Button>
          )}
          <div className="grid grid-cols-2 gap-3">
            {num(["hotTempC"], "Hot (°C)", net.hotTempC)}
            {num(["coldTempC"], "Cold (°C)", net.coldTempC)}
          </div>
        </Section>
      </div>

      <Section title="Pipe segments" action={<Button type="button" variant="quiet" onClick={() => dispatch({ type: "add", list: "segments" })}>Add a segment</Button>}>
        <div className="overflow-x-auto rounded-md border border-rule">
          <table className="w-full min-w-[72rem] text-sm" data-testid="segments-table">
            <thead className="border-b border-rule bg-paper-deep/50">
              <tr>
                <th className={th}>Id</th><th className={th}>From</th><th className={th}>To</th><th className={th}>Service</th>
                <th className={th}>Pipe</th><th className={th}>Bore mm</th><th className={th}>Length m</th><th className={th}>Rise m</th>
                {FITTING_COLUMNS.map((f) => <th key={f.id} className={th}>{f.label}</th>)}
                <th className={th}>Extra K</th><th className={th}><span className="sr-only">Remove</span></th>
              </tr>
            </thead>
            <tbody>
              {net.segments.map((s, i) => {
                const p = (field: string): IssuePath => ["segments", i, field];
                const name = s.id || `segment ${i + 1}`;
                const rowIssues = issuesUnder(issues, ["network", "segments", i]);
                const others = (s.fittings ?? []).filter((f) => !FITTING_COLUMNS.some((c) => c.id === f.fittingId));
                const pipe = pipeCatalogue.find((x) => x.id === s.pipeId);
                return [
                  <tr key={`r${i}`} data-testid={`segment-${s.id}`} className={`border-t border-rule/60 ${rowIssues.length ? "bg-fail/5" : ""}`}>
                    <td className={td}><TextInput className="w-28" label={`Segment ${i + 1} id`} value={s.id} onChange={set(p("id"))} invalid={bad(p("id"))} /></td>
                    <td className={td}><TextInput className="w-24" list="network-nodes" label={`${name} from node`} value={s.fromNodeId} onChange={set(p("fromNodeId"))} invalid={bad(p("fromNodeId"))} /></td>
                    <td className={td}><TextInput className="w-24" list="network-nodes" label={`${name} to node`} value={s.toNodeId} onChange={set(p("toNodeId"))} invalid={bad(p("toNodeId"))} /></td>
                    <td className={td}><SelectInput className="w-20" label={`${name} service`} value={s.service} options={SERVICE_OPTIONS} onChange={set(p("service"))} invalid={bad(p("service"))} /></td>
                    <td className={td}><SelectInput className="w-52" label={`${name} pipe`} value={s.pipeId ?? "bore"} options={PIPE_OPTIONS} onChange={(v) => dispatch({ type: "pipe", index: i, pipeId: v })} invalid={bad(p("pipeId"))} /></td>
                    <td className={td}>
                      {s.pipeId === undefined ? (
                        <NumberInput className="w-20" label={`${name} bore`} value={s.internalDiameterMm} onChange={set(p("internalDiameterMm"))} invalid={bad(p("internalDiameterMm"))} />
                      ) : (
                        <span className="block px-2 py-1.5 tabular-nums text-ink-soft">{pipe ? internalDiameterMm(pipe).toFixed(1) : "—"}</span>
                      )}
                    </td>
                    <td className={td}><NumberInput className="w-20" label={`${name} length`} value={s.lengthM} onChange={set(p("lengthM"))} invalid={bad(p("lengthM"))} /></td>
                    <td className={td}><NumberInput className="w-20" label={`${name} rise`} value={s.riseM} onChange={set(p("riseM"))} invalid={bad(p("riseM"))} /></td>
                    {FITTING_COLUMNS.map((f) => (
                      <td key={f.id} className={td}>
                        <NumberInput className="w-16" label={`${name} ${f.label.toLowerCase()}`} value={s.fittings?.find((x) => x.fittingId === f.id)?.count} onChange={(count) => dispatch({ type: "fitting", index: i, fittingId: f.id, count })} />
                      </td>
                    ))}
                    <td className={td}><NumberInput className="w-16" label={`${name} extra K`} value={s.kTotal} onChange={set(p("kTotal"))} invalid={bad(p("kTotal"))} /></td>
                    <td className={td}><Button type="button" variant="quiet" className="px-2 py-1.5" aria-label={`Remove ${name}`} onClick={() => dispatch({ type: "remove", list: "segments", index: i })}>✕</Button></td>
                  </tr>,
                  <RowProblems key={`p${i}`} colSpan={14} issues={rowIssues} extra={others.length ? `Also ${others.map((o) => `${o.count} × ${o.fittingId}`).join(", ")}` : undefined} />,
                ];
              })}
            </tbody>
          </table>
        </div>
        {err(["segments"]) ? <p className="text-sm font-medium text-fail">⚠ {err(["segments"])!.join(" ")}</p> : null}
      </Section>

      <div className="grid gap-8 lg:grid-cols-2">
        <Section title="Outlets" action={<Button type="button" variant="quiet" onClick={() => dispatch({ type: "add", list: "outlets" })}>Add an outlet</Button>}>
          <div className="overflow-x-auto rounded-md border border-rule">
            <table className="w-full text-sm" data-testid="outlets-table">
              <thead className="border-b border-rule bg-paper-deep/50"><tr><th className={th}>Id</th><th className={th}>Node</th><th className={th}>Demand</th><th className={th}>Value</th><th className={th}><span className="sr-only">Remove</span></th></tr></thead>
              <tbody>
                {net.outlets.map((o, i) => {
                  const p = (field: string): IssuePath => ["outlets", i, field];
                  const basis = demandBasis(o);
                  const name = o.id || `outlet ${i + 1}`;
                  return [
                    <tr key={`r${i}`} className="border-t border-rule/60">
                      <td className={td}><TextInput className="w-28" label={`Outlet ${i + 1} id`} value={o.id} onChange={set(p("id"))} invalid={bad(p("id"))} /></td>
                      <td className={td}><TextInput className="w-24" list="network-nodes" label={`${name} node`} value={o.nodeId} onChange={set(p("nodeId"))} invalid={bad(p("nodeId"))} /></td>
                      <td className={td}><SelectInput label={`${name} demand basis`} value={basis} options={BASIS_OPTIONS} onChange={(v) => dispatch({ type: "demand", index: i, basis: v as typeof basis })} /></td>
                      <td className={td}>
                        {basis === "fixture" ? (
                          <SelectInput className="w-40" label={`${name} fixture`} value={o.fixture ?? ""} options={FIXTURE_OPTIONS} onChange={set(p("fixture"))} invalid={bad(p("fixture"))} />
                        ) : (
                          <NumberInput className="w-20" label={`${name} ${basis === "flowLps" ? "flow" : "loading units"}`} value={o[basis]} onChange={set(p(basis))} invalid={bad(p(basis))} />
                        )}
                      </td>
                      <td className={td}><Button type="button" variant="quiet" className="px-2 py-1.5" aria-label={`Remove ${name}`} onClick={() => dispatch({ type: "remove", list: "outlets", index: i })}>✕</Button></td>
                    </tr>,
                    <RowProblems key={`p${i}`} colSpan={5} issues={issuesUnder(issues, ["network", "outlets", i])} />,
                  ];
                })}
              </tbody>
            </table>
          </div>
        </Section>

        <Section title="Mixing points" action={<Button type="button" variant="quiet" onClick={() => dispatch({ type: "add", list: "mixingPoints" })}>Add a mixing point</Button>}>
          <div className="overflow-x-auto rounded-md border border-rule">
            <table className="w-full text-sm" data-testid="mixing-table">
              <thead className="border-b border-rule bg-paper-deep/50"><tr><th className={th}>Id</th><th className={th}>Hot outlet</th><th className={th}>Cold outlet</th><th className={th}><span className="sr-only">Remove</span></th></tr></thead>
              <tbody>
                {net.mixingPoints.map((m, i) => {
                  const p = (field: string): IssuePath => ["mixingPoints", i, field];
                  const name = m.id || `mixing point ${i + 1}`;
                  return [
                    <tr key={`r${i}`} className="border-t border-rule/60">
                      <td className={td}><TextInput className="w-28" label={`Mixing point ${i + 1} id`} value={m.id} onChange={set(p("id"))} invalid={bad(p("id"))} /></td>
                      <td className={td}><SelectInput label={`${name} hot outlet`} value={m.hotOutletId} options={outletOptions} onChange={set(p("hotOutletId"))} invalid={bad(p("hotOutletId"))} /></td>
                      <td className={td}><SelectInput label={`${name} cold outlet`} value={m.coldOutletId} options={outletOptions} onChange={set(p("coldOutletId"))} invalid={bad(p("coldOutletId"))} /></td>
                      <td className={td}><Button type="button" variant="quiet" className="px-2 py-1.5" aria-label={`Remove ${name}`} onClick={() => dispatch({ type: "remove", list: "mixingPoints", index: i })}>✕</Button></td>
                    </tr>,
                    <RowProblems key={`p${i}`} colSpan={4} issues={issuesUnder(issues, ["network", "mixingPoints", i])} />,
                  ];
                })}
              </tbody>
            </table>
          </div>
        </Section>
      </div>

      <Section title="Further PRVs (e.g. a balancing PRV on one cold feed)" action={<Button type="button" variant="quiet" onClick={() => dispatch({ type: "add", list: "prvs" })}>Add a PRV</Button>}>
        {(net.prvs ?? []).length === 0 ? <p className="text-sm text-ink-soft">None.</p> : null}
        <ul className="space-y-2">
          {(net.prvs ?? []).map((v, i) => {
            const p = (field: string): IssuePath => ["prvs", i, field];
            return (
              <li key={i} className="flex flex-wrap items-start gap-3" data-testid={`prv-${v.id ?? i}`}>
                <TextInput className="w-40" label={`PRV ${i + 1} id`} value={v.id} onChange={set(p("id"))} />
                <TextInput className="w-32" list="network-nodes" label={`PRV ${i + 1} node`} value={v.nodeId} onChange={set(p("nodeId"))} invalid={bad(p("nodeId"))} />
                <NumberInput className="w-24" label={`PRV ${i + 1} setting (kPa)`} value={v.settingKpa} onChange={set(p("settingKpa"))} invalid={bad(p("settingKpa"))} />
                <Button type="button" variant="quiet" className="px-2 py-1.5" aria-label={`Remove PRV ${i + 1}`} onClick={() => dispatch({ type: "remove", list: "prvs", index: i })}>✕</Button>
                {issuesUnder(issues, ["network", "prvs", i]).map((x, k) => <p key={k} className="w-full text-sm font-medium text-fail">⚠ {x.message}</p>)}
              </li>
            );
          })}
        </ul>
      </Section>

      <div className="max-w-xs">
        <Field label="Balance limit (%)" errors={errors.get("options.balanceLimitPercent")}>
          {(id) => <NumberInput id={id} label="Balance limit (%)" value={input.options?.balanceLimitPercent} onChange={(v) => dispatch({ type: "set", path: ["options", "balanceLimitPercent"], value: v })} invalid={!!errors.get("options.balanceLimitPercent")} />}
        </Field>
      </div>
    </div>
  );
}
