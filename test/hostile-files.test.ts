// Hostile files from ordinary machines, second sweep (test/fixtures/hostile/): each case names what the
// reader did before (a wrong number, a dropped row, a verdict from misread data, an unhelpful message)
// and checks the right value or the exact refusal. Values come from the file's own text read by the
// rule stated beside them, or from Number() per ECMAScript.
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { main } from "../cli/cli";
import { firstDuplicateKey } from "../src/design/json-duplicate-keys";

const HOSTILE = "test/fixtures/hostile";
const at = (name: string) => join(HOSTILE, name);

function capture() {
  const io = { stdout: "", stderr: "", out: (t: string) => (io.stdout += t), err: (t: string) => (io.stderr += t), errIsTTY: false };
  return io;
}

describe("design-check files", () => {
  it("check-duplicate-key: a second \"survival\" line is refused with both lines (the last one won silently and turned FAIL into PASS)", async () => {
    const io = capture();
    expect(await main(["check", at("check-duplicate-key.check.json")], io)).toBe(2);
    expect(io.stdout).toBe("");
    // Lines 39 and 40 of the file hold "survival": 0.9999 and "survival": 0.9 (read off the file).
    expect(io.stderr).toBe(
      `brittle check: ${at("check-duplicate-key.check.json")}: requirement.survival: written twice (lines 39 and 40); ` +
        "a JSON reader would keep only the last one: remove the one you do not mean\n",
    );
    const lines = readFileSync(at("check-duplicate-key.check.json"), "utf8").split("\n");
    expect([lines[38].trim(), lines[39].trim()]).toEqual(['"survival": 0.9999,', '"survival": 0.9']);
  });

  it("the duplicate-key scan follows nesting, arrays and escaped quotes, and passes distinct keys", () => {
    expect(firstDuplicateKey('{"a": {"b": 1}, "c": {"b": 2}, "d": [{"x": 1}, {"x": 2}]}')).toBeNull();
    expect(firstDuplicateKey('{"k\\"": "a\\"b", "k": 1, "k\\"": 2}')).toEqual({ path: "", key: 'k"', firstLine: 1, line: 1 });
    expect(firstDuplicateKey('{"d": [1, {"x": 1,\n"x": 2}]}')).toEqual({ path: "d[1]", key: "x", firstLine: 1, line: 2 });
    // "\u0061" and "a" are the same key once decoded (ECMA-404, section 9).
    expect(firstDuplicateKey('{"a": 1, "\\u0061": 2}')).toMatchObject({ key: "a" });
  });
});
