/**
 * The design check: from a check description to a verdict with its basis.
 *
 * Which allowable governs: the inert allowable stress at the required
 * survival, or, with a lifetime, the constant stress the design flaw
 * sustains for that lifetime under slow crack growth (always the lower of
 * the two). A proof test raises the design flaw's inert strength to at least
 * the proof stress (check-time.ts). Every allowable rests on one basis: the
 * one-sided lower confidence bound when the inputs carry their uncertainty
 * (test data, or datasheet values with the number of specimens), otherwise
 * the point estimate, and the verdict says which. The point estimate is
 * shown beside the bound, never used for the verdict when a bound exists.
 *
 * Pure: no clock, no randomness beyond the core's seeded simulations, no
 * input or output. The task pane and `brittle check` only call it.
 */
import { expectedFailures, failuresUpperBound } from "./lot-failures";
import { postProofFailureProbability } from "./proof-test";
import { inertStrengthToSurvive } from "./crack-growth-life";
import { fitQuality } from "../weibull/anderson-darling";
import { designStress, failureProbability, strengthAtFailureProbability } from "../weibull/distribution";
import { plottingPositions, type PlotPoint } from "../weibull/plotting-positions";
import { singlePopulationChecks } from "../weibull/single-population-checks";
import { cautionsFor } from "./check-cautions";
import { censoringComparison } from "./check-censoring";
import type { CheckDescription } from "./check-description";
import type {
  BasisLine,
  BoundedLine,
  ConfidenceConvention,
  DesignCheckResult,
  Governing,
  ProofCredit,
  ResultLine,
} from "./check-result";
import { resolveSizes } from "./check-sizes";
import { failureProbabilityUpper, strengthModel, type StrengthModel } from "./check-strength";
import { lifetimeStressFromInert, proofGuaranteedLife } from "./check-time";
import { convertTime, parseBUnit } from "./check-units";
import { validateCheckDescription } from "./check-validate";
import { confidenceConvention } from "./confidence-convention";
import { digitsApart, formatLevel, formatNumber, formatProbability, formatReserveFactor } from "./probability-text";

/**
 * Runs a design check. Throws CheckFieldError (an InputError) naming the
 * field when the description cannot be used, and InputError when the core
 * cannot compute a number for it.
 *
 * @example runDesignCheck(description).verdict.text // "FAIL: the applied stress 120 MPa exceeds ..."
 */
export function runDesignCheck(description: CheckDescription): DesignCheckResult {
  const input = validateCheckDescription(description);
  const confidence = confidenceConvention(input.confidence);
  const model = strengthModel(input.material, confidence.oneSided);
  const core = evaluate(input, model, confidence);

  const sample = model.sample;
  const points = sample ? plottingPositions(sample) : [];
  const censoredStrengths = sample ? sample.strengths.filter((_, i) => sample.censored?.[i]) : [];
  const censoring =
    input.material.kind === "data" && censoredStrengths.length > 0
      ? censoringComparison(input, core, (complete) => evaluate(complete, strengthModel(complete.material, confidence.oneSided), confidence))
      : null;

  let fit: DesignCheckResult["fitQuality"] = null;
  let fitQualityMissing: string | undefined;
  if (sample && censoredStrengths.length > 0) fitQualityMissing = "the goodness-of-fit test applies to complete samples only";
  else if (sample) {
    const q = fitQuality(sample);
    fit = { statistic: q.aStar, significance: q.osl };
  }
  let populationChecks: DesignCheckResult["populationChecks"] = null;
  if (sample) {
    const c = singlePopulationChecks(sample);
    populationChecks = {
      bend: c.bilinear ? { pValue: c.bilinear.pValue, knotStrength: c.bilinear.knotStrength } : null,
      lowOutlier: c.lowOutlier ? { pValue: c.lowOutlier.pValue, strength: c.lowOutlier.strength } : null,
    };
  }

  const result: DesignCheckResult = {
    input,
    sample,
    parameters: model.parameters,
    confidence,
    specimenSize: core.specimenSize,
    partSize: core.partSize,
    sizeRatio: core.sizeRatio,
    appliedStress: core.appliedStress,
    targetFailureProbability: core.target,
    allowablePoint: core.allowablePoint,
    allowableLower: core.allowableLower,
    allowableLowerMissing: model.boundMissing,
    failureProbabilityAtApplied: core.pfPoint,
    failureProbabilityUpper: core.pfUpper,
    expectedFailures: core.expected,
    failuresUpperBound: core.upperCount,
    lifetimeAllowable: core.lifetime,
    proof: core.proof,
    governing: core.governing,
    highestPassingStress: {
      value: core.governing.allowable,
      basis: `the governing ${core.governing.name}: any applied stress up to it passes`,
    },
    reserveFactor: {
      value: core.reserveFactor,
      basis: `reserve factor = governing allowable stress / applied stress (${formatNumber(core.governing.allowable, stressDigits(core))} / ${formatNumber(core.applied, stressDigits(core))})`,
    },
    marginOfSafety: {
      value: core.reserveFactor - 1,
      basis: "margin of safety = reserve factor - 1 (negative: the applied stress exceeds the allowable)",
    },
    verdict: { pass: core.pass, onLowerBound: core.onBound, text: verdictText(input, core, confidence) },
    basis: [],
    cautions: [],
    censoring,
    fitQuality: fit,
    fitQualityMissing,
    populationChecks,
    points,
    censoredStrengths,
    extrapolationDecades: extrapolation(points, core.target.value, core.sizeRatio.value),
  };
  result.basis = basisLines(result, model);
  result.cautions = cautionsFor(result);
  return result;
}

