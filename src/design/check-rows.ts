/**
 * The result as labelled rows: the one list the pane, the CSV export, the
 * printable page and `brittle check` all show, so they can never disagree.
 * Each row carries the number, how it reads, and the method and assumptions
 * behind it. Every confidence named carries its sidedness; every
 * probability reads without rounding to 0 % or 100 % (probability-text.ts).
 */
import type { DesignCheckResult } from "./check-result";
import { digitsApart, formatNumber, formatProbability, formatProbabilityApart, formatReserveFactor, oneIn } from "./probability-text";

export interface ResultRow {
  id: string;
  label: string;
  /** Null where the inputs cannot give the number. */
  value: number | null;
  display: string;
  basis: string;
}

/**
 * A probability with "1 in N" beside it when small; with `allowed` (the allowed failure
 * probability) written apart from it, as a failure probability in service must be.
 */
export function probabilityDisplay(p: number, allowed?: number): string {
  const n = oneIn(p);
  const text = allowed === undefined ? formatProbability(p) : formatProbabilityApart(p, allowed);
  return n ? `${text} (${n})` : text;
}

/**
 * Relative difference within which a failure probability in service and the allowed one are the
 * same number: the allowable stress and the bound's failure probability come from separate
 * solves, each to about 1e-12 in stress, which the modulus (up to about 100) magnifies in
 * probability. Closer than this, more figures would show solver noise, possibly in the opposite
 * direction to the verdict, which the stresses decide.
 */
const SAME_PROBABILITY = 1e-9;

/** A failure probability in service beside the allowed one: written apart, or said to be equal to it. */
function serviceProbability(p: number, allowed: number): string {
  if (p !== allowed && Math.abs(p - allowed) <= SAME_PROBABILITY * allowed) {
    return `${probabilityDisplay(p)}, equal to the allowed failure probability to within the solvers' accuracy (the stresses decide the verdict)`;
  }
  return probabilityDisplay(p, allowed);
}

