// Turns a form's flat names ("measurements[0].kind", "principles[3].evidence") into nested objects and lists,
// so the page forms and the JSON API feed the same schemas. Repeated names become lists.
export function formToObject(form: FormData | Iterable<[string, FormDataEntryValue]>): Record<string, unknown> {
  const root: Record<string, unknown> = {};
  for (const [name, raw] of form) {
    if (typeof raw !== "string") continue;
    const path = name.replace(/\]/g, "").split(/[.[]/).filter(Boolean);
    let node: any = root;
    path.forEach((key, i) => {
      const last = i === path.length - 1;
      const nextIsIndex = !last && /^\d+$/.test(path[i + 1]!);
      if (last) {
        if (key in node) node[key] = Array.isArray(node[key]) ? [...node[key], raw] : [node[key], raw];
        else node[key] = raw;
      } else {
        node[key] ??= nextIsIndex ? [] : {};
        node = node[key];
      }
    });
  }
  return compact(root) as Record<string, unknown>;
}

/** Lists built from indexes may have holes (a removed row): close them up. */
function compact(v: unknown): unknown {
  if (Array.isArray(v)) return v.filter((x) => x !== undefined).map(compact);
  if (v && typeof v === "object") return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, compact(x)]));
  return v;
}

/** Drops measurement rows left completely blank (a row just added). */
export function withoutBlankMeasurements(value: Record<string, unknown>) {
  if (!Array.isArray(value.measurements)) return value;
  return { ...value, measurements: value.measurements.filter((m: any) => m && (String(m.value ?? "").trim() !== "" || String(m.name ?? "").trim() !== "")) };
}
