/**
 * Coverage of the stated 95 % intervals of fitModel, by a larger seeded study than the test suite's
 * (tests/support/coverage-study.ts): Theis and Hantush-Jacob, independent and AR(1) noise. Prints, per case and
 * parameter, how often the interval shown and the linearised interval covered the true value, with the Monte
 * Carlo standard error and the target (93-97 % independent, at least 90 % with AR(1) rho = 0.8).
 */
import { coverageStudy, type CoverageCase } from "../../support/coverage-study.js";

interface Row {
  readonly label: string;
  readonly c: CoverageCase;
  readonly target: "independent" | "correlated" | null;
}

const RECORDS = Number(process.env.CONEBOOK_COVERAGE_RECORDS ?? 2000);

const ROWS: Row[] = [
  { label: "Theis, independent", c: { model: "theis", phi: 0, records: RECORDS, seed: 11 }, target: "independent" },
  { label: "Theis, AR(1) 0.8", c: { model: "theis", phi: 0.8, records: RECORDS, seed: 12 }, target: "correlated" },
  { label: "Hantush-Jacob, independent", c: { model: "hantush-jacob", phi: 0, records: RECORDS, seed: 13 }, target: "independent" },
  { label: "Hantush-Jacob, AR(1) 0.8", c: { model: "hantush-jacob", phi: 0.8, records: RECORDS, seed: 14 }, target: "correlated" },
  { label: "Theis, AR(1) 0.5", c: { model: "theis", phi: 0.5, records: Math.round(RECORDS / 2), seed: 15 }, target: null },
  { label: "Theis, AR(1) 0.95", c: { model: "theis", phi: 0.95, records: Math.round(RECORDS / 2), seed: 16 }, target: null },
];

/** Runs the study and prints the coverage table; returns false when a target is missed. */
export function coverageSection(): boolean {
  console.log("\n## Coverage of the 95 % intervals (fitModel, 30 readings, 1 cm noise, seeded)");
  const header = ["case", "records", "parameter", "shown", "linearised", "MC s.e.", "AR(1) chosen", "target"];
  const lines: string[][] = [];
  let allMet = true;
  for (const row of ROWS) {
    const result = coverageStudy(row.c);
    const se = Math.sqrt((0.95 * 0.05) / row.c.records);
    result.parameters.forEach((name, j) => {
      const shown = result.shown[j]!;
      let verdict = "-";
      if (row.target === "independent") {
        const ok = shown >= 0.93 && shown <= 0.97;
        allMet &&= ok;
        verdict = ok ? "met (93-97 %)" : "MISSED (93-97 %)";
      } else if (row.target === "correlated") {
        const ok = shown >= 0.9;
        allMet &&= ok;
        verdict = ok ? "met (>= 90 %)" : "MISSED (>= 90 %)";
      }
      lines.push([
        row.label,
        String(row.c.records),
        name,
        `${(100 * shown).toFixed(1)} %`,
        `${(100 * result.linearised[j]!).toFixed(1)} %`,
        `${(100 * se).toFixed(1)} %`,
        `${(100 * result.ar1Chosen).toFixed(0)} %`,
        verdict,
      ]);
    });
    console.error(`  (${row.label}: ${(result.milliseconds / row.c.records).toFixed(2)} ms per fit)`);
  }
  const widths = header.map((h, i) => Math.max(h.length, ...lines.map((l) => l[i]!.length)));
  const format = (cells: string[]) => cells.map((c, i) => c.padEnd(widths[i]!)).join("  ");
  console.log(format(header));
  console.log(widths.map((w) => "-".repeat(w)).join("  "));
  for (const l of lines) console.log(format(l));
  console.log(
    "  note: 'shown' is the interval fitModel reports by default (linearised, or AR(1)-corrected when the Durbin-Watson test rejects " +
      "independence, or profile where the likelihood is far from quadratic); 'linearised' assumes independent errors. " +
      "Records per case: CONEBOOK_COVERAGE_RECORDS (default 2000).",
  );
  return allMet;
}
