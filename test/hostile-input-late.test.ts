// Hostile CSV sheets whose trouble appears only at the end of a long file (test/fixtures/hostile/csv-late-*,
// 3000 lines of whole numbers first): the reader must still see it, exactly as it does on line 2, since a
// reader that settled the dialect on the first lines would misread them without a word. Expected readings
// are the rules of docs/files-and-formats.md (one decimal mark per file, "1,250" never guessed, every line
// as many fields as the first); the values are the file's own digits.
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { main } from "../cli/cli";

const at = (name: string) => join("test/fixtures/hostile", name);

function capture() {
  const io = { stdout: "", stderr: "", out: (t: string) => (io.stdout += t), err: (t: string) => (io.stderr += t), errIsTTY: false };
  return io;
}

describe("trouble on the last lines of a long CSV", () => {
  it("refuses a lone ambiguous 1,250 on line 3002, ambiguous marks mixed late, and a late extra field", async () => {
    const cases: [string, string][] = [
      ["csv-late-ambiguous.csv", `line 3002, field 1: "1,250" could be 1250 (thousands separator) or 1.25 (decimal comma), and no other number settles it`],
      ["csv-late-mixed-marks.csv", `mixed decimal marks: line 2 has "445.3", line 3003 has "445,3"`],
      ["csv-late-extra-field.csv", "line 3002 has 3 fields, but line 1 has 2 (delimiter: semicolon)"],
    ];
    for (const [name, message] of cases) {
      const io = capture();
      expect(await main(["calc", at(name)], io), name).toBe(1);
      expect(io.stderr, name).toContain(message);
      expect(io.stdout, name).toBe("");
    }
  });

  it("settles the decimal comma from the one decimal on line 3002 and reads it there", async () => {
    const io = capture();
    expect(await main(["calc", at("csv-late-decimal-comma.csv"), "--json"], io)).toBe(0);
    expect(io.stderr).toContain('semicolon-delimited, decimal comma (detected: "445,3" on line 3002)');
    const grid = Object.values(JSON.parse(io.stdout))[0] as unknown[][];
    expect(grid[3001]).toEqual([445.3, 2]);
    expect(typeof grid[3002][0]).toBe("number");
  });
});
