/**
 * "One material across specimen geometries?": a panel beside the design
 * check. Strengths are pasted with the configuration each specimen was tested
 * in (a preset such as C1161-B-4PT, or dimensions such as BAR 40/20 4x3); the
 * core fits one modulus and material scale to all of them
 * (src/design/material-fit.ts), simulates the two checks, and words the
 * result (material-fit-caution.ts). A failed size-effect check is shown as a
 * caution: the specimens may not share one flaw population, or the size
 * scaling the design check relies on is not to be trusted for the part. This
 * file only gathers, asks and presents: the answer is computed by
 * src/design/material-fit-answer.ts, off the page thread
 * (functions/material-fit-run.ts), while the panel shows a busy line and the
 * Run button becomes Cancel.
 */
import { type MaterialFitRequest } from "../../src/design/material-fit-answer";
import { MATERIAL_FIT_BUSY, MaterialFitRuns } from "../../functions/material-fit-run";
import { CANCELED } from "../../functions/sliced-run";
import { byId, el } from "../app/dom";
import { InputError } from "../../src/errors";
import { quoteText, readTypedNumber, trimInvisible } from "../../src/input/number-text";

// The pure answer lives in the core; re-exported for the panel's tests.
export { materialFitAnswer, type MaterialFitAnswer, type MaterialFitRequest } from "../../src/design/material-fit-answer";

const runs = new MaterialFitRuns();
const RUN_LABEL = "Fit one material";

/** Empties the answer; `status` (busy, canceled) goes where the headline goes. */
function clear(status = ""): void {
  byId("mfit-answer").textContent = status;
  byId("mfit-checks").textContent = "";
  byId("mfit-rows").replaceChildren();
  byId("mfit-error").textContent = "";
}

function showRunning(running: boolean): void {
  const button = byId<HTMLButtonElement>("mfit-run");
  button.textContent = running ? "Cancel" : RUN_LABEL;
  byId("step-material-fit").setAttribute("aria-busy", String(running));
}

function request(): MaterialFitRequest {
  // A decimal point or comma, whichever the value shows; anything else is refused with the reason (it became NaN).
  const poissonText = trimInvisible(byId<HTMLInputElement>("mfit-poisson").value);
  const poisson = poissonText === "" ? null : readTypedNumber(poissonText, { decimalMark: "either" });
  if (poisson && !poisson.ok) throw new InputError("input", `Poisson's ratio ${quoteText(poissonText)} ${poisson.reason}`);
  return {
    text: byId<HTMLTextAreaElement>("mfit-text").value,
    flaws: byId<HTMLSelectElement>("mfit-flaws").value === "surface" ? "surface" : "volume",
    poisson: poisson?.ok ? poisson.value : undefined,
    decimalComma: byId<HTMLInputElement>("decimal-comma").checked,
  };
}

/** The Run button: starts a fit, or cancels the one under way (the button reads "Cancel" meanwhile). */
async function runOrCancel(): Promise<void> {
  if (runs.running) {
    runs.cancel();
    showRunning(false);
    clear("Canceled; nothing was fitted.");
    return;
  }
  let asked: MaterialFitRequest;
  try {
    asked = request();
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    clear();
    byId("mfit-error").textContent = `${error.message}.`;
    return;
  }
  if (asked.text.trim() === "") {
    clear();
    return;
  }
  clear(MATERIAL_FIT_BUSY);
  showRunning(true);
  const outcome = await runs.run(asked);
  if (outcome === CANCELED) return; // canceled or superseded: whoever did that owns the panel now
  showRunning(false);
  if ("error" in outcome) {
    clear();
    byId("mfit-error").textContent = outcome.error.charAt(0).toUpperCase() + outcome.error.slice(1) + ".";
    return;
  }
  const { answer } = outcome;
  byId("mfit-answer").textContent = answer.headline;
  byId("mfit-rows").replaceChildren(...answer.rows.map((r) => el("tr", {}, [el("th", { text: r.label, attrs: { scope: "row" } }), el("td", { text: r.value })])));
  const checks = byId("mfit-checks");
  checks.textContent = answer.checks;
  checks.className = answer.caution ? "caution warning" : "help";
}

/** An edit while a fit runs makes its answer stale: the run is dropped, and the user runs again. */
function dropStaleRun(): void {
  if (!runs.running) return;
  runs.cancel();
  showRunning(false);
  clear("The input changed; run the fit again.");
}

/** Wires the panel; the fit runs when the user asks (it simulates for a second or so, off the page thread). */
export function setupMaterialFitPanel(): void {
  byId("mfit-run").addEventListener("click", () => void runOrCancel());
  for (const id of ["mfit-text", "mfit-flaws", "mfit-poisson", "decimal-comma"]) {
    byId(id).addEventListener(id === "mfit-text" || id === "mfit-poisson" ? "input" : "change", dropStaleRun);
  }
}
