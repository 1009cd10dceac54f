// The Quick start's first command: the invented datasheet evaluates with no
// spreadsheet application, every formula gives a value, and the filled copy
// keeps its formulas (a smoke test of the main job; the values themselves are
// checked against outside references in the other suites).
import { existsSync } from "node:fs";
import ExcelJS from "exceljs";
import { describe, expect, it } from "vitest";
import { main } from "../cli/cli";
import { DEMO_OUTPUT, runDemo } from "../examples/demo";

describe("npm run demo", () => {
  it("fills the invented supplier datasheet with no errors and writes formulas with values", async () => {
    let out = "";
    await runDemo({ out: (t) => (out += t), err: () => {} });
    expect(out).toMatch(/INVENTED/);
    expect(out).toMatch(/14 formulas evaluated, 0 errors/);
    expect(out).toMatch(/licensed engineer/);
    expect(existsSync(DEMO_OUTPUT)).toBe(true);
    const book = new ExcelJS.Workbook();
    await book.xlsx.readFile(DEMO_OUTPUT);
    const ws = book.getWorksheet("Datasheet")!;
    expect(ws.getCell("E13").formula).toBe("BRITTLE.MODULUS(A5:A34)");
    expect(typeof ws.getCell("E13").result).toBe("number");
    // The FIT table is written as an array formula over the cells it fills.
    expect(ws.getCell("H5").formula).toBe("BRITTLE.FIT(A5:A34)");
    expect(ws.getCell("H6").value).toBe("failures (population fitted)"); // cached value inside the array formula
    expect(ws.getCell("I25").value).toBe(true); // "converged", the last of the 21 rows

    // The filled copy evaluates again to the same grid: cached array results do not block the spill.
    let again = "";
    expect(await main(["calc", DEMO_OUTPUT, "--json"], { out: (t) => (again += t), err: () => {} })).toBe(0);
    const grid = JSON.parse(again).Datasheet;
    expect(grid[5][7]).toBe("failures (population fitted)");
    expect(grid[12][4]).toBe(ws.getCell("E13").result);
  });
});