/** The numbers of one check, shared by the check itself and its uncensored comparison. */
export interface CheckNumbers {
  applied: number;
  appliedStress: ResultLine;
  specimenSize: ResultLine;
  partSize: ResultLine;
  sizeRatio: ResultLine;
  target: ResultLine;
  allowablePoint: ResultLine;
  allowableLower: ResultLine | null;
  onBound: boolean;
  pfPoint: ResultLine;
  pfUpper: ResultLine | null;
  expected: BoundedLine;
  upperCount: BoundedLine;
  lifetime: BoundedLine | null;
  proof: ProofCredit | null;
  governing: Governing;
  reserveFactor: number;
  pass: boolean;
  shape: number;
}

function evaluate(input: CheckDescription, model: StrengthModel, confidence: ConfidenceConvention): CheckNumbers {
  const { shape, scale } = model.parameters;
  const unit = input.stressUnit;
  const stress = (x: number) => `${formatNumber(x)} ${unit}`;
  const sizes = resolveSizes(input, shape);
  const k = sizes.part.value / sizes.specimen.value;
  const sizeWord = input.flaws === "volume" ? "effective volume" : "effective area";
  const applied = input.appliedStress ?? sizes.tablePeak!;
  const target = targetProbability(input);
  const survival = input.requirement.kind === "survival" ? input.requirement.survival : 1 - target.value;
  const weibull = `two-parameter Weibull, size ratio ${formatNumber(k)}`;

  const inertPoint =
    input.requirement.kind === "survival"
      ? designStress({ survival, shape, scale, sizeRatio: k })
      : strengthAtFailureProbability({ failureProbability: target.value, shape, scale, sizeRatio: k });
  const inertLower = model.lowerBound ? model.lowerBound(survival, k) : null;
  const onBound = inertLower !== null;
  const inertBasis = inertLower ?? inertPoint;
  const basisWord = onBound ? confidence.boundLabel : "point estimate (no confidence bound)";

  // The proof test's floor on the design flaw's inert strength (check-time.ts).
  const proofStress = input.proof?.proofStress ?? 0;
  const designInert = Math.max(inertBasis, proofStress);
  const designInertPoint = Math.max(inertPoint, proofStress);

  const life = input.lifetime;
  let lifetime: BoundedLine | null = null;
  let lifetimeInB = 0;
  if (life) {
    const bTime = parseBUnit(life.bUnit)!.time;
    // The lifetime in B's time unit, so t and B share one unit.
    lifetimeInB = convertTime(life.lifetime, life.timeUnit, bTime);
    const value = lifetimeStressFromInert({ inertStrength: designInert, lifetime: lifetimeInB, n: life.n, B: life.B });
    const pointEstimate = lifetimeStressFromInert({ inertStrength: designInertPoint, lifetime: lifetimeInB, n: life.n, B: life.B });
    lifetime = {
      value,
      pointEstimate,
      basis:
        `strength-probability-time: the design flaw's inert strength ${stress(designInert)} (${designInert === proofStress && proofStress > inertBasis ? "the proof stress" : basisWord}) ` +
        `carried over ${formatNumber(life.lifetime)} ${life.timeUnit} of constant stress by power-law crack growth, ` +
        `B s^(n-2) + t s^n = B s_i^(n-2), n = ${formatNumber(life.n)}, B = ${formatNumber(life.B)} ${life.bUnit}; ` +
        `point estimate ${stress(pointEstimate)} shown beside, not used for the verdict${onBound ? "" : " (no bound exists)"}`,
    };
  }

  const governing: Governing = life
    ? {
        check: "lifetime",
        name: `allowable stress over ${formatNumber(life.lifetime)} ${life.timeUnit} of sustained load (slow crack growth)`,
        allowable: lifetime!.value,
        basis:
          "the constant stress the design flaw sustains for the lifetime under power-law crack growth, from its inert strength " +
          (designInert > inertBasis ? `(the proof stress ${stress(proofStress)}, which every proof-test survivor reaches)` : `(${basisWord})`),
      }
    : {
        check: "inert",
        name: designInert > inertBasis ? "allowable stress of proof-tested parts (the proof stress)" : "inert allowable stress at the required survival",
        allowable: designInert,
        basis:
          designInert > inertBasis
            ? `the proof stress ${stress(proofStress)}: every part that survives the proof test is at least this strong (inert)`
            : `${basisWord} of the stress at the required survival`,
      };
  const pass = applied <= governing.allowable;

  // Failure probability in service: at the applied stress, or, with a lifetime, at the inert strength a flaw needs to survive it.
  const equivalentInert = life ? inertStrengthToSurvive({ stress: applied, duration: lifetimeInB, n: life.n, B: life.B }) : applied;
  const screened = input.proof !== null && equivalentInert <= proofStress;
  const pfPointValue = input.proof
    ? postProofFailureProbability({ stress: equivalentInert, proofStress, shape, scale, sizeRatio: k })
    : failureProbability({ stress: equivalentInert, shape, scale, sizeRatio: k });
  const service = life ? `over ${formatNumber(life.lifetime)} ${life.timeUnit} at ${stress(applied)}` : `at ${stress(applied)}`;
  const pfPoint: ResultLine = {
    value: pfPointValue,
    basis: `point estimate ${service}${input.proof ? ", proof-test survivors" : ""}: ${weibull}` + (screened ? "; zero: the proof test screens out every part that would fail" : ""),
  };
  // Upper bound: the dual of the lower-bound allowable. Among proof-test survivors the failure probability is at most the unscreened one.
  const pfUpperValue = model.lowerBound ? (screened ? 0 : failureProbabilityUpper(model.lowerBound, equivalentInert, k)) : null;
  const pfUpper: ResultLine | null =
    pfUpperValue === null
      ? null
      : {
          value: pfUpperValue,
          basis:
            `${formatLevel(confidence.oneSided)} one-sided upper bound ${service}: the failure probability at which the lower-bound allowable equals this stress` +
            (input.proof && !screened ? "; the proof test's screening is not credited (conservative)" : "") +
            (screened ? "; zero: the proof test screens out every part that would fail" : ""),
        };

  const lotPf = pfUpperValue ?? pfPointValue;
  const lotBasis = pfUpperValue === null ? "point estimate of the failure probability" : `${formatLevel(confidence.oneSided)} one-sided upper bound on the failure probability`;
  const expected: BoundedLine = {
    value: lotExpected(lotPf, input.lotSize),
    pointEstimate: lotExpected(pfPointValue, input.lotSize),
    basis: `lot of ${input.lotSize} parts x the ${lotBasis} ${service}`,
  };
  const upperCount: BoundedLine = {
    value: lotCount(lotPf, input.lotSize, confidence.oneSided),
    pointEstimate: lotCount(pfPointValue, input.lotSize, confidence.oneSided),
    basis:
      `count not exceeded with ${formatLevel(confidence.oneSided)} probability in a binomial lot of ${input.lotSize}, ` +
      `at the ${lotBasis}` +
      (pfUpperValue === null ? "" : " (the lot's chance and the fit's uncertainty each at that level: conservative)"),
  };

  const proof = input.proof
    ? proofCredit(input, { applied, proofStress, inertBasis, basisWord, designInert, lifetimeInB, k, shape, scale, model, pass, stress })
    : null;

  return {
    applied,
    appliedStress: { value: applied, basis: input.appliedStress === null ? "peak tensile stress of the element table" : "as given in the check" },
    specimenSize: { value: sizes.specimen.value, basis: sizes.specimen.how },
    partSize: { value: sizes.part.value, basis: sizes.part.how },
    sizeRatio: {
      value: k,
      basis:
        `part ${sizeWord} ${formatNumber(sizes.part.value)} ${sizes.unit.text} / specimen ${sizeWord} ${formatNumber(sizes.specimen.value)} ${sizes.unit.text}; ` +
        `assumes one ${input.flaws} flaw population, the same surface finish and environment in both (ASTM C1683)`,
    },
    target,
    allowablePoint: { value: inertPoint, basis: `point estimate: ${weibull}, ${model.parameters.basis}` },
    allowableLower:
      inertLower === null ? null : { value: inertLower, basis: `${confidence.boundLabel} on the same stress: ${model.boundMethod}` },
    onBound,
    pfPoint,
    pfUpper,
    expected,
    upperCount,
    lifetime,
    proof,
    governing,
    reserveFactor: governing.allowable / applied,
    pass,
    shape,
  };
}

