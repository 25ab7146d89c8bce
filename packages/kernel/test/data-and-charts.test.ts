import { describe, expect, it } from "vitest";
import { sha256Hex } from "@conebook/document";
import { createKernel, logTickValues } from "../src/index.js";
import { makeDoc } from "./helpers.js";

const kernel = createKernel();
const csv = "t,s\n1,0.12\n2,0.2\n4,\n";

describe("data cells and chart cells", () => {
  it("defines a data cell as a read-only table of records", async () => {
    const r = await kernel.runDocument(makeDoc([{ kind: "data", name: "obs", source: csv }, "[obs.columns, obs.rows, obs.rows.length]", "obs = 1"]));
    expect(r.outputs.c2).toEqual([{ type: "json", value: [["t", "s"], [{ t: 1, s: 0.12 }, { t: 2, s: 0.2 }, { t: 4, s: null }], 3] }]);
    expect(r.status.c3).toBe("error");
  });

  it("refuses a pinned file whose SHA-256 differs, naming the file and both digests", async () => {
    const bytes = new TextEncoder().encode(csv);
    const actual = sha256Hex(bytes);
    const pinned = "0".repeat(64);
    const r = await kernel.runDocument(makeDoc([{ kind: "data", name: "obs", file: { path: "obs.csv", sha256: pinned } }]), { readFile: () => bytes });
    const e = r.outputs.c1![0]!;
    if (e.type !== "error") throw new Error("expected an error");
    expect(e.message).toContain("obs.csv");
    expect(e.message).toContain(actual);
    expect(e.message).toContain(pinned);
    const ok = await kernel.runDocument(makeDoc([{ kind: "data", name: "obs", file: { path: "obs.csv", sha256: actual } }, "obs.rows[1].s"]), { readFile: () => bytes });
    expect(ok.outputs.c2).toEqual([{ type: "value", value: 0.2 }]);
  });

  it("fills a chart cell's named data and summarises rows and extents", async () => {
    const r = await kernel.runDocument(makeDoc([{ kind: "data", name: "obs", source: csv }, { kind: "chart", spec: { mark: "point", data: { name: "obs" } } }]));
    expect(r.outputs.c2).toEqual([
      {
        type: "chart",
        spec: { mark: "point", data: { name: "obs", values: [{ t: 1, s: 0.12 }, { t: 2, s: 0.2 }, { t: 4, s: null }] } },
        summary: { datasets: [{ name: "obs", rows: 3, fields: [{ name: "t", min: 1, max: 4 }, { name: "s", min: 0.12, max: 0.2 }] }] },
      },
    ]);
  });

  it("puts log ticks at 1..9 x 10^k and drops t <= 0 from log-log charts", async () => {
    expect(logTickValues(1, 100)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 20, 30, 40, 50, 60, 70, 80, 90, 100]);
    const r = await kernel.runDocument(makeDoc(["charts.logLogDrawdown({ t: [0, 1, 10], s: [0, 0.1, 0.5] })"]));
    const c = r.outputs.c1![0]!;
    if (c.type !== "chart") throw new Error("expected a chart");
    expect(c.summary.datasets[0]).toMatchObject({ rows: 2, fields: [{ name: "t", min: 1, max: 10 }, { name: "s", min: 0.1, max: 0.5 }, { name: "series" }] });
  });

  it("draws several named series of points and lines, leaving out what a log axis cannot show", async () => {
    const r = await kernel.runDocument(makeDoc([
      `charts.curves({ series: [{ label: "OB-1", x: [1e-3, 1e-2, 0], y: [0.2, 0.5, 0.7] }, { label: "Theis", x: [1e-3, 1e-1], y: [0.21, 0.9], mark: "line" }], xTitle: "t/r2 (min/m2)", yTitle: "drawdown (m)", title: "Composite" })`,
      `charts.curves({ series: [{ label: "H/H0", x: [0, 10, 20], y: [1, 0.4, -0.01] }], xTitle: "time (s)", yTitle: "H/H0", xScale: "linear" })`,
      `charts.curves({ series: [{ label: "a", x: [1], y: [1] }, { label: "a", x: [2], y: [2] }], xTitle: "x", yTitle: "y" })`,
    ]));
    const [composite, slug] = [r.outputs.c1![0]!, r.outputs.c2![0]!];
    if (composite.type !== "chart" || slug.type !== "chart") throw new Error("expected charts");
    expect(composite.summary.datasets.map((d) => d.rows)).toEqual([2, 2]);
    const layers = (composite.spec as { layer: { mark: { type: string }; encoding: { x: { scale: { type: string } } } }[] }).layer;
    expect(layers.map((l) => [l.mark.type, l.encoding.x.scale.type])).toEqual([["point", "log"], ["line", "log"]]);
    // A linear time axis keeps t = 0; the log H/H0 axis drops the negative reading.
    expect(slug.summary.datasets[0]).toMatchObject({ rows: 2, fields: [{ name: "x", min: 0, max: 10 }, { name: "y", min: 0.4, max: 1 }, { name: "series" }] });
    const e = r.outputs.c3![0]!;
    expect(e.type === "error" && e.message).toContain('repeats the label "a"');
  });
});
