/**
 * Reading strengths and element tables from the selected range through the
 * spreadsheet API (office-addin-mock): the header row is skipped, the
 * addresses the report sheet will refer to are the data's own, and the text
 * put in the form goes through the same parsers as pasted text. The expected
 * addresses are written out by hand from the layout below (no other source).
 */
import { describe, expect, it } from "vitest";
import { OfficeMockObject } from "office-addin-mock";
import { readSelection, readTableSelection } from "../taskpane/app/host-selection";
import { parsePasted } from "../taskpane/app/parse-pasted";
import { parseElementTable, readElementTable } from "../taskpane/app/parse-table";

function letter(col: number): string {
  return String.fromCharCode(65 + col);
}

/** A range on sheet "Tests" from (row, col), 0-based, of rows x cols; only what the reader calls. */
function rangeAt(values: unknown[][], row: number, col: number, rows: number, cols: number, created: any[]): any {
  const address = `Tests!${letter(col)}${row + 1}:${letter(col + cols - 1)}${row + rows}`;
  const mock: any = new OfficeMockObject({
    address,
    values: values.slice(row, row + rows).map((r) => r.slice(col, col + cols)),
    rowCount: rows,
    columnCount: cols,
    getOffsetRange: (dr: number, dc: number) => rangeAt(values, row + dr, col + dc, rows, cols, created),
    getResizedRange: (dr: number, dc: number) => rangeAt(values, row, col, rows + dr, cols + dc, created),
    getColumn: (i: number) => rangeAt(values, row, col + i, rows, 1, created),
    getLastColumn: () => rangeAt(values, row, col + cols - 1, rows, 1, created),
  });
  created.push(mock);
  return mock;
}

function context(values: unknown[][], row: number, col: number, rows: number, cols: number): Excel.RequestContext {
  const created: any[] = [];
  const selected = rangeAt(values, row, col, rows, cols, created);
  const ctx = new OfficeMockObject({
    workbook: { getSelectedRange: () => selected },
    async sync() {
      for (const o of created) await o.sync();
    },
  });
  return ctx as unknown as Excel.RequestContext;
}

describe("strengths from the selected range", () => {
  it("skips a header, keeps the flag column and refers to the data rows only", async () => {
    // Invented: B2:C6 with a header row; one blank cell (null, as the web host passes it) and a censored flag.
    const sheet = [
      [null, null, null],
      [null, "MPa", "censored"],
      [null, 412.5, false],
      [null, 398.1, true],
      [null, null, null],
      [null, 455, false],
    ];
    const s = await readSelection(context(sheet, 1, 1, 5, 2));
    expect(s.source).toEqual({ kind: "range", strengthsAddress: "Tests!B3:B6", flagsAddress: "Tests!C3:C6" });
    expect(s.description).toMatch(/header row skipped/);
    const parsed = parsePasted(s.text);
    expect(parsed.strengths).toEqual([412.5, 398.1, 455]);
    expect(parsed.censored).toEqual([false, true, false]);
  });

  it("takes one column without a header as it is, and refuses three columns", async () => {
    const sheet = [[300], [310], [320]];
    const s = await readSelection(context(sheet, 0, 0, 3, 1));
    expect(s.source).toEqual({ kind: "range", strengthsAddress: "Tests!A1:A3", flagsAddress: undefined });
    expect(parsePasted(s.text).strengths).toEqual([300, 310, 320]);
    await expect(readSelection(context([[1, 2, 3]], 0, 0, 1, 3))).rejects.toThrow(/one column of strengths, or two/);
  });
});

describe("element table from the selected range", () => {
  it("splits stresses from sizes and skips the header", async () => {
    const sheet = [
      ["s1", "s2", "s3", "V"],
      [160, 40, 0, 2],
      [130, 130, 0, 5],
    ];
    const t = await readTableSelection(context(sheet, 0, 0, 3, 4));
    expect(t.source).toEqual({ kind: "range", stressesAddress: "Tests!A2:C3", sizesAddress: "Tests!D2:D3" });
    expect(parseElementTable(t.text)).toEqual({ stresses: [[160, 40, 0], [130, 130, 0]], columns: 3, sizes: [2, 5] });
    await expect(readTableSelection(context([[1, 2, 3]], 0, 0, 1, 3))).rejects.toThrow(/2, 4 or 7 columns/);
  });

  // Invented sheets (made-up numbers), as test/fixtures/hostile/paste-element-* hold them for pasting.
  it("a header row whose names contradict reading by position is refused (a size-first range had its sizes read as stresses)", async () => {
    const sheet = [
      ["VOL", "S1"],
      [2, 160],
      [5, 130],
    ];
    await expect(readTableSelection(context(sheet, 0, 0, 3, 2))).rejects.toThrow(
      "The header names the columns S1, VOL, but a selected range is read by position: 1, 3 or 6 stress columns (sxx, syy, szz, sxy, syz, szx), then the size: " +
        "select the columns in that order, or paste the table with its header.",
    );
  });

  it("the header row's units reach the box and are checked against the form (sizes in m^3 were read as mm^3)", async () => {
    const sheet = [
      ["S1 (MPa)", "VOL [m^3]"],
      [160, 2e-9],
      [130, 5e-9],
    ];
    const t = await readTableSelection(context(sheet, 0, 0, 3, 2));
    expect(() => readElementTable(t.text, { stressUnit: "MPa", sizeUnit: "mm^3" })).toThrow(/^The header gives the sizes in m\^3, but the size unit of this check is mm\^3/);
    expect(readElementTable(t.text, { stressUnit: "MPa", sizeUnit: "m^3" }).table).toEqual({ stresses: [[160], [130]], columns: 1, sizes: [2e-9, 5e-9] });
  });
});
