/**
 * The result as labelled rows, the one list the form, the CSV export and the
 * printable page all show, so they can never disagree. Each row carries the
 * number, how it reads, and the method and assumptions behind it.
 */
import type { DesignCheckResult } from "./check";
import { formatPercent, formatProbability, sig } from "./format";

export interface ResultRow {
  id: string;
  label: string;
  /** Null where the build or the inputs cannot give the number. */
  value: number | null;
  display: string;
  basis: string;
}

export function resultRows(r: DesignCheckResult): ResultRow[] {
  const u = r.input.stressUnit;
  const stress = (x: number) => `${sig(x)} ${u}`;
  const p = r.parameters;
  const conf = formatPercent(r.input.confidence);
  return [
    { id: "modulus", label: "Weibull modulus m", value: p.shape, display: sig(p.shape), basis: p.basis },
    {
      id: "char-strength",
      label: "Characteristic strength (specimen size)",
      value: p.scale,
      display: stress(p.scale),
      basis: "stress at which 63.2 % of specimens fail" + (r.input.material.kind === "data" ? "; maximum-likelihood value unless least squares was chosen" : ""),
    },
    { id: "mean-strength", label: "Mean strength (specimen size)", value: p.mean, display: stress(p.mean), basis: "characteristic strength x Gamma(1 + 1/m)" },
    { id: "specimen-size", label: `Specimen effective ${r.input.flaws === "volume" ? "volume" : "area"}`, value: r.specimenSize.value, display: `${sig(r.specimenSize.value)} ${r.input.sizeUnit}`, basis: r.specimenSize.basis },
    { id: "part-size", label: `Part effective ${r.input.flaws === "volume" ? "volume" : "area"}`, value: r.partSize.value, display: `${sig(r.partSize.value)} ${r.input.sizeUnit}`, basis: r.partSize.basis },
    { id: "size-ratio", label: "Size ratio, part / specimen", value: r.sizeRatio.value, display: sig(r.sizeRatio.value), basis: r.sizeRatio.basis },
    {
      id: "target-pf",
      label: "Allowed failure probability per part",
      value: r.targetFailureProbability.value,
      display: formatProbability(r.targetFailureProbability.value),
      basis: r.targetFailureProbability.basis,
    },
    { id: "allowable-point", label: "Allowable stress, point estimate", value: r.allowablePoint.value, display: stress(r.allowablePoint.value), basis: r.allowablePoint.basis },
    r.allowableLower
      ? { id: "allowable-lower", label: `Allowable stress, ${conf} lower bound`, value: r.allowableLower.value, display: stress(r.allowableLower.value), basis: r.allowableLower.basis }
      : { id: "allowable-lower", label: `Allowable stress, ${conf} lower bound`, value: null, display: "not available", basis: r.allowableLowerMissing ?? "" },
    { id: "applied", label: "Applied peak stress", value: r.appliedStress.value, display: stress(r.appliedStress.value), basis: r.appliedStress.basis },
    {
      id: "pf-applied",
      label: "Failure probability at the applied stress",
      value: r.failureProbabilityAtApplied.value,
      display: formatProbability(r.failureProbabilityAtApplied.value),
      basis: r.failureProbabilityAtApplied.basis,
    },
    { id: "expected-failures", label: "Expected failures per lot", value: r.expectedFailures.value, display: sig(r.expectedFailures.value, 3), basis: r.expectedFailures.basis },
    {
      id: "failures-bound",
      label: `Failures per lot, ${conf} upper count`,
      value: r.failuresUpperBound.value,
      display: String(r.failuresUpperBound.value),
      basis: r.failuresUpperBound.basis,
    },
    ...timeRows(r, stress),
    { id: "margin", label: "Margin (allowable / applied)", value: r.margin.value, display: sig(r.margin.value, 3), basis: r.margin.basis },
  ];
}

function timeRows(r: DesignCheckResult, stress: (x: number) => string): ResultRow[] {
  const t = r.time;
  const rows: ResultRow[] = [];
  const life = r.input.lifetime;
  if (t.lifetimeAllowable && life) {
    rows.push({
      id: "lifetime-allowable",
      label: `Allowable constant stress over ${sig(life.lifetime)} ${life.timeUnit}`,
      value: t.lifetimeAllowable.value,
      display: stress(t.lifetimeAllowable.value),
      basis: t.lifetimeAllowable.basis,
    });
  }
  if (t.proofBreaks) {
    rows.push({ id: "proof-breaks", label: "Parts broken by the proof test", value: t.proofBreaks.value, display: formatProbability(t.proofBreaks.value), basis: t.proofBreaks.basis });
  }
  if (t.postProofFailureProbability) {
    rows.push({
      id: "post-proof-pf",
      label: "Failure probability of proof-test survivors at the applied stress",
      value: t.postProofFailureProbability.value,
      display: formatProbability(t.postProofFailureProbability.value),
      basis: t.postProofFailureProbability.basis,
    });
  }
  if (r.input.proof && life) {
    rows.push(
      t.proofMinimumLife
        ? { id: "proof-min-life", label: "Minimum life guaranteed by the proof test", value: t.proofMinimumLife.value, display: `${sig(t.proofMinimumLife.value)} ${life.timeUnit}`, basis: t.proofMinimumLife.basis }
        : { id: "proof-min-life", label: "Minimum life guaranteed by the proof test", value: null, display: "none", basis: t.proofMinimumLifeMissing ?? "" },
    );
  }
  return rows;
}
