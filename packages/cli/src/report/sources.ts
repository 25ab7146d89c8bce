/**
 * The report's list of methods and their sources: every method the document's code calls, cited by its
 * published source, and every rule of thumb it relies on labelled "common practice" with the reason it is
 * used. A method is found by the library call in the code (`aq.fitModel`, `aq.bourdetDerivative`, ...) or, for
 * a model, by its id quoted in the code ("theis", "hantush-jacob"), and cited from the model registry.
 */
import { describeModel, getModel, modelIds } from "@conebook/aquifer";
import type { ConebookDocument } from "@conebook/document";

/** One entry of the list. */
export interface MethodSource {
  method: string;
  /** The published source, or the words "common practice" and why the rule is used. */
  citation: string;
  kind: "published" | "common practice";
}

const ROUNDING: MethodSource = {
  method: "Rounding of estimates to their uncertainty (this report)",
  citation: "Particle Data Group (2018), Review of Particle Physics, Phys. Rev. D 98, 030001, Introduction, section 5.3.",
  kind: "published",
};

/** Sources by the library call that uses them. */
const BY_CALL: readonly { call: RegExp; sources: MethodSource[] }[] = [
  {
    call: /\baq\.fitModel\b|\baq\.fitSeries\b/,
    sources: [
      {
        method: "Nonlinear least squares (bounded Levenberg-Marquardt)",
        citation:
          "Moré, J.J. (1978). The Levenberg-Marquardt algorithm: implementation and theory. In G.A. Watson (ed.), Numerical Analysis, Dundee 1977, Lecture Notes in Mathematics 630, Springer, 105-116.",
        kind: "published",
      },
      {
        method: "Standard errors from s²(JᵀJ)⁻¹ and 95 % intervals with Student's t for n − p degrees of freedom",
        citation: "common practice for least-squares estimates with independent errors of equal variance; the intervals hold only if the model is right.",
        kind: "common practice",
      },
      {
        method: "Akaike information criterion (AIC)",
        citation: "Akaike, H. (1974). A new look at the statistical model identification. IEEE Transactions on Automatic Control 19(6), 716-723.",
        kind: "published",
      },
      {
        method: "Bayesian information criterion (BIC)",
        citation: "Schwarz, G. (1978). Estimating the dimension of a model. The Annals of Statistics 6(2), 461-464.",
        kind: "published",
      },
    ],
  },
  {
    call: /\baq\.compareModels\b/,
    sources: [
      {
        method: "Akaike weights",
        citation: "Burnham, K.P. and Anderson, D.R. (2002). Model Selection and Multimodel Inference, 2nd ed., Springer, section 2.9.",
        kind: "published",
      },
    ],
  },
  {
    call: /\baq\.cooperJacobLine\b/,
    sources: [
      {
        method: "Cooper-Jacob straight line",
        citation: getModel("cooper-jacob").source,
        kind: "published",
      },
      {
        method: "Validity of the straight line: readings with u ≤ 0.01",
        citation: "common practice: the straight line is within about 0.2 % of the Theis drawdown there (0.05 is also used, within about 2 %).",
        kind: "common practice",
      },
    ],
  },
  {
    call: /\baq\.bourdetDerivative\b/,
    sources: [
      {
        method: "Log derivative ds/d ln t",
        citation: "Bourdet, D., Ayoub, J.A., Pirard, Y.M. (1989). Use of pressure derivative in well-test interpretation. SPE Formation Evaluation 4(2), 293-302.",
        kind: "published",
      },
      {
        method: "Smoothing length of the derivative, 0.1 to 0.5 log cycles",
        citation: "common practice: long enough to damp logger noise, short enough to keep the shape of the response.",
        kind: "common practice",
      },
    ],
  },
  {
    call: /\baq\.regimeHints\b/,
    sources: [
      {
        method: "Reading flow regimes from the log-log slope of the derivative (flat: radial flow, falling: leakage or a recharge boundary)",
        citation: "common practice: pattern recognition on the derivative of Bourdet et al. (1989); the report states such readings as hints, not verdicts.",
        kind: "common practice",
      },
    ],
  },
  {
    call: /\baq\.leakanceFromLeakageFactor\b/,
    sources: [
      {
        method: "Leakance K'/b' = T/B² from the leakage factor",
        citation: getModel("hantush-jacob").source,
        kind: "published",
      },
    ],
  },
  {
    call: /\baq\.theisRecoveryLine\b/,
    sources: [
      { method: "Theis recovery: residual drawdown against log t/t'", citation: getModel("theis").source, kind: "published" },
      {
        method: "Recovery points used only where u' ≤ 0.01",
        citation: "common practice: the straight line of residual drawdown holds only where u' is small, as the Cooper-Jacob line does.",
        kind: "common practice",
      },
    ],
  },
  {
    call: /\baq\.recoveryAsDrawdown\b|\baq\.agarwalEquivalentTime\b/,
    sources: [
      {
        method: "Recovery at equivalent time te = tp t'/(tp + t')",
        citation: "Agarwal, R.G. (1980). A new method to account for producing time effects when drawdown type curves are used to analyze pressure buildup and other test data. SPE paper 9289.",
        kind: "published",
      },
    ],
  },
  {
    call: /\baq\.jacobStepTest\b/,
    sources: [
      {
        method: "Step-drawdown test: s_w = B Q + C Q² from the line of s_w/Q against Q",
        citation: "Jacob, C.E. (1947). Drawdown test to determine effective radius of artesian well. Transactions, American Society of Civil Engineers 112, 1047-1064.",
        kind: "published",
      },
    ],
  },
  {
    call: /\baq\.hvorslevSlugTest\b/,
    sources: [
      {
        method: "Slug test: Hvorslev time lag",
        citation: "Hvorslev, M.J. (1951). Time lag and soil permeability in ground-water observations. Bulletin 36, Waterways Experiment Station, U.S. Army Corps of Engineers.",
        kind: "published",
      },
    ],
  },
  {
    call: /\baq\.bouwerRiceSlugTest\b/,
    sources: [
      {
        method: "Slug test: Bouwer and Rice",
        citation: "Bouwer, H. and Rice, R.C. (1976). A slug test for determining hydraulic conductivity of unconfined aquifers with completely or partially penetrating wells. Water Resources Research 12(3), 423-428.",
        kind: "published",
      },
    ],
  },
  {
    call: /\baq\.cooperBredehoeftPapadopulosFit\b|\baq\.cbpNormalizedHead\b/,
    sources: [
      {
        method: "Slug test: Cooper, Bredehoeft and Papadopulos type curve",
        citation: "Cooper, H.H., Bredehoeft, J.D. and Papadopulos, I.S. (1967). Response of a finite-diameter well to an instantaneous charge of water. Water Resources Research 3(1), 263-269.",
        kind: "published",
      },
    ],
  },
  {
    call: /\baq\.estimateBarometricEfficiency\b|\baq\.correctBarometric\b/,
    sources: [
      {
        method: "Barometric efficiency and the barometric correction",
        citation: "Jacob, C.E. (1940). On the flow of water in an elastic artesian aquifer. Transactions, American Geophysical Union 21(2), 574-586.",
        kind: "published",
      },
    ],
  },
  {
    call: /\baq\.removeLinearTrend\b/,
    sources: [
      {
        method: "Background trend: a straight line through the pre-test readings, extrapolated over the test",
        citation: "common practice: it assumes the trend before the test would have continued unchanged through it.",
        kind: "common practice",
      },
    ],
  },
  {
    call: /\baq\.logResample\b/,
    sources: [
      {
        method: "Thinning a logger record to a fixed number of readings per log cycle",
        citation: "common practice: it keeps the late readings of a fixed-interval logger from outweighing the early ones in a fit.",
        kind: "common practice",
      },
    ],
  },
  {
    call: /\baq\.cooperJacobDistance\b/,
    sources: [{ method: "Cooper-Jacob distance-drawdown line", citation: getModel("cooper-jacob").source, kind: "published" }],
  },
  {
    call: /\baq\.barrierDistanceFromImage\b|\baq\.forecastDrawdown\b|\baq\.schemeDrawdown\b/,
    sources: [
      {
        method: "Straight boundaries by image wells",
        citation: "Ferris, J.G., Knowles, D.B., Brown, R.H. and Stallman, R.W. (1962). Theory of aquifer tests. U.S. Geological Survey Water-Supply Paper 1536-E.",
        kind: "published",
      },
    ],
  },
  {
    call: /\baq\.parseObservationCsv\b/,
    sources: [
      {
        method: "Drawdown as the fall of the water level below its static level before pumping",
        citation: "common practice: the definition of drawdown; it assumes the static level would have held without pumping.",
        kind: "common practice",
      },
    ],
  },
];

/** The methods the document's code uses with their sources, models first, then calls, then the rounding rule. */
export function methodSources(doc: ConebookDocument): MethodSource[] {
  const code = doc.cells.filter((c) => c.kind === "code").map((c) => c.source).join("\n");
  const out: MethodSource[] = [];
  for (const id of modelIds) {
    if (!new RegExp(`["'\`]${id.replace(/[+]/g, "\\+")}["'\`]`).test(code)) continue;
    const model = describeModel(id);
    out.push({ method: model.name, citation: model.source, kind: "published" });
  }
  for (const { call, sources } of BY_CALL) {
    if (!call.test(code)) continue;
    for (const s of sources) if (!out.some((o) => o.method === s.method)) out.push(s);
  }
  out.push(ROUNDING);
  return out;
}
