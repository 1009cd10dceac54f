/**
 * The caution notes that go with a design check's result, with stronger
 * wording where this check gives reason: a poor fit, a small
 * sample, a long extrapolation below the data or across sizes, or no
 * confidence bound to design on.
 *
 * Thresholds are judgement, stated so a reviewer can disagree with them:
 * at least 30 specimens is what ASTM C1239 recommends for design data
 * (from memory); fewer than 10 gives a modulus uncertain by tens of percent;
 * an observed significance level below 0.05 rejects the fit at the 5 % level;
 * one decade of extrapolation is ordinary in design, three or more is far
 * beyond anything the data show (common practice, no source).
 */
import type { Caution, DesignCheckResult } from "./check-result";
import { digitsApart, formatLevel, formatNumber } from "./probability-text";

export type { Caution, CautionLevel } from "./check-result";

export const SMALL_SAMPLE = 10;
export const RECOMMENDED_SAMPLE = 30;
export const POOR_FIT_SIGNIFICANCE = 0.05;
export const FAR_EXTRAPOLATION_DECADES = 3;
export const LARGE_SIZE_RATIO = 1000;
/** One-sided confidence below which a bound is hardly a bound (90-95 % is usual for design allowables: common practice). */
export const LOW_CONFIDENCE = 0.9;

/**
 * The cautions for a result (its own `cautions` field excepted, which this fills).
 *
 * @example cautionsFor(result).filter((c) => c.level === "warning")
 */
