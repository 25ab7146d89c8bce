import { describe, expect, it } from "vitest";
import { parse as parseYaml } from "yaml";
import { parseDocument, serializeDocument, type ChartCell } from "../src/index.js";
import { HEADER, lines } from "./helpers.js";

const TEXT = lines(
  ...HEADER,
  "",
  "```yaml chart:plot",
  "# drawdown against time",
  "mark: point",
  "data: {name: obs}",
  "```",
  "",
  "Closing words.",
);

describe("serializing a chart cell edited as text", () => {
  it("writes the edited YAML as typed, comments and flow style kept, when source and spec were changed together", () => {
    const { document } = parseDocument(TEXT);
    const chart = document.cells[0] as ChartCell;
    const source = "# drawdown against time, as lines\nmark: line   # was point\ndata: {name: obs}";
    const edited = { ...chart, source, spec: parseYaml(source) as Record<string, unknown> };
    const out = serializeDocument({ ...document, cells: [edited, ...document.cells.slice(1)] }, { writeAssignedIds: false });
    expect(out).toBe(TEXT.replace("# drawdown against time\nmark: point", "# drawdown against time, as lines\nmark: line   # was point"));
  });

  it("still writes the spec when only the spec was changed (an API caller's edit)", () => {
    const { document } = parseDocument(TEXT);
    const chart = document.cells[0] as ChartCell;
    const edited = { ...chart, spec: { ...chart.spec, mark: "line" } };
    const out = serializeDocument({ ...document, cells: [edited, ...document.cells.slice(1)] }, { writeAssignedIds: false });
    expect(out).toContain("```yaml chart:plot\nmark: line\ndata:\n  name: obs\n```");
  });
});
