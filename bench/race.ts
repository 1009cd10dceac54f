/**
 * One paired row of `npm run bench`: both sides get the same data, the same warm-up and
 * alternating turns (bench/measure.ts `alternate`), then the row checks that both computed the
 * same result and sets the ratio beside its goal. The rows themselves live in
 * bench/in-process-rows.ts and bench/command-line-rows.ts.
 */
import { alternate, roundRatios, type Contender, type Outcome, type Turn } from "./measure";
import type { PythonPeers } from "./processes";
import type { Agreement, PairedRow } from "./report";

export interface BenchContext {
  /** Temporary directory for the data files; removed after the run. */
  work: string;
  /** null: python3 with numpy, scipy, pyarrow and mpmath is missing, the project runs alone. */
  peers: PythonPeers | null;
  rounds: { short: number; long: number };
  warmUps: number;
  quick: boolean;
  log: (message: string) => void;
}

/** The modulus and characteristic strength, the two figures every fit compares. */
export interface Fit {
  shape: number;
  scale: number;
}

// Same equation, same start, same stopping rule: the two sides differ only by rounding.
export const SAME_EQUATION = 1e-9;
// scipy's optimiser stops on its own tolerance, far from the root's last digits.
export const GENERIC_OPTIMISER = 1e-4;
// Sums of the same terms in another order (or with compensation on one side only).
export const SAME_SUM = 1e-12;

/**
 * The goals of the speed work as ratios (peer time / our time), by row id and peer: at least 10x
 * a numpy Newton solve at n <= 100 and 1x from 10^3 to 10^6, 1000x scipy's generic fit, 4x numpy
 * on the PIA sum, 2x pyarrow + numpy end to end, start-up at most 4x node's, the 1000-line sheet
 * at least as fast as the numpy script.
 */
const GOALS: Record<string, number> = {
  "fit-30 numpy Newton": 10,
  "fit-30 scipy weibull_min.fit": 1000,
  "fit-100 numpy Newton": 10,
  "fit-1000 numpy Newton": 1,
  "fit-1e6 numpy Newton": 1,
  "pia numpy": 4,
  "part pyarrow CSV + numpy": 2,
  "calc-start node -e 0": 0.25,
  "calc-sheet numpy script": 1,
};

export function contender<T>(name: string, turn: () => Promise<Turn<T>> | Turn<T>): Contender<T> {
  return { name, turn: async () => turn() };
}

/** Runs the contenders (ours first) and turns the outcomes into a row with a ratio and an agreement per peer. */
export async function race<T>(
  ctx: BenchContext,
  row: Omit<PairedRow, "ours" | "peers" | "rounds" | "warmUps" | "callsPerTurn">,
  rounds: number,
  contenders: Contender<T>[],
  agree: (ours: T, peer: T, peerName: string) => Agreement,
): Promise<PairedRow> {
  ctx.log(`${row.path}: ${rounds} rounds of ${contenders.map((c) => c.name).join(" / ")}`);
  const [ours, ...peers] = await alternate(contenders, rounds, ctx.warmUps);
  return {
    ...row,
    rounds,
    warmUps: ctx.warmUps,
    callsPerTurn: Object.fromEntries(contenders.map((c) => [c.name, c.calls?.() ?? 1])),
    ours: strip(ours),
    peers: peers.map((p) => ({
      peer: p.name,
      goal: GOALS[`${row.id} ${p.name}`],
      timing: strip(p),
      ratio: p.seconds / ours.seconds,
      roundRatios: roundRatios(p.times, ours.times),
      agreement: agree(ours.result, p.result, p.name),
    })),
  };
}

function strip<T>({ seconds, fastest, slowest, times }: Outcome<T>) {
  return { seconds, fastest, slowest, times };
}
