/**
 * The report's test-information block, from the header's `testInformation`: site, dates, people, the wells
 * (role, distance, screen) and the rate schedule in a numbered table each, and the units the numbers are in.
 */
import { formatPlain, typesetUnit, type DocumentHeader } from "@conebook/document";
import { escapeHtml } from "./escape.js";
import type { Numbering } from "./outputs-html.js";

function dateText(d: string): string {
  return d.replace("T", " ");
}

/** The block's HTML; says so plainly when the header has no test information. */
export function testInformationHtml(header: DocumentHeader, numbering: Numbering): string {
  const info = header.testInformation;
  if (info === undefined) {
    return (
      `<section class="test-info" id="test-information"><h2>Test information</h2>` +
      `<p class="missing">The document header gives no test information (site, dates, wells, rates, analyst, reviewer); ` +
      `add a <code>testInformation</code> block to the header (docs/format.md).</p></section>`
    );
  }
  const length = typesetUnit(info.units?.length);
  const time = typesetUnit(info.units?.time);
  const rate = typesetUnit(info.units?.rate);
  // A test without a pumped well (a slug test, a record of ambient levels) has no pumping to start or end.
  const pumped = (info.wells ?? []).some((w) => w.role === "pumped") || (info.rates ?? []).length > 0;
  const items: [string, string | undefined][] = [
    ["Site", info.site],
    ["Location", info.location],
    ["Purpose", info.purpose],
    [pumped ? "Pumping started" : "Test started", info.started && dateText(info.started)],
    [pumped ? "Pumping ended" : "Test ended", info.ended && dateText(info.ended)],
    ["Analyst", info.analyst],
    ["Reviewer", info.reviewer],
    ["Screen depths measured from", info.datum],
    [
      "Units of the test information",
      info.units ? [info.units.length && `length ${length}`, info.units.time && `time ${time}`, info.units.rate && `rate ${rate}`].filter(Boolean).join(", ") : undefined,
    ],
    ["Notes", info.notes],
  ];
  const dl = items
    .filter((i): i is [string, string] => i[1] !== undefined && i[1] !== "")
    .map(([k, v]) => `<dt>${escapeHtml(k)}</dt><dd>${escapeHtml(v)}</dd>`)
    .join("\n");
  const parts = [`<section class="test-info" id="test-information"><h2>Test information</h2><dl class="facts">\n${dl}\n</dl>`];
  const unit = (u: string) => (u ? ` <span class="unit">(${escapeHtml(u)})</span>` : "");
  if (info.wells && info.wells.length > 0) {
    const { label, anchor } = numbering.table("Wells of the test");
    const rows = info.wells
      .map(
        (w) =>
          `<tr><td>${escapeHtml(w.name)}</td><td>${escapeHtml(w.role)}</td>` +
          `<td class="num">${w.distance === undefined ? "" : escapeHtml(formatPlain(w.distance))}</td>` +
          `<td class="num">${w.screen ? escapeHtml(`${formatPlain(w.screen[0])} to ${formatPlain(w.screen[1])}`) : ""}</td>` +
          `<td class="num">${w.radius === undefined ? "" : escapeHtml(formatPlain(w.radius))}</td>` +
          `<td>${escapeHtml(w.notes ?? "")}</td></tr>`,
      )
      .join("\n");
    parts.push(
      `<table id="${anchor}"><caption><span class="label">Table ${label}.</span> Wells of the test</caption>` +
        `<thead><tr><th>well</th><th>role</th><th>distance from the pumped well${unit(length)}</th><th>screen, top to bottom${unit(length)}</th><th>radius${unit(length)}</th><th>notes</th></tr></thead>` +
        `<tbody>\n${rows}\n</tbody></table>`,
    );
  }
  if (info.rates && info.rates.length > 0) {
    const { label, anchor } = numbering.table("Pumping rate schedule");
    const rows = info.rates
      .map((r) => `<tr><td class="num">${escapeHtml(formatPlain(r.from))}</td><td class="num">${r.to === undefined ? "end of record" : escapeHtml(formatPlain(r.to))}</td><td class="num">${escapeHtml(formatPlain(r.rate))}</td></tr>`)
      .join("\n");
    parts.push(
      `<table id="${anchor}"><caption><span class="label">Table ${label}.</span> Pumping rate schedule (time since pumping started)</caption>` +
        `<thead><tr><th>from${unit(time)}</th><th>to${unit(time)}</th><th>rate${unit(rate)}</th></tr></thead><tbody>\n${rows}\n</tbody></table>`,
    );
  }
  parts.push("</section>");
  return parts.join("\n");
}
