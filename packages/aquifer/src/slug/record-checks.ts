/**
 * The usual data checks of slug tests (common practice, no source; the guidance to repeat tests with different
 * initial displacements and compare normalized records is the one of Butler 1998, from memory): the observed
 * initial displacement against the expected one, the first readings against H/H0 = 1, and repeat tests
 * against each other after normalization.
 */
import type { NormalizedSlugRecord } from "./slug-data.js";

/** One finding of slugRecordChecks. */
export interface SlugCheck {
  readonly test: string;
  readonly kind: "initial-displacement" | "first-reading" | "repeat-agreement";
  readonly ok: boolean;
  readonly message: string;
}

/** Interpolates h at time t (d) in ln t from a record; NaN outside its range. */
function interpolate(r: NormalizedSlugRecord, t: number): number {
  const n = r.t.length;
  if (n === 0 || t < r.t[0]! || t > r.t[n - 1]!) return Number.NaN;
  for (let i = 1; i < n; i++) {
    if (r.t[i]! >= t) {
      const a = Math.log(r.t[i - 1]!);
      const b = Math.log(r.t[i]!);
      const f = b === a ? 0 : (Math.log(t) - a) / (b - a);
      return r.h[i - 1]! + f * (r.h[i]! - r.h[i - 1]!);
    }
  }
  return r.h[n - 1]!;
}

/**
 * Checks slug records (normalized, t in d, h = H/H0): (1) H0 against `expectedH0` (m, e.g. slug volume /
 * (pi rc^2)) within `tolerance` (default 10 %); (2) the first reading's H/H0 within 0.9..1.1 of 1 when taken
 * before 1 % of the record's span; (3) each pair of repeat tests agrees within `agreement` (default 0.05 in
 * H/H0) at their common times. Dimensionless results with messages a user can act on.
 */
export function slugRecordChecks(
  records: readonly { name: string; record: NormalizedSlugRecord; expectedH0?: number }[],
  options: { tolerance?: number; agreement?: number } = {},
): SlugCheck[] {
  const tolerance = options.tolerance ?? 0.1;
  const agreement = options.agreement ?? 0.05;
  const out: SlugCheck[] = [];
  for (const { name, record, expectedH0 } of records) {
    if (expectedH0 !== undefined) {
      const ratio = Math.abs(record.H0) / Math.abs(expectedH0);
      const ok = Math.abs(ratio - 1) <= tolerance;
      out.push({
        test: name,
        kind: "initial-displacement",
        ok,
        message: ok
          ? `H0 = ${record.H0.toPrecision(3)} m is within ${tolerance * 100} % of the expected ${expectedH0.toPrecision(3)} m.`
          : `H0 = ${record.H0.toPrecision(3)} m differs from the expected ${expectedH0.toPrecision(3)} m by ` +
            `${((ratio - 1) * 100).toFixed(0)} %: check the slug volume, the casing radius, or whether the level moved during insertion.`,
      });
    }
    if (record.t.length > 1) {
      const span = record.t[record.t.length - 1]! - record.t[0]!;
      if (record.t[0]! <= 0.01 * span) {
        const h0 = record.h[0]!;
        const ok = h0 >= 0.9 && h0 <= 1.1;
        out.push({
          test: name,
          kind: "first-reading",
          ok,
          message: ok
            ? `First reading H/H0 = ${h0.toFixed(3)}.`
            : `First reading H/H0 = ${h0.toFixed(3)} is far from 1: the slug was not instantaneous or H0 is wrong; ` +
              "fit from a later start or correct H0.",
        });
      }
    }
  }
  for (let i = 0; i < records.length; i++) {
    for (let j = i + 1; j < records.length; j++) {
      const a = records[i]!;
      const b = records[j]!;
      let worst = 0;
      let compared = 0;
      for (let k = 0; k < a.record.t.length; k++) {
        const other = interpolate(b.record, a.record.t[k]!);
        if (Number.isNaN(other)) continue;
        compared++;
        worst = Math.max(worst, Math.abs(a.record.h[k]! - other));
      }
      const ok = compared > 0 && worst <= agreement;
      out.push({
        test: `${a.name} / ${b.name}`,
        kind: "repeat-agreement",
        ok,
        message:
          compared === 0
            ? "The two records share no time range; they cannot be compared."
            : ok
              ? `Repeat tests agree within ${worst.toFixed(3)} in H/H0.`
              : `Repeat tests differ by up to ${worst.toFixed(3)} in H/H0: a dependence on H0 suggests non-linear ` +
                "losses or well development between tests; analyse them separately and report the spread.",
      });
    }
  }
  return out;
}