export function cautionsFor(result: DesignCheckResult): Caution[] {
  const out: Caution[] = [];
  const n = result.parameters.failures ?? result.parameters.specimens;
  const typed = result.input.material.kind === "typed";

  // Extrapolation below the data.
  const decades = result.extrapolationDecades;
  if (decades !== null && decades >= FAR_EXTRAPOLATION_DECADES) {
    out.push({
      id: "extrapolation",
      level: "warning",
      text:
        `The design point lies about ${decades.toFixed(1)} decades of probability below the weakest tested specimen: ` +
        "the straight Weibull line is trusted far outside the data. A second, rarer flaw population would not show " +
        "in this sample. Design on the lower confidence bound and confirm fracture origins by fractography (ASTM C1322).",
    });
  } else {
    out.push({
      id: "extrapolation",
      level: "note",
      text:
        (decades !== null && decades > 0
          ? `The design point lies about ${decades.toFixed(1)} decades of probability below the weakest tested specimen. `
          : "") +
        "Low failure probabilities rest on one flaw population holding below the tested range; design on the lower " +
        "confidence bound and confirm fracture origins by fractography (ASTM C1322).",
    });
  }

  // Sample size.
  if (typed && result.parameters.specimens === undefined) {
    out.push({
      id: "sample",
      level: "warning",
      text:
        "The Weibull parameters were typed without the number of specimens: the check cannot judge how many specimens they rest on, " +
        "how well they fit, or how uncertain they are. Give the number of specimens, or use the test results where you have them.",
    });
  } else if (typed) {
    out.push({
      id: "sample",
      level: n !== undefined && n < RECOMMENDED_SAMPLE ? "warning" : "note",
      text:
        `The Weibull parameters were typed from a datasheet of ${n} specimens: the bounds assume a complete sample (no censoring) of one ` +
        "flaw population, maximum-likelihood values, and that the datasheet's lot represents the parts; the check cannot test the fit.",
    });
  } else if (n !== undefined && n < SMALL_SAMPLE) {
    out.push({
      id: "sample",
      level: "warning",
      text:
        `Only ${n} failures: the modulus is uncertain by tens of percent and the allowable stress at low failure ` +
        `probability even more. Test at least ${RECOMMENDED_SAMPLE} specimens for design data.`,
    });
  } else if (n !== undefined && n < RECOMMENDED_SAMPLE) {
    out.push({
      id: "sample",
      level: "note",
      text: `${n} failures: fewer than the ${RECOMMENDED_SAMPLE} usually asked for design data (ASTM C1239).`,
    });
  }

  // Fit quality.
  if (result.fitQuality && result.fitQuality.significance < POOR_FIT_SIGNIFICANCE) {
    out.push({
      id: "fit",
      level: "warning",
      text:
        `The data do not fit one Weibull distribution well (Anderson-Darling A* ${result.fitQuality.statistic.toFixed(3)}, ` +
        `observed significance ${result.fitQuality.significance.toPrecision(2)}). Look for a bend in the plot (two flaw ` +
        "populations) or an outlying low value, and sort the fracture origins before designing on this fit.",
    });
  } else if (result.fitQualityMissing) {
    out.push({
      id: "fit",
      level: "note",
      text:
        `Goodness of fit is not tested here (${result.fitQualityMissing}): check the plot for a bend (two flaw ` +
        "populations of different moduli), an outlying low value, and the fracture origins (two populations of the " +
        "same modulus leave the plot straight) before relying on the fit.",
    });
  }
  const checks = result.populationChecks;
  const unit = result.input.stressUnit;
  if (checks?.bend && checks.bend.pValue < POOR_FIT_SIGNIFICANCE) {
    out.push({
      id: "bend",
      level: "warning",
      text:
        `The probability plot bends near ${Number(checks.bend.knotStrength.toPrecision(4))} ${unit} ` +
        `(two-segment test, p = ${checks.bend.pValue.toPrecision(2)}): two flaw populations of different moduli may be ` +
        "mixed. Sort the " +
        "fracture origins and fit the population that governs the part, with the others censored.",
    });
  }
  if (checks?.lowOutlier && checks.lowOutlier.pValue < POOR_FIT_SIGNIFICANCE) {
    out.push({
      id: "low-outlier",
      level: "warning",
      text:
        `The weakest specimen, ${Number(checks.lowOutlier.strength.toPrecision(4))} ${unit}, is unusually low for one ` +
        `Weibull population (p = ${checks.lowOutlier.pValue.toPrecision(2)}): find its fracture origin before ` +
        "discarding or keeping it; a rare severe flaw is exactly what governs a large part.",
    });
  }
  if (!result.parameters.converged) {
    out.push({ id: "converged", level: "warning", text: "The fit did not converge: do not use these numbers." });
  }

  const lower = result.allowableLower;
  // No bound to design on.
  if (!lower) {
    out.push({
      id: "bound",
      level: "warning",
      text:
        "No lower confidence bound is given (" +
        (result.allowableLowerMissing ?? "not available") +
        "). The verdict uses the point estimate, which makes no allowance for the scatter of a finite sample of specimens.",
    });
  }

  // A low confidence: the bound sits near the middle of the fit's uncertainty (at 50 % one-sided the plot's band has no width).
  if (lower && result.confidence.oneSided < LOW_CONFIDENCE) {
    out.push({
      id: "low-confidence",
      level: "warning",
      text:
        `The verdict rests on the ${result.confidence.boundLabel}: the true allowable lies below a bound at this level in ` +
        `${formatLevel(1 - result.confidence.oneSided)} of samples, so it allows little for the scatter of a finite sample` +
        (result.confidence.twoSided <= 0 ? " (the plot's two-sided band has no width)" : "") +
        ". A 90 % or 95 % one-sided bound is usual for design allowables.",
    });
  }

  // A "lower" bound above the point estimate (a low confidence, or the unbiased modulus of a small sample
  // lowering the estimate): the verdict rests on the bound as asked, but it is the less cautious number.
  if (lower && lower.value > result.allowablePoint.value) {
    const unit = result.input.stressUnit;
    const digits = digitsApart(lower.value, result.allowablePoint.value);
    out.push({
      id: "bound-above-estimate",
      level: "warning",
      text:
        `The ${result.confidence.boundLabel} on the inert allowable stress, ${formatNumber(lower.value, digits)} ${unit}, lies above its ` +
        `point estimate, ${formatNumber(result.allowablePoint.value, digits)} ${unit}: at this confidence the bound is less cautious than ` +
        "the estimate. The verdict rests on the bound as the check asks; a 95 % one-sided bound is usual for design.",
    });
  }

  // Size scaling.
  const k = result.sizeRatio.value;
  out.push({
    id: "size",
    level: k >= LARGE_SIZE_RATIO || k <= 1 / LARGE_SIZE_RATIO ? "warning" : "note",
    text:
      (k >= LARGE_SIZE_RATIO || k <= 1 / LARGE_SIZE_RATIO
        ? `The part is ${k >= 1 ? "larger" : "smaller"} than the specimens by a factor of ${formatRatio(k)}: size scaling over this range is rarely verified. `
        : "") +
      `Size scaling assumes the same ${result.input.flaws} flaw population, surface finish, machining and environment in ` +
      "specimen and part; the multiaxial criterion alone changes biaxial predictions by roughly 7-16 % at m = 10.",
  });

  if (result.censoring) {
    const c = result.censoring;
    const flips = c.uncensored.pass !== result.verdict.pass;
    out.push({
      id: "censored",
      level: c.weakestCensored || flips ? "warning" : "note",
      text:
        c.text +
        " The fit describes one population only; the part fails from either, so check the other population's risk too.",
    });
  }

  const life = result.input.lifetime;
  if (life) {
    out.push({
      id: "lifetime",
      level: "note",
      text:
        `The lifetime allowable stress assumes power-law crack growth with n = ${life.n} and B measured in the service ` +
        "environment and temperature, Weibull parameters of inert strength, and a constant stress; n depends strongly " +
        "on environment, and thresholds or R-curve behaviour change the answer. It rests on the same basis as the inert allowable " +
        (result.allowableLower ? `(the ${result.confidence.boundLabel}); the uncertainty of n and B is not included.` : "(the point estimate); the uncertainty of n and B is not included."),
    });
  }
  const proof = result.input.proof;
  if (proof) {
    const above = result.appliedStress.value > proof.proofStress;
    out.push({
      id: "proof",
      level: above ? "warning" : "note",
      text:
        (above ? "The applied stress is above the proof stress: the proof test screens nothing at this load. " : "") +
        "The proof-test guarantee holds only if the proof load is removed fast or in a dry, inert environment, so no " +
        "crack grows while unloading, and if the proof stress reaches the same places as the service stress.",
    });
  }

  out.push({
    id: "environment",
    level: "note",
    text:
      "Moisture, temperature and sustained or cyclic load lower strength over time (slow crack growth); this check is " +
      "for inert, short-term strength unless the lifetime step was used. R-curve materials (Y-TZP, some silicon " +
      "nitrides) fall outside ASTM C1683.",
  });
  out.push({
    id: "codes",
    level: "note",
    text:
      "This result supports, and does not replace, the judgement of a licensed engineer under the local codes that govern the " +
      "application (for example ASTM E1300 or EN 16612 for structural glass, ISO 6872 for dental ceramics, ISO 6474 and " +
      "ISO 13356 for implant ceramics); where a failure can hurt someone, those codes and that engineer decide.",
  });
  return out;
}

/** The factor between part and specimen sizes: "1,250" with digit groups, a power of ten beyond a million. */
function formatRatio(k: number): string {
  const r = k >= 1 ? k : 1 / k;
  const rounded = Number(r.toPrecision(3));
  return rounded < 1e6 ? rounded.toLocaleString("en-US") : rounded.toExponential(2).replace("e+", "e");
}

/** The notes that hold for any result, shown before the form is complete. */
export function generalCautions(): Caution[] {
  return [
    {
      id: "extrapolation",
      level: "note",
      text:
        "Allowable stresses at low failure probabilities extrapolate below the tested data; design on a lower " +
        "confidence bound and confirm fracture origins by fractography (ASTM C1322).",
    },
    {
      id: "size",
      level: "note",
      text: "Size scaling assumes one flaw population, with the same surface finish and environment in specimen and part.",
    },
    {
      id: "environment",
      level: "note",
      text: "Moisture, temperature and sustained load lower strength over time (slow crack growth).",
    },
    {
      id: "codes",
      level: "note",
      text: "Results support, and do not replace, the judgement of a licensed engineer under the codes that govern the application.",
    },
  ];
}
