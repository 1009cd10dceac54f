/**
 * "How many specimens?": a planning panel beside the design check. It gathers
 * an expected modulus, the survival target, the part-to-specimen size ratio,
 * the confidence and the wanted ratio of the lower bound to the estimate,
 * asks the core (src/design/specimens-needed.ts) for the number of specimens,
 * and presents it with a short table. No verdict logic here: the numbers and
 * their meaning come from the core.
 */
import { boundRatio, specimensNeeded } from "../../src/design/specimens-needed";
import { InputError } from "../../src/errors";
import { byId, el, FieldError, readNumberField, requiredNumber, showStepError } from "../app/dom";

export const PLANNING_FIELDS = ["plan-target", "plan-modulus", "plan-survival", "plan-size-ratio", "plan-confidence"];

export interface PlanningRequest {
  targetRatio: number;
  shape: number;
  survival: number;
  sizeRatio: number;
  confidence: number;
}

export interface PlanningAnswer {
  /** One sentence: the number of specimens, or why none suffices. */
  headline: string;
  /** Planned ratio at a few sample sizes, for the table. */
  rows: { specimens: number; ratio: number }[];
  notes: string[];
}

const TABLE_SIZES = [5, 10, 15, 20, 30, 50, 100];

/** The answer for one request (pure: no page access, so it is tested without a browser). */
export function planningAnswer(request: PlanningRequest): PlanningAnswer {
  const { targetRatio, ...common } = request;
  const needed = specimensNeeded({ ...common, targetRatio });
  const pct = (x: number) => `${(100 * x).toFixed(1)} %`;
  const headline =
    needed.specimens === null
      ? `Even 10000 specimens give a lower bound of only ${pct(needed.ratio)} of the estimate: lower the target, the confidence or the survival.`
      : `${needed.specimens} specimens: the ${pct(request.confidence)} lower bound on the design stress is then ${pct(needed.ratio)} of its estimate.`;
  const sizes = needed.specimens !== null && !TABLE_SIZES.includes(needed.specimens) ? [...TABLE_SIZES, needed.specimens].sort((a, b) => a - b) : TABLE_SIZES;
  return {
    headline,
    rows: sizes.map((n) => ({ specimens: n, ratio: boundRatio({ ...common, specimens: n }) })),
    notes: [
      "Planned for a complete sample (every specimen fails from the flaw population of interest) and for a fitted modulus equal to the one assumed; a lower fitted modulus gives a lower bound.",
      "Fractography (ASTM C1322) and the governing code decide whether the tested flaw population is the part's; this plan supports, and does not replace, a licensed engineer's judgement.",
    ],
  };
}

function readRequest(): PlanningRequest {
  const targetRatio = requiredNumber("plan-target", "wanted ratio of bound to estimate", { probability: true });
  const shape = requiredNumber("plan-modulus", "expected Weibull modulus", { positive: true });
  const survival = requiredNumber("plan-survival", "required survival probability", { probability: true });
  const sizeRatio = readNumberField("plan-size-ratio", "size ratio", { positive: true, optional: true }) ?? 1;
  const confidence = requiredNumber("plan-confidence", "confidence", { probability: true });
  return { targetRatio, shape, survival, sizeRatio, confidence };
}

function render(answer: PlanningAnswer | null, message: string): void {
  byId("plan-answer").textContent = answer ? answer.headline : message;
  const body = byId("plan-table-body");
  body.replaceChildren(
    ...(answer?.rows ?? []).map((r) =>
      el("tr", {}, [el("td", { text: String(r.specimens) }), el("td", { text: `${(100 * r.ratio).toFixed(1)} %` })]),
    ),
  );
  byId("plan-table").hidden = !answer;
  byId("plan-notes").replaceChildren(...(answer?.notes ?? []).map((n) => el("li", { text: n })));
}

function update(): void {
  try {
    const answer = planningAnswer(readRequest());
    showStepError("plan-error", null, PLANNING_FIELDS);
    render(answer, "");
  } catch (error) {
    if (error instanceof FieldError) {
      showStepError("plan-error", error, PLANNING_FIELDS);
    } else if (error instanceof InputError) {
      showStepError("plan-error", { message: error.message }, PLANNING_FIELDS);
    } else {
      throw error;
    }
    render(null, "Complete the fields to see the number of specimens.");
  }
}

/** Wires the panel's fields; call once when the page loads. */
export function setupPlanning(): void {
  for (const id of PLANNING_FIELDS) byId(id).addEventListener("input", update);
  update();
}