// A failure probability that rounds to 1 fails every part of the lot.
function lotExpected(p: number, lotSize: number): number {
  return p >= 1 ? lotSize : expectedFailures({ failureProbability: p, lotSize });
}

function lotCount(p: number, lotSize: number, confidence: number): number {
  return p >= 1 ? lotSize : failuresUpperBound({ failureProbability: p, lotSize, confidence });
}

function proofCredit(
  input: CheckDescription,
  c: {
    applied: number;
    proofStress: number;
    inertBasis: number;
    basisWord: string;
    designInert: number;
    lifetimeInB: number;
    k: number;
    shape: number;
    scale: number;
    model: StrengthModel;
    pass: boolean;
    stress: (x: number) => string;
  },
): ProofCredit {
  const { applied, proofStress, inertBasis, stress, k, shape, scale } = c;
  const life = input.lifetime;
  const breaksPoint = failureProbability({ stress: proofStress, shape, scale, sizeRatio: k });
  const breaksUpper = c.model.lowerBound ? failureProbabilityUpper(c.model.lowerBound, proofStress, k) : null;
  const breaks: BoundedLine = {
    value: breaksUpper ?? breaksPoint,
    pointEstimate: breaksPoint,
    basis:
      `fraction of parts the proof test at ${stress(proofStress)} breaks: ` +
      (breaksUpper === null ? "point estimate" : `${c.basisWord.replace("lower", "upper")} (the dual of the lower-bound allowable), point estimate ${formatProbability(breaksPoint)} beside`),
  };
  const survivors = postProofFailureProbability({ stress: applied, proofStress, shape, scale, sizeRatio: k });
  const survivorsFailureProbability: ResultLine = {
    value: survivors,
    basis:
      applied <= proofStress
        ? "survivors of the proof test loaded fast (inert) to the applied stress: zero, as it is at or below the proof stress"
        : "survivors of the proof test loaded fast (inert) to the applied stress: truncated Weibull, point estimate",
  };
  let minimumLife: ResultLine | null = null;
  if (life) {
    const t = proofGuaranteedLife({ proofStress, stress: applied, n: life.n, B: life.B });
    const tInLifeUnit = convertTime(t, parseBUnit(life.bUnit)!.time, life.timeUnit);
    minimumLife = {
      value: tInLifeUnit,
      basis:
        applied < proofStress
          ? `no survivor fails sooner at the applied stress, in ${life.timeUnit}: t_min = B s^-n (s_p^(n-2) - s^(n-2)) (power-law crack growth, inert unloading)`
          : "none: the applied stress reaches the proof stress",
    };
  }

  const raises = proofStress > inertBasis;
  let text: string;
  if (applied > proofStress) {
    // Written apart, so a proof stress a hair below the applied stress never reads "200 MPa exceeds 200 MPa".
    const apart = (x: number) => `${formatNumber(x, digitsApart(applied, proofStress))} ${input.stressUnit}`;
    text =
      `Not credited: the applied stress ${apart(applied)} exceeds the proof stress ${apart(proofStress)}, so the proof test guarantees nothing at this load` +
      (raises ? "" : `; the verdict rests on the ${c.basisWord} allowable`) +
      ".";
  } else if (!raises) {
    text =
      `Not needed: the ${c.basisWord} inert allowable ${stress(inertBasis)} already exceeds the proof stress ${stress(proofStress)}; ` +
      "the proof test screens out only parts weaker than the design strength.";
  } else if (!life) {
    text =
      `Credited: every part that survives the proof test is at least as strong as the proof stress ${stress(proofStress)} (loaded and unloaded fast or inert), ` +
      `above the ${c.basisWord} inert allowable ${stress(inertBasis)}; the survivors' failure probability at the applied stress is 0, so the proof stress is the allowable.`;
  } else {
    const t = minimumLife!.value;
    text =
      `Credited: proof-test survivors are at least as strong as the proof stress ${stress(proofStress)}, above the ${c.basisWord} inert allowable ` +
      `${stress(inertBasis)}, so the lifetime allowable starts from the proof stress. ` +
      (c.pass
        ? `At the applied stress the proof test guarantees a minimum life of ${formatNumber(t)} ${life.timeUnit}, at least the required ${formatNumber(life.lifetime)} ${life.timeUnit}.`
        : `Their failure probability on fast loading to the applied stress is 0, but cracks grow under sustained load: the proof test guarantees a minimum life of ` +
          `${formatNumber(t)} ${life.timeUnit} at the applied stress, less than the required ${formatNumber(life.lifetime)} ${life.timeUnit}, so the check fails.`);
  }
  return { credited: raises && applied <= proofStress, text, breaks, survivorsFailureProbability, minimumLife };
}

