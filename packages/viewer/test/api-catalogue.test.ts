/**
 * Completion entries come from the code: every bridge function of the kernel's allow-list, every model of the
 * aquifer registry, and the guest displays as docs/api.md documents them; and every member the sandbox's
 * `show` really has (asked inside QuickJS) has an entry, so completion cannot drift from the code.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { parseDocument } from "@conebook/document";
import { BRIDGE_API, createKernel } from "@conebook/kernel";
import { modelIds } from "@conebook/aquifer";
import { apiCatalogue } from "../src/model/api-catalogue.js";

const apiDoc = readFileSync(new URL("../../../docs/api.md", import.meta.url), "utf8");

describe("the completion catalogue", () => {
  const entries = apiCatalogue(apiDoc);
  const names = new Set(entries.map((e) => e.name));

  it("has every bridge function with its argument names and summary, and every model id", () => {
    for (const name of Object.keys(BRIDGE_API)) expect(names.has(name), name).toBe(true);
    for (const id of modelIds) expect(names.has(id), id).toBe(true);
    expect(entries.find((e) => e.name === "aq.theisDrawdown")).toEqual({
      name: "aq.theisDrawdown",
      signature: "aq.theisDrawdown(T, S, Q, r, t)",
      doc: "Theis drawdown (m) for T (m2/d), S (1), Q (m3/d), r (m), t (d)",
      kind: "function",
    });
    expect(entries.find((e) => e.name === "theis")?.doc).toMatch(/T transmissivity \(m2\/d\), S storativity \(1\)/);
  });

  it("covers every member of the guest's show and the control function, as the sandbox has them", async () => {
    const text = `---\nconebook: 1\ntitle: members\nseed: 1\n---\n\n\`\`\`ts code:m\n[Object.keys(show).sort(), typeof show, typeof control]\n\`\`\`\n`;
    const result = await createKernel().runDocument(parseDocument(text).document);
    const out = result.outputs.m![0]!;
    expect(out.type).toBe("json");
    const [members, showType, controlType] = (out as { value: [string[], string, string] }).value;
    expect([showType, controlType]).toEqual(["function", "function"]);
    expect(members.length).toBeGreaterThanOrEqual(6);
    for (const m of members) expect(names.has(`show.${m}`), `show.${m}`).toBe(true);
    expect(names.has("show")).toBe(true);
    expect(entries.find((e) => e.name === "control")?.signature).toBe("control(name, { value, min, max, unit?, description? })");
  });
});
