/**
 * How many specimens the simulation-based results accept. They refit the
 * sample thousands of times, so their cost grows with its size: at 1000
 * specimens a first recalculation takes about a second, at a full column
 * (a million rows) it would hold a spreadsheet for hours. Closed-form and
 * tabulated results (MLE-RAW, complete-sample bounds) have no such limit.
 */
import { ensure } from "../errors";

export const SIMULATION_MAX_SPECIMENS = 1000;

export function requireSimulationSize(specimens: number, what: string): void {
  ensure(
    specimens <= SIMULATION_MAX_SPECIMENS,
    () => `${what} is simulated and accepts at most ${SIMULATION_MAX_SPECIMENS} specimens (got ${specimens}); use "MLE-RAW" or a smaller sample`,
  );
}
