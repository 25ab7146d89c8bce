import { describe, expect, it } from "vitest";
import type { CellOutput, ConebookDocument } from "@conebook/document";
import { parseDocument } from "@conebook/document";
import { CAUTION_TEXT, REPORT_CSP, buildReport, chartKey, escapeHtml, type ReportInput } from "../src/report/index.js";
import { activeContent, drawChart, layersWithoutLegend, reportChartSpec } from "../src/report/chart-svg.js";
import { formatNumber } from "../src/format.js";

const HOSTILE = `<script>alert("x")</script><img src=x onerror=alert(1)>`;

const Q = (s: string) => `'${s.replace(/'/g, "''")}'`;

function doc(): ConebookDocument {
  const text = [
    "---",
    "conebook: 1",
    `title: ${Q(`Test ${HOSTILE}`)}`,
    "seed: 3",
    "testInformation:",
    `  site: ${Q(`Site ${HOSTILE}`)}`,
    `  analyst: ${Q(`Analyst ${HOSTILE}`)}`,
    `  reviewer: ${Q(`Reviewer ${HOSTILE}`)}`,
    `  datum: ${Q(HOSTILE)}`,
    `  notes: ${Q(HOSTILE)}`,
    "  units: {length: m, time: min, rate: m3/d}",
    "  wells:",
    `    - {name: ${Q(`PW ${HOSTILE}`)}, role: pumped, screen: [10, 20], notes: ${Q(HOSTILE)}}`,
    "    - {name: OB-1, role: observation, distance: 30}",
    "  rates:",
    "    - {from: 0, to: 1440, rate: 1450}",
    "---",
    "",
    "[narrative:intro]: #",
    "",
    `Some *prose* with raw HTML ${HOSTILE} and [a link](javascript:alert(1)).`,
    "",
    `## Result`,
    "",
    `T = {=calc/T} and {=calc/"${HOSTILE.replace(/"/g, '\\"')}"} and {=${HOSTILE}} and 886 by hand.`,
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
    verification: { state: "differences", summary: `summary ${HOSTILE}`, details: [`detail ${HOSTILE}`] },
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
    {
      type: "table",
      title: "Fitted parameters",
      columns: [{ name: "parameter" }, { name: "estimate" }, { name: "standard error" }, { name: "95 % low" }, { name: "95 % high" }, { name: "unit" }, { name: "note" }],
      rows: [
        ["T (transmissivity)", 445.5791009018265, 5.543271233637446, 434.752083056691, 456.6757536032109, "m2/d", null],
        ["S (storativity)", 0.0002785112299127019, 0.00001457914303342487, 0.0002511255646241797, 0.0003088833480715932, "1", null],
        ["B (leakage factor)", 999999.9999999995, 5705182007.376093, 0, null, "m", `at the upper bound: ${HOSTILE}`],
        ["AIC", -717.6210359382598, null, null, null, "", null],
      ],
    },
    {
      type: "table",
      title: `Readings of ${HOSTILE}: 1 used, 1 left out`,
      columns: [{ name: "reading" }, { name: "time", unit: "min" }, { name: "drawdown", unit: "m" }, { name: "use" }],
      rows: [[1, 0.5, 0.162, "used"], [2, 3000, 0.1, `left out: ${HOSTILE}`]],
    },
  ];
  const html = buildReport(input(hostileOutputs));

  it("escapes text from the title, narrative, references, test information, verification, code and every output type, so no markup gets in", () => {
    expect(html).not.toMatch(/<script/i);
    expect(html).not.toMatch(/<img/i);
    // Event-handler attributes outside quoted attribute values (escaped text inside a title is no attribute).
    expect(html.replace(/"[^"]*"/g, '""')).not.toMatch(/<[a-z]+[^>]*\son[a-z]+=/i);
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
    expect(html).toMatch(/<details class="code"><summary>Code \(cell calc\)<\/summary><pre><code>const s = /);
  });

  it("shows values to four significant digits with typeset units, errors with file:line:column, and the provenance checksums", () => {
    expect(html).toContain('<span class="number" title="0.0012312254472804228">0.001231</span> <span class="unit">m²/s&lt;script&gt;');
    expect(html).toContain(`Error: t.cone.md:12:3: ${escapeHtml(HOSTILE)}`);
    expect(html).toContain("ab".repeat(32));
    expect(html).toContain("data/ob2.csv");
    expect(html).toContain("cd".repeat(32));
  });

  it("states the date of the run when there is one, and says so when there is none", () => {
    expect(html).toContain("<dt>Date of the run</dt><dd>not stated");
    expect(buildReport(input([], { runDate: "2026-03-14" }))).toContain("<dt>Date of the run</dt><dd>2026-03-14</dd>");
  });

  it("rounds an estimate row to its standard error, says in words when the data do not constrain a parameter, and writes no unit for a dimensionless one", () => {
    const row = (name: string) => new RegExp(`<tr[^>]*><td>${name}[^<]*</td>(.*?)</tr>`).exec(html)?.[1]?.replace(/<span class="number" title="[^"]*">([^<]*)<\/span>/g, "$1") ?? "";
    expect(row("T \\(transmissivity\\)")).toBe('<td class="num">446</td><td class="num">6</td><td class="num">435</td><td class="num">457</td><td class="unit">m²/d</td>');
    expect(row("S \\(storativity\\)")).toBe('<td class="num">2.79 × 10⁻⁴</td><td class="num">1.5 × 10⁻⁵</td><td class="num">2.51 × 10⁻⁴</td><td class="num">3.09 × 10⁻⁴</td><td class="unit">–</td>');
    expect(row("B \\(leakage factor\\)")).toBe(`<td class="num">1 × 10⁶</td><td class="words" colspan="3">at the upper bound: ${escapeHtml(HOSTILE)}</td><td class="unit">m</td>`);
    expect(row("AIC")).toBe('<td class="num">−717.6</td><td></td><td></td><td></td><td class="unit">–</td>');
    expect(html).not.toContain("<th>note</th>");
  });

  it("puts the caution, the verification outcome, the test information and the contents before the analysis", () => {
    const order = ["Caution.", "Not verified at export.", "Test information", "How numbers are shown.", "Contents", "Some <em>prose</em>"].map((t) => html.indexOf(t));
    expect(order.every((i) => i > 0)).toBe(true);
    expect([...order].sort((a, b) => a - b)).toEqual(order);
    expect(html).toContain('<a href="#section-1"><span class="secno">1</span>Result</a>');
    expect(html).toMatch(/<caption><span class="label">Table 1\.<\/span> Wells of the test<\/caption>/);
    expect(html).toContain('<td class="num">10 to 20</td>');
    expect(html).toContain("Table A2.");
    expect(html).toMatch(/<td class="left-out">left out: &lt;script&gt;/);
  });

  it("renders narrative references with the fit's rounding and marks those that do not resolve", () => {
    expect(html).toMatch(/<span class="reference" title="\{=calc\/T\} = 445\.5791009018265 m2\/d[^"]*">446 ± 6 m²\/d<\/span>/);
    expect(html).toContain(`<span class="reference" title="{=calc/&quot;${escapeHtml(HOSTILE.replace(/"/g, '\\"'))}&quot;} = 0.0012312254472804228`);
    expect(html).toContain('<span class="reference reference-problem" title="not a reference: a reference starts with the id of a cell');
    expect(html).toMatch(/<td>intro<\/td><td class="num">886<\/td>/);
  });

  it("places a chart's drawing at its output and says so when a chart could not be drawn", () => {
    const chart: CellOutput = { type: "chart", spec: { mark: "point" }, summary: { datasets: [] } };
    const withSvg = buildReport({ ...input([chart]), charts: { [chartKey("calc", 0)]: { svg: "<svg></svg>", caption: HOSTILE } } });
    expect(withSvg).toContain(`<figure class="chart" id="figure-1"><svg></svg><figcaption><span class="label">Figure 1.</span> ${escapeHtml(HOSTILE)}</figcaption></figure>`);
    const without = buildReport({ ...input([chart]), charts: { [chartKey("calc", 0)]: { problem: HOSTILE } } });
    expect(without).toContain(`The chart could not be drawn: ${escapeHtml(HOSTILE)}`);
  });
});

describe("reportChartSpec and layersWithoutLegend", () => {
  it("takes the title out as the caption, widens the plot to the text width, and finds layers no legend describes", () => {
    const spec = { title: "Forecast", width: 480, height: 320, layer: [{ mark: "line", encoding: { color: { datum: "a" } } }, { mark: { type: "line" }, encoding: {} }, { mark: "rule" }] };
    expect(reportChartSpec(spec)).toEqual({ spec: { width: 560, height: 373, layer: spec.layer, config: { legend: { labelLimit: 0 } } }, caption: "Forecast" });
    expect(reportChartSpec({ mark: "point", config: { legend: { labelLimit: 90 } } })).toEqual({ spec: { mark: "point", config: { legend: { labelLimit: 90 } } } });
    expect(layersWithoutLegend(spec)).toEqual([2]);
    expect(layersWithoutLegend({ layer: [{ mark: "point", encoding: {} }, { mark: "rule" }] })).toEqual([]);
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
