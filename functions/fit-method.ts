/**
 * The method keywords users type in fitting functions, mapped to the core's
 * estimation method and plotting-position estimator. One list, so MODULUS,
 * CHARSTRENGTH, FIT and ORIGINFIT accept exactly the same words.
 */
import type { EstimationMethod } from "../src/weibull/estimate";
import type { PlottingEstimator } from "../src/weibull/plotting-positions";
import { readChoice } from "./cells";

export const METHOD_NAMES = ["MLE", "MLE-RAW", "LSQ", "LSQ-MEANRANK", "LSQ-MEDIANRANK"] as const;
export type MethodName = (typeof METHOD_NAMES)[number];

const METHODS: Record<MethodName, [EstimationMethod, PlottingEstimator]> = {
  MLE: ["MLE", "HAZEN"],
  "MLE-RAW": ["MLE-RAW", "HAZEN"],
  LSQ: ["LSQ", "HAZEN"],
  "LSQ-MEANRANK": ["LSQ", "MEAN"],
  "LSQ-MEDIANRANK": ["LSQ", "MEDIAN"],
};

export function readMethod(value: unknown): { name: MethodName; method: EstimationMethod; estimator: PlottingEstimator } {
  const name = readChoice(value, "method", METHOD_NAMES, "MLE");
  const [method, estimator] = METHODS[name];
  return { name, method, estimator };
}

const ESTIMATOR_NAMES = ["HAZEN", "MEANRANK", "MEDIANRANK"] as const;
const ESTIMATORS: Record<(typeof ESTIMATOR_NAMES)[number], PlottingEstimator> = {
  HAZEN: "HAZEN",
  MEANRANK: "MEAN",
  MEDIANRANK: "MEDIAN",
};

/** Plotting-position keywords: "HAZEN" (i-0.5)/N, "MEANRANK" i/(N+1), "MEDIANRANK" (i-0.3)/(N+0.4). */
export function readEstimator(value: unknown): PlottingEstimator {
  return ESTIMATORS[readChoice(value, "estimator", ESTIMATOR_NAMES, "HAZEN")];
}
