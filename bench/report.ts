/**
 * What `npm run bench` prints and records: the paired rows (ours against a fair peer, ratio and
 * agreement), the project-only rows, the fit accuracy against 40 digits, and a markdown table of
 * the ratios with the machine and date, ready to quote. The JSON record holds every figure.
 */
import { formatSeconds, type Spread } from "./measure";

/** Whether the two sides computed the same thing: the largest relative difference against a tolerance. */
export interface Agreement {
  /** null: not checked (no peer result). */
  ok: boolean | null;
  /** What was compared, e.g. "m and s_theta". */
  compared: string;
  largest?: number;
  tolerance?: number;
}

/** Compares pairs [ours, peer]; any NaN or difference above the tolerance is a disagreement. */
export function agreement(pairs: readonly (readonly [number, number])[], tolerance: number, compared: string): Agreement {
  let largest = 0;
  for (const [ours, peer] of pairs) {
    const difference = ours === peer ? 0 : Math.abs(ours - peer) / Math.max(Math.abs(ours), Math.abs(peer));
    largest = Number.isNaN(difference) || Number.isNaN(largest) ? NaN : Math.max(largest, difference);
  }
  return { ok: pairs.length > 0 && largest <= tolerance, compared: `${compared} (${pairs.length} value${pairs.length === 1 ? "" : "s"})`, largest, tolerance };
}

export function describeAgreement(a: Agreement): string {
  if (a.ok === null) return `not checked: ${a.compared}`;
  const figure = a.largest === 0 ? `${a.compared} identical` : `${a.compared} differ by at most ${a.largest?.toExponential(1)} (tolerance ${a.tolerance?.toExponential(0)})`;
  return a.ok ? `agrees: ${figure}` : `DISAGREES: ${figure}`;
}

export interface PeerFigure {
  peer: string;
  timing: Spread;
  /** Peer median / our median: above 1, the project is faster. */
  ratio: number;
  /** The ratio the speed work aims for, where one is set. */
  goal?: number;
  /** Ratios of the same round's turns: lowest, median, highest. */
  roundRatios: { lowest: number; median: number; highest: number };
  agreement: Agreement;
}

export interface PairedRow {
  id: string;
  path: string;
  ours?: Spread;
  peers: PeerFigure[];
  rounds: number;
  warmUps: number;
  /** Calls timed together in the last turn, per side (the time is per call; bench/measure.ts `lasting`). */
  callsPerTurn: Record<string, number>;
  /** What the side runs, e.g. the command line. */
  how: string;
  error?: string;
}

export interface SoloRow {
  task: string;
  ours?: Spread;
  note: string;
  error?: string;
  /** An absolute goal of the speed work (no peer): the figure, the goal, whether it is met. */
  goal?: { text: string; figure: string; met: boolean };
}

export interface AccuracyRow {
  n: number;
  /** Relative error of the modulus and characteristic strength against the 40-digit solution, per side. */
  errors: Record<string, { shape: number; scale: number }>;
  digits40?: { shape: string; scale: string; seconds: number; date: string };
}

export interface Machine {
  cpuModel: string;
  cpus: number;
  memoryGB: number;
  platform: string;
  node: string;
  /** Load average (1, 5, 15 min) when the run started and ended: other work on the machine. */
  loadAtStart: number[];
  loadAtEnd?: number[];
  peers: Record<string, string> | null;
}

export interface BenchRecord {
  date: string;
  machine: Machine;
  options: { only: string[]; quick: boolean; rounds: { short: number; long: number }; warmUps: number };
  paired: PairedRow[];
  solo: SoloRow[];
  accuracy: AccuracyRow[];
  notes: string[];
  seconds: number;
}

const timing = (t: Spread) => `${formatSeconds(t.seconds)} (${formatSeconds(t.fastest)}-${formatSeconds(t.slowest)})`;
const goalText = (p: PeerFigure) => (p.goal === undefined ? "" : `>= ${ratioText(p.goal)} ${p.ratio >= p.goal ? "met" : "not met"}`);
const ratioText = (r: number) => (r >= 100 ? r.toFixed(0) : r >= 10 ? r.toFixed(1) : r.toFixed(2));

function columns(widths: number[]) {
  return (cells: string[]) => cells.map((c, i) => (i < widths.length ? c.padEnd(widths[i]) : c)).join("  ");
}