function targetProbability(input: CheckDescription): ResultLine {
  const r = input.requirement;
  if (r.kind === "survival") {
    return { value: 1 - r.survival, basis: `required survival ${formatProbability(r.survival)} per part (${r.survival} as given)` };
  }
  return {
    value: r.allowedFailures / input.lotSize,
    basis: `${r.allowedFailures} expected failure(s) allowed in a lot of ${input.lotSize}`,
  };
}

function verdictText(input: CheckDescription, c: CheckNumbers, confidence: ConfidenceConvention): string {
  const unit = input.stressUnit;
  const applied = `${formatNumber(c.applied, stressDigits(c))} ${unit}`;
  const allowable = `${formatNumber(c.governing.allowable, stressDigits(c))} ${unit}`;
  const point = c.governing.check === "lifetime" ? c.lifetime!.pointEstimate : Math.max(c.allowablePoint.value, input.proof?.proofStress ?? 0);
  const proofRaised = input.proof !== null && input.proof.proofStress > (c.allowableLower ?? c.allowablePoint).value;
  const basis =
    (proofRaised
      ? `from the proof stress ${formatNumber(input.proof!.proofStress, stressDigits(c))} ${unit}, ` +
        // Above the proof stress the proof test guarantees nothing (the proof line says "Not credited"): the sentence must not say "credited".
        `${c.applied <= input.proof!.proofStress ? "credited" : "which the applied stress exceeds; it lies"} above the ${c.onBound ? confidence.boundLabel : "point estimate"}; `
      : "") +
    (c.onBound
      ? proofRaised
        ? `point estimate ${formatNumber(point)} ${unit} shown beside, not used`
        : `${confidence.boundLabel}; point estimate ${formatNumber(point)} ${unit} shown beside, not used`
      : "point estimate: no confidence bound, not a design verdict on its own");
  // The survival target and the size scaling the allowable was computed for, so the sentence quoted alone still says them.
  const r = input.requirement;
  const requirement =
    r.kind === "survival"
      ? `required survival ${formatProbability(r.survival)} per part`
      : `allowed failure probability ${formatProbability(c.target.value)} per part, for ${r.allowedFailures} expected failure(s) in a lot of ${input.lotSize}`;
  const scaling = `part / specimen ${input.flaws === "volume" ? "effective volume" : "effective area"} ${formatNumber(c.sizeRatio.value)}`;
  const numbers = `reserve factor ${formatReserveFactor(c.reserveFactor)}, margin of safety ${formatNumber(c.reserveFactor - 1, 3)}`;
  return c.pass
    ? `PASS: the applied stress ${applied} is at or below the ${c.governing.name}, ${allowable} (${basis}; ${requirement}, ${scaling}); ${numbers}.`
    : `FAIL: the applied stress ${applied} exceeds the ${c.governing.name}, ${allowable} (${basis}; ${requirement}, ${scaling}); ${numbers}.`;
}

