import { describe, expect, it } from "vitest";
import type { CellOutput, ConebookDocument } from "@conebook/document";
import { parseDocument } from "@conebook/document";
import { CAUTION_TEXT, REPORT_CSP, buildReport, chartKey, escapeHtml, type ReportInput } from "../src/report/index.js";
import { activeContent, drawChart } from "../src/report/chart-svg.js";
import { formatNumber } from "../src/format.js";

const HOSTILE = `<script>alert("x")</script><img src=x onerror=alert(1)>`;

function doc(): ConebookDocument {
  const text = [
    "---",
    "conebook: 1",
    `title: 'Test ${HOSTILE.replace(/'/g, "''")}'`,
    "seed: 3",
    "---",
    "",
    "[narrative:intro]: #",
    "",
    `Some *prose* with raw HTML ${HOSTILE} and [a link](javascript:alert(1)).`,
    "",
    "```ts code:calc",
    `const s = "${HOSTILE.replace(/"/g, '\\"')}";`,
    "```",
    "",
  ].join("\n");
  const { document, diagnostics } = parseDocument(text, { file: "t.cone.md" });
  expect(diagnostics.filter((d) => d.severity === "error")).toEqual([]);
  return document;
}

function input(outputs: CellOutput[], extra: Partial<ReportInput["provenance"]> = {}): ReportInput {
  return {
    document: doc(),
    outputs: { calc: outputs },
    charts: {},
    provenance: {
      toolVersion: "0.1.0",
      aquiferVersion: "0.1.0",
      outputsFrom: "recorded",
      documentSha256: "ab".repeat(32),
      documentName: "t.cone.md",
      dataFiles: [{ name: "obs", path: "data/ob2.csv", sha256: "cd".repeat(32) }],
      ...extra,
    },
  };
}

describe("buildReport", () => {
  const hostileOutputs: CellOutput[] = [
    { type: "text", text: `</pre>${HOSTILE}` },
    { type: "value", value: 0.0012312254472804228, unit: `m2/s${HOSTILE}`, label: HOSTILE },
    { type: "table", title: HOSTILE, columns: [{ name: HOSTILE, unit: "m" }], rows: [[HOSTILE], [1.5]] },
    { type: "json", value: { k: HOSTILE } },
    { type: "error", message: HOSTILE, line: 12, column: 3 },
    { type: "control", name: "Q", value: 0.008, default: 0.006, unit: "m3/s", min: 0.001, max: 0.02, description: HOSTILE },
  ];
  const html = buildReport(input(hostileOutputs));

  it("escapes text from the title, narrative, code and every output type, so no markup gets in", () => {
    expect(html).not.toMatch(/<script/i);
    expect(html).not.toMatch(/<img/i);
    expect(html).not.toMatch(/<[a-z]+[^>]*\son[a-z]+=/i);
    expect(html).not.toMatch(/href="javascript:/i);
    expect(html).toContain("[a link](javascript:alert(1))");
    expect(html).toContain(escapeHtml(HOSTILE));
  });

  it("carries the Content-Security-Policy meta tag, the caution and a collapsible code block", () => {
    expect(html).toContain(`<meta http-equiv="Content-Security-Policy" content="${REPORT_CSP}">`);
    expect(REPORT_CSP).toBe("default-src 'none'; img-src data:; style-src 'unsafe-inline'");
    expect(html).toContain(escapeHtml(CAUTION_TEXT));
    expect(CAUTION_TEXT).toMatch(/model interpretations/);
    expect(CAUTION_TEXT).toMatch(/qualified professionals/);
    expect(CAUTION_TEXT).toMatch(/Local regulations, permits and licensed practice govern/);
    expect(html).toMatch(/<details><summary>Code \(cell calc\)<\/summary><pre><code>const s = /);
  });

  it("shows values with their unit, errors with file:line:column, and the provenance checksums", () => {
    expect(html).toContain('<span class="number" title="0.0012312254472804228">0.00123123</span>');
    expect(html).toContain(`Error: t.cone.md:12:3: ${escapeHtml(HOSTILE)}`);
    expect(html).toContain("ab".repeat(32));
    expect(html).toContain("data/ob2.csv");
    expect(html).toContain("cd".repeat(32));
  });

  it("states a run date only when one is given", () => {
    expect(html).not.toContain("Run date");
    expect(buildReport(input([], { runDate: "2026-03-14" }))).toContain("<dt>Run date</dt><dd>2026-03-14</dd>");
  });

  it("places a chart's drawing at its output and says so when a chart could not be drawn", () => {
    const chart: CellOutput = { type: "chart", spec: { mark: "point" }, summary: { datasets: [] } };
    const withSvg = buildReport({ ...input([chart]), charts: { [chartKey("calc", 0)]: { svg: "<svg></svg>" } } });
    expect(withSvg).toContain('<figure class="chart"><svg></svg></figure>');
    const without = buildReport({ ...input([chart]), charts: { [chartKey("calc", 0)]: { problem: HOSTILE } } });
    expect(without).toContain(`The chart could not be drawn: ${escapeHtml(HOSTILE)}`);
  });
});

describe("formatNumber", () => {
  it("keeps 6 significant digits and switches to exponent form outside [1e-4, 1e6)", () => {
    // Rounding to 6 significant digits (common practice, no source).
    expect(formatNumber(0.0012312254472804228)).toBe("0.00123123");
    expect(formatNumber(152.4)).toBe("152.4");
    expect(formatNumber(2.1e-5)).toBe("2.1e-5");
    expect(formatNumber(12345678)).toBe("1.23457e+7");
    expect(formatNumber(null)).toBe("null");
  });
});

describe("drawChart", () => {
  it("draws a Vega-Lite spec with inline data as SVG with escaped text and no script", async () => {
    const picture = await drawChart({
      title: HOSTILE,
      usermeta: { embedOptions: { actions: true } },
      data: { values: [{ t: 60, s: 0.2 }, { t: 600, s: 0.9 }] },
      mark: "point",
      encoding: { x: { field: "t", type: "quantitative", scale: { type: "log" } }, y: { field: "s", type: "quantitative" }, href: { field: "s" } },
    });
    if (!("svg" in picture)) throw new Error(`expected a drawing, got ${picture.problem}`);
    expect(picture.svg.startsWith("<svg")).toBe(true);
    expect(picture.svg).not.toMatch(/<script|<a\b|<img/i);
    expect(activeContent(picture.svg)).toBeUndefined();
    expect(picture.svg).toContain("&lt;script&gt;");
  });

  it("refuses to load data from a URL", async () => {
    const picture = await drawChart({ data: { url: "https://example.invalid/obs.csv" }, mark: "point" });
    expect(picture).toEqual({ problem: expect.stringMatching(/loads nothing from outside/) });
  });
});

describe("activeContent", () => {
  it("finds scripts, links, event handlers and URLs in tags but not in escaped text or attribute values", () => {
    expect(activeContent('<svg><text aria-label="a onerror=x">&lt;script&gt;</text></svg>')).toBeUndefined();
    expect(activeContent("<svg><script>x</script></svg>")).toBe("<script>");
    expect(activeContent('<svg><g onclick="x"></g></svg>')).toBe("onclick= on <g>");
    expect(activeContent('<svg><image xlink:href="https://example.invalid/a.png"/></svg>')).toBe("<image>");
    expect(activeContent('<svg><path style="fill: url(https://example.invalid/p)"/></svg>')).toBe("a url() in style= on <path>");
    expect(activeContent('<svg><path fill="url(#gradient1)"/></svg>')).toBeUndefined();
  });
});
