/**
 * The names a code cell can use, for completion in the editor: every bridge function (`aq.*`, `charts.*`) with
 * its argument names and its one-line summary (units included) from the kernel's allow-list BRIDGE_API, the
 * drawdown models by id with their parameters and units from the aquifer registry's descriptors, and the
 * displays `show`, `show.*` and `control` with the signatures and sentences of docs/api.md ("Displays" and
 * "Adjustable values"), the user documentation of those guest functions. Nothing here is written by hand, so
 * completion cannot drift from the code; tests check that every guest `show` member is covered.
 */
import { describeModel, modelIds } from "@conebook/aquifer";
import { BRIDGE_API } from "@conebook/kernel";

/** One completion entry. */
export interface ApiEntry {
  /** Full name as typed, e.g. `aq.fitModel`, `show.table`, `control`, or a model id. */
  name: string;
  /** Signature, e.g. `aq.fitModel(options)`. */
  signature: string;
  /** One line of documentation. */
  doc: string;
  kind: "function" | "namespace" | "model";
}

/** Signatures and sentences from the Displays and Adjustable values sections of docs/api.md. */
export function guestDisplayEntries(apiDoc: string): ApiEntry[] {
  const entries: ApiEntry[] = [];
  const section = /^### (Displays|Adjustable values)\n([\s\S]*?)(?=^#{2,3} )/gm;
  for (const m of apiDoc.matchAll(section)) {
    const items = m[2]!.split(/^- /m).slice(1);
    for (const item of items) {
      const one = item.replace(/\s*\n\s*/g, " ").trim();
      const sig = /^`([A-Za-z_.]+)\(([^`]*)\)`:?\s*(.*)$/.exec(one);
      if (!sig) continue;
      entries.push({ name: sig[1]!, signature: `${sig[1]}(${sig[2]})`, doc: sig[3]!, kind: "function" });
    }
  }
  return entries;
}

/** The bridge functions as entries. */
export function bridgeEntries(): ApiEntry[] {
  return Object.entries(BRIDGE_API).map(([name, entry]) => ({
    name,
    signature: `${name}(${entry.args.map((a) => a.name).join(", ")})`,
    doc: entry.summary,
    kind: "function" as const,
  }));
}

/**
 * The drawdown models as entries (completed inside strings, e.g. `model: "theis"`), with the geometry options a
 * model takes (`{ id: "neuman", saturatedThickness: 12 }`).
 */
export function modelEntries(): ApiEntry[] {
  return modelIds.map((id) => {
    const d = describeModel(id);
    const params = d.parameters.map((p) => `${p.name} ${p.label} (${p.unit})`).join(", ");
    const options = d.options.map((o) => `${o.name} (${o.unit}${o.required ? ", required" : ""})`).join(", ");
    return { name: id, signature: `"${id}"`, doc: `${d.name}; parameters ${params}${options ? `; options ${options}` : ""}`, kind: "model" as const };
  });
}

/** Every entry: namespaces, bridge functions, displays and models. */
export function apiCatalogue(apiDoc: string): ApiEntry[] {
  const namespaces: ApiEntry[] = [
    { name: "aq", signature: "aq", doc: "The aquifer library: units, well functions, models, fitting, diagnostics, forecasts (base units m, d, m3/d, m2/d)", kind: "namespace" },
    { name: "charts", signature: "charts", doc: "Chart builders that return a Vega-Lite specification a cell shows as a chart", kind: "namespace" },
  ];
  return [...namespaces, ...guestDisplayEntries(apiDoc), ...bridgeEntries(), ...modelEntries()];
}
