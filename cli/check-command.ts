/**
 * `brittle check FILE.check.json [--json]`: reruns a saved design check with
 * the same core function the task pane calls, and prints the verdict with
 * its basis, every result row and the cautions.
 *
 * Exit status: 0 PASS, 1 FAIL, 2 when no verdict can be given (a bad or
 * unreadable file, a bad option, or inputs the core cannot compute), 3 for a
 * PASS on the point estimate alone (datasheet values without the number of
 * specimens: no confidence bound, so not a design verdict on its own). A
 * script can never read an error as a failed check, nor a provisional pass
 * as a pass.
 *
 * --json prints one object: {"format": "brittle-design-check-result",
 * "version": 1, "verdict": "PASS" | "FAIL", ...} (docs/check-file.md), or,
 * on bad input, {"error": {"field": ..., "message": ...}} with exit 2.
 */
import { readFile } from "node:fs/promises";
import { CheckFieldError, parseCheckFileBytes } from "../src/design/check-file";
import { resultRows } from "../src/design/check-rows";
import type { DesignCheckResult } from "../src/design/check-result";
import { runDesignCheck } from "../src/design/design-check";
import { InputError } from "../src/errors";

export const CHECK_USAGE = "brittle check FILE.check.json [--json]";

export const EXIT_PASS = 0;
export const EXIT_FAIL = 1;
export const EXIT_BAD_INPUT = 2;
/** PASS on the point estimate alone: the verdict says it is provisional, and so does the status. */
export const EXIT_PROVISIONAL_PASS = 3;

interface Io {
  out: (text: string) => void;
  err: (text: string) => void;
}

export async function runCheckCommand(args: string[], io: Io): Promise<number> {
  let file: string | undefined;
  let json = false;
  for (const a of args) {
    if (a === "--json") json = true;
    else if (a.startsWith("--")) return usage(io, `unknown option ${a}`);
    else if (file) return usage(io, `one check file at a time (got ${file} and ${a})`);
    else file = a;
  }
  if (!file) return usage(io, "check needs a FILE");

  let result: DesignCheckResult;
  try {
    const bytes = await readFile(file);
    result = runDesignCheck(parseCheckFileBytes(new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength)));
  } catch (error) {
    const field = error instanceof CheckFieldError ? error.field : "";
    const known = error instanceof InputError || isFileError(error);
    const message = error instanceof Error ? error.message : String(error);
    const text = known ? message : `unexpected error: ${message}`;
    if (json) io.out(JSON.stringify({ error: { file, field, message: text } }) + "\n");
    io.err(`brittle check: ${file}: ${text}\n`);
    return EXIT_BAD_INPUT;
  }
  io.out(json ? JSON.stringify(checkJson(result)) + "\n" : checkText(result));
  return exitStatus(result);
}

/** A FAIL on the point estimate is a FAIL (the bound would only be lower); a PASS needs the bound to count as one. */
export function exitStatus(result: DesignCheckResult): number {
  if (!result.verdict.pass) return EXIT_FAIL;
  return result.verdict.onLowerBound ? EXIT_PASS : EXIT_PROVISIONAL_PASS;
}

function usage(io: Io, message: string): number {
  io.err(`brittle check: ${message}\nusage: ${CHECK_USAGE}\n`);
  return EXIT_BAD_INPUT;
}

function isFileError(error: unknown): boolean {
  return typeof error === "object" && error !== null && typeof (error as { code?: unknown }).code === "string";
}

/** The result as JSON: the verdict and its basis first, then every row, the cautions and the inputs. */
export function checkJson(r: DesignCheckResult): object {
  return {
    format: "brittle-design-check-result",
    version: 1,
    title: r.input.title ?? null,
    verdict: r.verdict.pass ? "PASS" : "FAIL",
    pass: r.verdict.pass,
    onLowerBound: r.verdict.onLowerBound,
    text: r.verdict.text,
    governing: r.governing,
    highestPassingStress: r.highestPassingStress.value,
    reserveFactor: r.reserveFactor.value,
    marginOfSafety: r.marginOfSafety.value,
    stressUnit: r.input.stressUnit,
    confidence: r.confidence,
    proof: r.proof,
    censoring: r.censoring,
    basis: r.basis,
    results: resultRows(r).map(({ id, label, value, display, basis }) => ({ id, label, value, display, basis })),
    cautions: r.cautions,
    input: r.input,
  };
}

/** The result as text for a terminal or a review record. */
export function checkText(r: DesignCheckResult): string {
  const lines: string[] = [];
  lines.push(`Design check${r.input.title ? `: ${r.input.title}` : ""}`, "", r.verdict.text, "");
  lines.push("Basis");
  for (const b of r.basis) lines.push(`  ${b.topic}: ${b.text}`);
  lines.push("", "Results");
  for (const row of resultRows(r)) lines.push(`  ${row.label}: ${row.display}`, `      ${row.basis}`);
  lines.push("", "Cautions");
  const ordered = [...r.cautions.filter((c) => c.level === "warning"), ...r.cautions.filter((c) => c.level === "note")];
  for (const c of ordered) lines.push(`  ${c.level === "warning" ? "Warning" : "Note"}: ${c.text}`);
  return lines.join("\n") + "\n";
}
