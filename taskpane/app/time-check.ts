/**
 * The optional time-dependent part of the check (slow crack growth and proof
 * testing), from the core's relations in src/design: the allowable constant
 * stress over the lifetime, the fraction the proof test breaks, the failure
 * probability of survivors at the applied stress, and the minimum life the
 * proof test guarantees.
 */
import { lifeDesignStress } from "../../src/design/lifetime-design";
import { postProofFailureProbability, proofBreakFraction, proofMinimumLife } from "../../src/design/proof-test";
import type { DesignCheckInput } from "./inputs";

export interface Line {
  value: number;
  basis: string;
}

export interface TimeCheck {
  /** Allowable constant stress over the lifetime (point estimate of the Weibull parameters). */
  lifetimeAllowable: Line | null;
  proofBreaks: Line | null;
  postProofFailureProbability: Line | null;
  proofMinimumLife: Line | null;
  /** Why no minimum life is guaranteed, when a proof test and a lifetime were given. */
  proofMinimumLifeMissing?: string;
  /** True when the proof test's guaranteed life covers the required life. */
  proofCoversLifetime: boolean;
}

export function timeCheck(
  input: DesignCheckInput,
  fit: { shape: number; scale: number },
  sizeRatio: number,
  survival: number,
  appliedStress: number,
): TimeCheck {
  const { shape, scale } = fit;
  const out: TimeCheck = {
    lifetimeAllowable: null,
    proofBreaks: null,
    postProofFailureProbability: null,
    proofMinimumLife: null,
    proofCoversLifetime: false,
  };
  const life = input.lifetime;
  const unit = input.stressUnit;
  if (life) {
    const result = lifeDesignStress({ survival, lifetime: life.lifetime, shape, scale, sizeRatio, n: life.n, B: life.B });
    if (!result.converged) throw new Error("the lifetime allowable stress did not converge");
    out.lifetimeAllowable = {
      value: result.stress,
      basis:
        `strength-probability-time: inert design strength ${fmt(result.inertStrength)} ${unit} carried over ` +
        `${fmt(life.lifetime)} ${life.timeUnit} of constant stress by power-law crack growth, n = ${fmt(life.n)}, ` +
        `B = ${fmt(life.B)} (point estimate of the Weibull parameters)`,
    };
  }
  const proof = input.proof;
  if (proof) {
    out.proofBreaks = {
      value: proofBreakFraction({ proofStress: proof.proofStress, shape, scale, sizeRatio }),
      basis: `fraction of parts broken by the proof test at ${fmt(proof.proofStress)} ${unit} (point estimate)`,
    };
    out.postProofFailureProbability = {
      value: postProofFailureProbability({ stress: appliedStress, proofStress: proof.proofStress, shape, scale, sizeRatio }),
      basis: "survivors of the proof test, at the applied stress, loaded fast or inert (truncated Weibull; zero at or below the proof stress)",
    };
    if (life) {
      if (appliedStress <= proof.proofStress) {
        const t = proofMinimumLife({ proofStress: proof.proofStress, serviceStress: appliedStress, n: life.n, B: life.B });
        out.proofMinimumLife = {
          value: t,
          basis: `no survivor fails sooner at the applied stress, in ${life.timeUnit} (power-law crack growth, inert unloading)`,
        };
        out.proofCoversLifetime = t >= life.lifetime;
      } else {
        out.proofMinimumLifeMissing = "the applied stress exceeds the proof stress: the proof test guarantees no life";
      }
    }
  }
  return out;
}

function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}