/** @example resultRows(runDesignCheck(description)).find((row) => row.id === "reserve-factor") */
export function resultRows(r: DesignCheckResult): ResultRow[] {
  const u = r.input.stressUnit;
  const stress = (x: number, digits?: number) => `${formatNumber(x, digits)} ${u}`;
  // The applied stress and the highest that passes, written apart when they differ (design-check.ts).
  const apart = digitsApart(r.appliedStress.value, r.highestPassingStress.value);
  const p = r.parameters;
  const bound = r.confidence.boundLabel;
  const upper = bound.replace("lower", "upper");
  const word = r.input.flaws === "volume" ? "volume" : "area";
  const sizeUnit = sizeUnitText(r);
  const rows: ResultRow[] = [
    { id: "modulus", label: "Weibull modulus m", value: p.shape, display: formatNumber(p.shape), basis: p.basis },
    {
      id: "char-strength",
      label: "Characteristic strength (specimen size)",
      value: p.scale,
      display: stress(p.scale),
      basis: "stress at which 63.2 % of specimens fail" + (r.input.material.kind === "data" ? "; maximum-likelihood value unless least squares was chosen" : ""),
    },
    { id: "mean-strength", label: "Mean strength (specimen size)", value: p.mean, display: stress(p.mean), basis: "characteristic strength x Gamma(1 + 1/m)" },
    { id: "specimen-size", label: `Specimen effective ${word}`, value: r.specimenSize.value, display: `${formatNumber(r.specimenSize.value)} ${sizeUnit}`, basis: r.specimenSize.basis },
    { id: "part-size", label: `Part effective ${word}`, value: r.partSize.value, display: `${formatNumber(r.partSize.value)} ${sizeUnit}`, basis: r.partSize.basis },
    { id: "size-ratio", label: "Size ratio, part / specimen", value: r.sizeRatio.value, display: formatNumber(r.sizeRatio.value), basis: r.sizeRatio.basis },
    {
      id: "target-pf",
      label: "Allowed failure probability per part",
      value: r.targetFailureProbability.value,
      display: probabilityDisplay(r.targetFailureProbability.value),
      basis: r.targetFailureProbability.basis,
    },
    { id: "allowable-point", label: "Inert allowable stress, point estimate", value: r.allowablePoint.value, display: stress(r.allowablePoint.value), basis: r.allowablePoint.basis },
    r.allowableLower
      ? { id: "allowable-lower", label: `Inert allowable stress, ${bound}`, value: r.allowableLower.value, display: stress(r.allowableLower.value), basis: r.allowableLower.basis }
      : { id: "allowable-lower", label: "Inert allowable stress, lower bound", value: null, display: "not available", basis: r.allowableLowerMissing ?? "" },
  ];
  if (r.lifetimeAllowable && r.input.lifetime) {
    const life = r.input.lifetime;
    rows.push({
      id: "lifetime-allowable",
      label: `Allowable constant stress over ${formatNumber(life.lifetime)} ${life.timeUnit}, ${r.allowableLower ? bound : "point estimate"}`,
      value: r.lifetimeAllowable.value,
      display: stress(r.lifetimeAllowable.value),
      basis: r.lifetimeAllowable.basis,
    });
    if (r.allowableLower) {
      rows.push({
        id: "lifetime-allowable-point",
        label: `Allowable constant stress over ${formatNumber(life.lifetime)} ${life.timeUnit}, point estimate (not used)`,
        value: r.lifetimeAllowable.pointEstimate,
        display: stress(r.lifetimeAllowable.pointEstimate),
        basis: "the same relation from the point estimate of the inert strength, shown beside the bound",
      });
    }
  }
  if (r.proof) {
    rows.push({
      id: "proof-breaks",
      label: `Parts broken by the proof test, ${r.allowableLower ? upper : "point estimate"}`,
      value: r.proof.breaks.value,
      display: probabilityDisplay(r.proof.breaks.value),
      basis: r.proof.breaks.basis,
    });
    rows.push({
      id: "post-proof-pf",
      label: "Failure probability of proof-test survivors at the applied stress (fast loading)",
      value: r.proof.survivorsFailureProbability.value,
      display: probabilityDisplay(r.proof.survivorsFailureProbability.value),
      basis: r.proof.survivorsFailureProbability.basis,
    });
    if (r.input.lifetime) {
      const m = r.proof.minimumLife;
      rows.push(
        m && m.value > 0
          ? { id: "proof-min-life", label: "Minimum life guaranteed by the proof test", value: m.value, display: `${formatNumber(m.value)} ${r.input.lifetime.timeUnit}`, basis: m.basis }
          : { id: "proof-min-life", label: "Minimum life guaranteed by the proof test", value: null, display: "none", basis: m?.basis ?? "" },
      );
    }
    rows.push({ id: "proof-credit", label: "Proof-test credit", value: null, display: r.proof.credited ? "credited" : "not credited", basis: r.proof.text });
  }
  rows.push({ id: "applied", label: "Applied peak stress", value: r.appliedStress.value, display: stress(r.appliedStress.value, apart), basis: r.appliedStress.basis });
  rows.push({
    id: "pf-applied",
    label: "Failure probability in service, point estimate",
    value: r.failureProbabilityAtApplied.value,
    display: serviceProbability(r.failureProbabilityAtApplied.value, r.targetFailureProbability.value),
    basis: r.failureProbabilityAtApplied.basis,
  });
  if (r.failureProbabilityUpper) {
    rows.push({
      id: "pf-upper",
      label: `Failure probability in service, ${upper}`,
      value: r.failureProbabilityUpper.value,
      display: serviceProbability(r.failureProbabilityUpper.value, r.targetFailureProbability.value),
      basis: r.failureProbabilityUpper.basis,
    });
  }
  const lotWord = r.failureProbabilityUpper ? `on the ${upper}` : "point estimate";
  rows.push(
    { id: "expected-failures", label: `Expected failures per lot, ${lotWord}`, value: r.expectedFailures.value, display: formatNumber(r.expectedFailures.value, 3), basis: r.expectedFailures.basis },
    { id: "failures-bound", label: `Failures per lot not exceeded with ${bound.split(" one-sided")[0]} probability, ${lotWord}`, value: r.failuresUpperBound.value, display: String(r.failuresUpperBound.value), basis: r.failuresUpperBound.basis },
    { id: "governing", label: "Governing check", value: null, display: r.governing.name, basis: r.governing.basis },
    { id: "highest-passing", label: "Highest applied stress that passes", value: r.highestPassingStress.value, display: stress(r.highestPassingStress.value, apart), basis: r.highestPassingStress.basis },
    { id: "reserve-factor", label: "Reserve factor (allowable / applied)", value: r.reserveFactor.value, display: formatReserveFactor(r.reserveFactor.value), basis: r.reserveFactor.basis },
    { id: "margin-of-safety", label: "Margin of safety (reserve factor - 1)", value: r.marginOfSafety.value, display: formatNumber(r.marginOfSafety.value, 3), basis: r.marginOfSafety.basis },
  );
  return rows;
}

/** The size unit as the result shows it, "mm^3" written "mm³". */
export function sizeUnitText(r: DesignCheckResult): string {
  return r.input.sizeUnit.replace(/\s*\^\s*3|3$/, "³").replace(/\s*\^\s*2|2$/, "²");
}