/**
 * The applied stress and the governing allowable are written with the figures that tell them
 * apart, so a FAIL by less than the last shown figure never reads "100 MPa exceeds 100 MPa".
 */
function stressDigits(c: Pick<CheckNumbers, "applied" | "governing">): number {
  return digitsApart(c.applied, c.governing.allowable);
}

function basisLines(r: DesignCheckResult, model: StrengthModel): BasisLine[] {
  const lines: BasisLine[] = [
    { topic: "governing check", text: `${r.governing.name}: ${r.governing.basis}` },
    { topic: "method", text: `two-parameter Weibull; ${r.parameters.basis}` },
    { topic: "bound", text: r.allowableLower ? r.allowableLower.basis : `none: ${model.boundMissing ?? "no bound"}; the verdict uses the point estimate` },
    {
      topic: "confidence",
      text: r.allowableLower
        ? `${r.confidence.boundLabel} (as given: ${formatLevel(r.input.confidence.level)} ${r.input.confidence.sides}); the plot's ${r.confidence.bandLabel} pairs with it: ${r.confidence.pairing}`
        : "none (point estimate)",
    },
    { topic: "requirement", text: `allowed failure probability per part ${formatProbability(r.targetFailureProbability.value)}: ${r.targetFailureProbability.basis}` },
    { topic: "size ratio", text: `${formatNumber(r.sizeRatio.value)} = ${r.sizeRatio.basis}` },
    {
      topic: "flaw population",
      text:
        `one ${r.input.flaws} flaw population governs specimens and part, with the same surface finish, machining and environment; ` +
        `${r.input.criterion} multiaxial criterion where the stress is multiaxial`,
    },
  ];
  if (r.lifetimeAllowable) lines.push({ topic: "slow crack growth", text: r.lifetimeAllowable.basis });
  if (r.proof) lines.push({ topic: "proof test", text: r.proof.text });
  lines.push({ topic: "lot", text: `${r.failuresUpperBound.basis}` });
  if (r.censoring) lines.push({ topic: "censoring", text: r.censoring.text });
  lines.push({ topic: "result", text: `${r.verdict.pass ? "PASS" : "FAIL"}: highest applied stress that passes ${formatNumber(r.highestPassingStress.value, digitsApart(r.highestPassingStress.value, r.appliedStress.value))} ${r.input.stressUnit}; reserve factor ${formatReserveFactor(r.reserveFactor.value)}; margin of safety ${formatNumber(r.marginOfSafety.value, 3)}` });
  return lines;
}

/**
 * Compare at specimen size: the design point's hazard divided by the size
 * ratio is the specimen's, so its specimen-size failure probability sits on
 * the fitted line, and the gap to the lowest plotted failure is what the
 * straight line is trusted to bridge.
 */
function extrapolation(points: PlotPoint[], targetPf: number, sizeRatio: number): number | null {
  if (points.length === 0) return null;
  const lowest = points[0].failureProbability;
  const specimenPf = -Math.expm1(Math.log1p(-targetPf) / sizeRatio);
  return Math.log10(lowest / specimenPf);
}