export function textReport(record: BenchRecord): string {
  const out: string[] = [];
  const { rounds, warmUps } = record.options;
  out.push(`Side by side (medians of alternating rounds after ${warmUps} untimed warm-up round on every side: ${rounds.short} rounds, long rows ${rounds.long}; fastest-slowest in brackets;`);
  out.push("ratio = peer time / our time, above 1 means the project is faster; range = lowest-highest ratio within one round)");
  const widths = [46, 30, 22, 30, 6, 12, 16];
  const line = columns(widths);
  out.push(line(["path", "ours", "peer", "peer time", "ratio", "range", "goal", "agreement"]));
  out.push(line([...widths.map((w) => "-".repeat(w)), "---------"]));
  for (const row of record.paired) {
    if (row.error || !row.ours) {
      out.push(line([row.path, "ERROR", "", "", "", "", "", row.error ?? "no timing"]));
      continue;
    }
    if (row.peers.length === 0) out.push(line([row.path, timing(row.ours), "no peer", "", "", "", "", ""]));
    row.peers.forEach((p, i) => {
      const range = `${ratioText(p.roundRatios.lowest)}-${ratioText(p.roundRatios.highest)}`;
      out.push(line([i === 0 ? row.path : "", i === 0 ? timing(row.ours!) : "", p.peer, timing(p.timing), ratioText(p.ratio), range, goalText(p), describeAgreement(p.agreement)]));
    });
  }
  const disagreements = record.paired.flatMap((r) => r.peers.filter((p) => p.agreement.ok === false).map((p) => `${r.path} against ${p.peer}`));
  if (disagreements.length) out.push("", `!!! DISAGREEMENT on ${disagreements.length} row(s): ${disagreements.join("; ")}. A ratio means nothing until both sides compute the same result.`);

  if (record.solo.length) {
    out.push("", "The project alone (no peer; median of several runs after one warm-up, fastest-slowest in brackets)");
    const solo = columns([56, 30]);
    for (const r of record.solo) out.push(solo([r.task, r.ours ? timing(r.ours) : r.error ? "ERROR" : "-", r.error ?? r.note]));
  }
  if (record.accuracy.length) {
    out.push("", "Accuracy of the ML fit against a 40-digit mpmath solution of the likelihood equations (relative errors)");
    for (const a of record.accuracy) {
      const sides = Object.entries(a.errors).map(([side, e]) => `${side}: m ${e.shape.toExponential(1)}, s_theta ${e.scale.toExponential(1)}`);
      const reference = a.digits40 ? `m = ${a.digits40.shape.slice(0, 22)} (mpmath ${a.digits40.seconds.toFixed(1)} s, ${a.digits40.date.slice(0, 10)})` : "no 40-digit solution";
      out.push(`  n = ${a.n.toLocaleString("en-US")}: ${sides.join("; ")}; ${reference}`);
    }
  }
  out.push("", `${machineLine(record)} The run took ${record.seconds.toFixed(0)} s.`);
  for (const n of record.notes) out.push(n);
  out.push("Data: seeded and invented (modulus 10, characteristic strength 400; an invented element table).");
  return out.join("\n") + "\n";
}

function machineLine(record: BenchRecord): string {
  const m = record.machine;
  const peers = m.peers ? Object.entries(m.peers).filter(([k]) => k !== "mpmathBackend").map(([k, v]) => `${k} ${v}`).join(", ") : "no python peers";
  const load = (l?: number[]) => (l ? l.map((x) => x.toFixed(1)).join(" ") : "?");
  const { only, quick } = record.options;
  const options = [quick ? "BENCH_QUICK=1" : "", only.length ? `BENCH_ONLY=${only.join(",")}` : ""].filter(Boolean).join(", ");
  return `Machine: ${m.cpuModel}, ${m.cpus} cores, ${m.memoryGB.toFixed(0)} GB, ${m.platform}; node ${m.node}; ${peers}. Load average ${load(m.loadAtStart)} at the start, ${load(m.loadAtEnd)} at the end${options ? `; ${options}` : ""}.`;
}

/** The ratios as a markdown table to paste into the README, with the machine and the date they belong to. */
export function markdownTable(record: BenchRecord): string {
  const out: string[] = [];
  out.push(`Measured by \`npm run bench\` on ${record.date.slice(0, 10)}. ${machineLine(record)}`);
  out.push(`Ratio = peer time / brittle time in the same run (above 1: brittle is faster): medians of ${record.options.rounds.short} alternating rounds (${record.options.rounds.long} for the long rows), range = lowest-highest ratio within one round.`);
  out.push("");
  out.push("| path | peer | ratio | range | goal | same result |");
  out.push("|---|---|---|---|---|---|");
  for (const row of record.paired) {
    if (row.error || !row.ours) {
      out.push(`| ${row.path} | | not measured | | | ${row.error ?? ""} |`);
      continue;
    }
    for (const p of row.peers) {
      const same = p.agreement.ok === null ? "not checked" : !p.agreement.ok ? "**NO**" : p.agreement.largest === 0 ? "yes, identical" : `yes, to ${p.agreement.largest?.toExponential(0)}`;
      out.push(`| ${row.path} | ${p.peer} | ${ratioText(p.ratio)} | ${ratioText(p.roundRatios.lowest)}-${ratioText(p.roundRatios.highest)} | ${goalText(p)} | ${same} |`);
    }
  }
  const absolute = record.solo.filter((r) => r.goal);
  if (absolute.length) {
    out.push("", "Goals on absolute figures (no peer; median of several runs in the same bench run):", "");
    out.push("| path | figure | goal |", "|---|---|---|");
    for (const r of absolute) out.push(`| ${r.task} | ${r.goal!.figure} | ${r.goal!.text} ${r.goal!.met ? "met" : "not met"} |`);
  }
  return out.join("\n") + "\n";
}
