/**
 * `npm run bench`: the project against the fair peer of every path a user waits for, in one
 * run on one machine (docs/benchmark.md lists the rows, their peers and why each is fair).
 * Both sides get the same warm-up and take turns; every row checks that both computed the
 * same result; nothing here is asserted. Prints the figures, a markdown table of the ratios
 * with the machine and date, and writes a JSON record to bench/results/ (git-ignored).
 *
 * BENCH_QUICK=1     fewer rounds, no 40-digit solve at 10^6 specimens, no full-column workbook
 * BENCH_ONLY=fit,calc  only the rows whose id contains one of the words (ids: fit-30, fit-100, fit-1000,
 *                   fit-1e6, pia, part, calc-start, calc-sheet, bounds, streaming, demo, full-column)
 * BENCH_ROUNDS=N    N alternating rounds for the short rows, at most 5 for the long ones
 */
import { spawnSync } from "node:child_process";
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { cpus, loadavg, platform, tmpdir, totalmem } from "node:os";
import { join } from "node:path";
import { calcSheetRow, calcStartRow, partRow } from "./command-line-rows";
import { fitRows, piaRow } from "./in-process-rows";
import type { BenchContext } from "./race";
import { PythonPeers } from "./processes";
import { markdownTable, textReport, type AccuracyRow, type BenchRecord, type PairedRow, type SoloRow } from "./report";
import { SOLO_SECTIONS } from "./solo-rows";

const started = performance.now();
const QUICK = process.env.BENCH_QUICK === "1";
const ONLY = (process.env.BENCH_ONLY ?? "").split(",").map((w) => w.trim()).filter(Boolean);
const asked = Math.floor(Number(process.env.BENCH_ROUNDS));
const ROUNDS = asked > 0 ? { short: asked, long: Math.min(asked, 5) } : QUICK ? { short: 5, long: 2 } : { short: 15, long: 5 };
const WARM_UPS = 1;
const log = (message: string) => process.stderr.write(`bench: ${message}\n`);
const wanted = (id: string) => ONLY.length === 0 || ONLY.some((word) => id.includes(word));

const record: BenchRecord = {
  date: new Date().toISOString(),
  machine: {
    cpuModel: cpus()[0]?.model.trim() ?? "unknown",
    cpus: cpus().length,
    memoryGB: totalmem() / 2 ** 30,
    platform: `${platform()} ${process.arch}`,
    node: process.versions.node,
    loadAtStart: loadavg(),
    peers: null,
  },
  options: { only: ONLY, quick: QUICK, rounds: ROUNDS, warmUps: WARM_UPS },
  paired: [],
  solo: [],
  accuracy: [],
  notes: [],
  seconds: 0,
};

const work = mkdtempSync(join(tmpdir(), "brittle-bench-"));
const ctx: BenchContext = { work, peers: null, rounds: ROUNDS, warmUps: WARM_UPS, quick: QUICK, log };

const probe = spawnSync("python3", ["-c", "import numpy, scipy, pyarrow, mpmath"], { encoding: "utf8" });
if (probe.error || probe.status !== 0) {
  record.notes.push(`Python peers skipped: python3 with numpy, scipy, pyarrow and mpmath is not available (${probe.error?.message ?? probe.stderr.trim().split("\n").pop()}).`);
} else {
  ctx.peers = new PythonPeers(work);
  record.machine.peers = await ctx.peers.ask<Record<string, string>>({ task: "versions" });
}

// The command-line rows run the compiled command line, as users run it.
let compiled = true;
if (["part", "calc-start", "calc-sheet"].some(wanted)) {
  log("compiling the command line when a source changed (node scripts/build.mjs --cli-only --if-stale)");
  compiled = spawnSync(process.execPath, ["scripts/build.mjs", "--cli-only", "--if-stale"], { stdio: ["ignore", "inherit", "inherit"] }).status === 0;
}
const needsCompiled = () => {
  if (!compiled) throw new Error("the command line did not compile (node scripts/build.mjs --cli-only)");
};

/** Runs one row; a failure becomes an error row, and the bench goes on. */
async function paired(ids: string[], path: string, run: () => Promise<PairedRow | PairedRow[]>): Promise<void> {
  if (!ids.some(wanted)) return;
  try {
    record.paired.push(...[await run()].flat());
  } catch (error) {
    record.paired.push({ id: ids.join(","), path, peers: [], rounds: 0, warmUps: 0, callsPerTurn: {}, how: "", error: (error as Error).message.split("\n")[0] });
  }
}

const FIT_SIZES = { "fit-30": 30, "fit-100": 100, "fit-1000": 1000, "fit-1e6": 1_000_000 };
const accuracy: AccuracyRow[] = [];
await paired(Object.keys(FIT_SIZES), "ML fit", () => fitRows(ctx, accuracy, Object.entries(FIT_SIZES).filter(([id]) => wanted(id)).map(([, n]) => n)));
await paired(["pia"], "PIA sum", () => piaRow(ctx));
await paired(["part"], "brittle part", () => (needsCompiled(), partRow(ctx)));
await paired(["calc-start"], "brittle calc, one formula", () => (needsCompiled(), calcStartRow(ctx)));
await paired(["calc-sheet"], "brittle calc, strength sheet", () => (needsCompiled(), calcSheetRow(ctx)));
record.accuracy = accuracy;
if (QUICK && accuracy.length) record.notes.push("BENCH_QUICK=1: no 40-digit solve above n = 1,000 unless kept from an earlier run.");
ctx.peers?.close();

for (const [name, section] of Object.entries(SOLO_SECTIONS)) {
  if (!wanted(name)) continue;
  log(`${name} (project alone)`);
  try {
    record.solo.push(...(await section(QUICK)));
  } catch (error) {
    record.solo.push({ task: name, note: "", error: (error as Error).message.split("\n")[0] } satisfies SoloRow);
  }
}
rmSync(work, { recursive: true, force: true });

record.machine.loadAtEnd = loadavg();
record.seconds = (performance.now() - started) / 1000;
const table = markdownTable(record);
process.stdout.write(textReport(record) + "\nFor the README (ratios of this run only):\n\n" + table);

const results = join("bench", "results");
mkdirSync(results, { recursive: true });
const name = `bench-${record.date.replace(/[:.]/g, "-")}`;
writeFileSync(join(results, `${name}.json`), JSON.stringify(record, null, 2) + "\n");
writeFileSync(join(results, `${name}.md`), table);
log(`record written to ${join(results, `${name}.json`)} (ratio table: ${name}.md)`);
