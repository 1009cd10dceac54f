// Element tables shaped as finite-element post-processors commonly write them (test/fixtures/hostile/part-*
// and paste-element-*; every table invented, marked so on its first line): listings in pages, integration-point
// rows, nodal tables, units in the header, 2-D tensors, reordered shears, Fortran-style fields. Each case names
// what the reader did before (a wrong sum without a word, or an unhelpful refusal) and checks the right value or
// the refusal. Reference values: the definitions S_E = sum_e V_e sum_k <s_ek / s_max>^m (PIA over the principal
// stresses; compression counts nothing) from ASTM C1683 Annex A3, evaluated here on the file's numbers; in-plane
// principal stresses by Mohr's circle, (sxx + syy)/2 +- sqrt(((sxx - syy)/2)^2 + sxy^2) (any mechanics text).
import { join } from "node:path";
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { runPartCommand } from "../cli/part-command";
import { readPartTable } from "../src/size/part-stream";
import { positionalHeaderProblem, resolveColumns, splitUnit } from "../src/size/part-columns";
import { parseElementTable, readElementTable } from "../taskpane/app/parse-table";
import { relativeError } from "./helpers";

const HOSTILE = "test/fixtures/hostile";
const at = (name: string) => join(HOSTILE, name);
const M = 8;

function capture() {
  const io = { stdout: "", stderr: "", out: (t: string) => (io.stdout += t), err: (t: string) => (io.stderr += t), errIsTTY: false };
  return io;
}

async function part(name: string, ...more: string[]) {
  const io = capture();
  const code = await runPartCommand([at(name), "--modulus", String(M), "--top", "0", ...more], io);
  return { code, io, json: code === 0 && more.includes("--json") ? JSON.parse(io.stdout) : null };
}

const paste = (name: string, options = {}) => readElementTable(readFileSync(at(name), "utf8"), options);

/** S_E at the peak of rows [size, ...principal stresses] (PIA). */
function effectiveSize(rows: number[][]): number {
  const peak = Math.max(...rows.flatMap((r) => r.slice(1)));
  return rows.reduce((sum, [v, ...s]) => sum + v * s.reduce((a, x) => a + (x > 0 ? (x / peak) ** M : 0), 0), 0);
}

/** In-plane principal stresses (Mohr's circle) and the out-of-plane one. */
function mohr(sxx: number, syy: number, sxy: number, szz = 0): number[] {
  const c = (sxx + syy) / 2;
  const r = Math.hypot((sxx - syy) / 2, sxy);
  return [c + r, c - r, szz];
}

describe("listings in pages, with summaries", () => {
  it("part-listing-page-headers: title and header lines repeated on each page are skipped and named, the summary at the end too (the title line was taken for the header and the table refused)", async () => {
    const { code, io, json } = await part("part-listing-page-headers.txt", "--json");
    expect(code, io.stderr).toBe(0);
    expect(json.rows).toBe(4);
    // Elements 1-4 as written in the file: size, then S1, S2, S3.
    const rows = [
      [2.0, 100.5, 20.0, -5.0],
      [1.0, -40.0, -50.0, -60.0],
      [0.5, 250.0, 10.0, 0.0],
      [1.5, 120.0, 30.0, 1.0],
    ];
    expect(relativeError(json.effectiveSize, effectiveSize(rows))).toBeLessThan(1e-14);
    expect(io.stderr).toBe(
      "brittle part: skipped line 1 (comment), line 2 (page title), line 3 (blank), line 7 (page title), line 8 (blank), " +
        "line 9 (repeated header), line 12 (blank), lines 13-15 (text after the last element)\n",
    );
  });

  it("part-listing-title-with-numbers: title lines holding numbers (load step, time) before a header are page titles (the first was read as an element: '\"LOAD\" is not a number')", async () => {
    const { code, io, json } = await part("part-listing-title-with-numbers.txt", "--json");
    expect(code, io.stderr).toBe(0);
    expect(json.rows).toBe(3);
    expect(relativeError(json.effectiveSize, effectiveSize([[2, 100.5], [0.5, 250], [1, -40]]))).toBeLessThan(1e-14);
    expect(io.stderr).toBe("brittle part: skipped line 1 (comment), lines 2-3 (page title), line 4 (blank), line 8 (page title), line 9 (blank), line 10 (repeated header)\n");
    // Without a header after it, such a line stops the read, saying what it holds.
    const alone = await readPartTable([new TextEncoder().encode(" LOAD STEP 1  TIME 1.0000\n 1  100.5  2.0\n")], { shape: M }).catch((e: Error) => e.message);
    expect(alone).toBe('line 1 ("LOAD STEP 1 TIME 1.0000") holds words and numbers: no element, and no header line follows it (a listing\'s title?)');
  });

  it("part-repeated-header: a comma export's repeated header is skipped (it stopped the read: 'the stress field 2 (\"S1\") is not a number')", async () => {
    const { code, io, json } = await part("part-repeated-header.csv", "--json");
    expect(code, io.stderr).toBe(0);
    expect(json.rows).toBe(4);
    expect(relativeError(json.effectiveSize, effectiveSize([[2, 100.5], [1, -40], [0.5, 250], [1.5, 120]]))).toBeLessThan(1e-14);
    expect(io.stderr).toBe("brittle part: skipped line 1 (comment), line 5 (blank), line 6 (repeated header)\n");
  });

  it("part-summary-lines: summary rows whose id is a word (MAX, MIN) are no elements (MAX was summed as one: S_E 2.50 instead of 0.501)", async () => {
    const { code, io, json } = await part("part-summary-lines.csv", "--json");
    expect(code, io.stderr).toBe(0);
    expect(json.rows).toBe(3);
    expect(relativeError(json.effectiveSize, effectiveSize([[2, 100.5], [1, -40], [0.5, 250]]))).toBeLessThan(1e-14);
    expect(io.stderr).toBe("brittle part: skipped line 1 (comment), lines 6-7 (text after the last element)\n");
  });

  it("part-listing-text-among-elements: text followed by more rows (a summary between blocks) stops the read, naming both lines", async () => {
    const { code, io } = await part("part-listing-text-among-elements.txt");
    expect(code).toBe(1);
    expect(io.stderr).toMatch(/^brittle part: line 5 \("MINIMUM VALUES"\) is no element, and rows follow it \(line 7\): a summary \(maximum, minimum, total\) or a page title of a listing\?/);
    expect(io.stdout).toBe("");
  });
});

describe("several rows per element (integration-point or nodal output)", () => {
  it("part-repeated-element-ids: the element volume on four integration-point rows is refused, saying what it is and what to export (S_E came out 4 times too large)", async () => {
    const { code, io } = await part("part-repeated-element-ids.txt");
    expect(code).toBe(1);
    expect(io.stderr).toBe(
      "brittle part: element 1 is on line 3 and again on line 4: several rows per element, as integration-point or nodal output writes them? " +
        "The size column (EVOL) holds 2 on both rows: if that is the element's volume or area, the sum would count it once per row (4 rows here, 4 times). " +
        "Export one row per element (element-averaged or centroid stresses) with the element volume or area; " +
        "if each row's size is that point's own share of the element, state --integration-points\n",
    );
  });

  it("repeats across a batch boundary are found too (rows are summed in batches)", async () => {
    const text = readFileSync(at("part-repeated-element-ids.txt"));
    await expect(readPartTable([text], { shape: M, batchRows: 1 })).rejects.toThrow(/^element 1 is on line 3 and again on line 4/);
    await expect(readPartTable([text], { shape: M, batchRows: 4 })).rejects.toThrow(/^element 1 is on line 3 and again on line 4/);
  });

  it("part-integration-point-column: a node or integration-point column is refused without --integration-points, and read with it", async () => {
    const refused = await part("part-integration-point-column.txt");
    expect(refused.code).toBe(1);
    expect(refused.io.stderr).toMatch(/^brittle part: the header has a column "IP" \(node or integration-point numbers\): several rows per element\. /);
    const { code, io, json } = await part("part-integration-point-column.txt", "--integration-points", "--json");
    expect(code, io.stderr).toBe(0);
    expect(json.rows).toBe(8);
    expect(json.integrationPoints).toBe(true);
    const rows = [[0.5, 100.5], [0.5, 98], [0.5, 97], [0.5, 99], [0.125, 250], [0.125, 240], [0.125, 245], [0.125, 230]];
    expect(relativeError(json.effectiveSize, effectiveSize(rows))).toBeLessThan(1e-14);
    const report = await part("part-integration-point-column.txt", "--integration-points");
    expect(report.io.stdout).toMatch(/\nrows {12}integration points \(or nodes\), each with its own share of the element's size \(--integration-points\)\n/);
  });

  it("part-repeated-element-ids with --integration-points: a size column named as the element's volume (EVOL) is still refused (stated, it was summed 4 times over)", async () => {
    const { code, io } = await part("part-repeated-element-ids.txt", "--integration-points");
    expect(code).toBe(1);
    expect(io.stderr).toBe(
      'brittle part: integration points were stated, but the size column "EVOL" is named as the element\'s volume or area: summed over its points, ' +
        "each element would count once per point; export each point's own volume (or area), or one row per element\n",
    );
  });

  it("part-nodal-stresses: a node table with no volume says what it is (it said only 'no size column recognised')", async () => {
    const { code, io } = await part("part-nodal-stresses.txt");
    expect(code).toBe(1);
    expect(io.stderr).toBe(
      'brittle part: the header (NODE, S1, S2, S3) has a column "NODE" of node or integration-point numbers and no volume or area: nodal (averaged) stresses? ' +
        "The effective size needs each element's volume or area: export element stresses with the element volume (or area)\n",
    );
  });
});

describe("units in the header", () => {
  it("part-units-in-header: names with units are found, and the report states the units (the table was refused: 'no stress columns recognised')", async () => {
    const { code, io } = await part("part-units-in-header.txt");
    expect(code, io.stderr).toBe(0);
    expect(io.stdout).toMatch(/\nunits {11}stresses MPa, sizes mm\^3, from the header: a material scale and the strengths must be in the table's units\n/);
    expect(io.stdout).toMatch(/\npeak stress {5}250 MPa at element 2 \(line 4\)\n/);
    // Only S11 is non-zero: S_E = 2 (100.5/250)^8 + 0.5.
    expect(io.stdout).toMatch(/\neffective size {2}0\.501364 mm\^3, referenced/);
  });

  it("part-units-si: pascals and cubic metres are read as written and shown, so a factor 1e6 or 1e9 against MPa and mm^3 cannot hide", async () => {
    const { code, io } = await part("part-units-si.txt");
    expect(code, io.stderr).toBe(0);
    expect(io.stdout).toMatch(/\ncolumns {9}stresses S1 \[Pa\] \(maximum principal\); size EVOL, m\^3; id ELEM\n/);
    expect(io.stdout).toMatch(/\npeak stress {5}2\.5000e\+8 Pa at/);
    expect(io.stdout).toMatch(/\neffective size {2}5\.0136e-10 m\^3, referenced/);
    const json = (await part("part-units-si.txt", "--json")).json;
    expect(json.columns.units).toEqual({ stress: "Pa", size: "m^3" });
    expect(relativeError(json.effectiveSize, effectiveSize([[2e-9, 100.5e6], [0.5e-9, 250e6], [1e-9, -40e6]]))).toBeLessThan(1e-14);
  });

  it("part-units-space-aligned: 'S1 (MPa)' in a space-aligned header is one name with its unit (it was two fields: 'expected at least 5 fields')", async () => {
    const { code, io, json } = await part("part-units-space-aligned.txt", "--json");
    expect(code, io.stderr).toBe(0);
    expect(json.columns.labels).toEqual({ stress: ["S1 (MPa)"], size: "VOL (mm^3)", id: "ELEM" });
    expect(json.columns.units).toEqual({ stress: "MPa", size: "mm^3" });
    expect(relativeError(json.effectiveSize, effectiveSize([[2, 100.5], [0.5, 250], [1, -40]]))).toBeLessThan(1e-14);
  });

  it("part-units-mixed: stress columns in different units are refused", async () => {
    const { code, io } = await part("part-units-mixed.csv");
    expect(code).toBe(1);
    expect(io.stderr).toBe("brittle part: the stress columns are in different units (MPa, Pa): export them in one unit\n");
  });

  it("part-comma-unit-in-header: 'EVOL, m^3' split at its comma is named as the reason for the narrower rows (it said only 'expected at least 4 fields')", async () => {
    const { code, io } = await part("part-comma-unit-in-header.csv");
    expect(code).toBe(1);
    expect(io.stderr).toBe(
      'brittle part: line 3: expected at least 4 fields as on line 2, found 3 (header field 4 is the unit "m^3" alone: a header name with a unit after a comma, ' +
        'such as "EVOL, m^3", splits into two fields in a comma-delimited file; write the unit in brackets, "EVOL [m^3]")\n',
    );
  });

  it("a table without units says so beside the numbers", async () => {
    const { io } = await part("part-repeated-header.csv");
    expect(io.stdout).toMatch(/\nunits {11}none written in the header: a material scale and the strengths must be in the table's units\n/);
    expect(io.stdout).toMatch(/\neffective size {2}[0-9.]+ \(unit of the size column VOL\), referenced/);
  });

  it("splitUnit takes brackets, and a known unit after a comma, slash, blank or underscore; other words stay in the name", () => {
    expect(splitUnit("S11 (MPa)")).toEqual({ name: "S11", unit: "MPa" });
    expect(splitUnit("IVOL [mm^3]")).toEqual({ name: "IVOL", unit: "mm^3" });
    expect(splitUnit("EVOL, m^3")).toEqual({ name: "EVOL", unit: "m^3" });
    expect(splitUnit("S1/MPa")).toEqual({ name: "S1", unit: "MPa" });
    expect(splitUnit("S1_psi")).toEqual({ name: "S1", unit: "psi" });
    expect(splitUnit("Max Principal")).toEqual({ name: "Max Principal", unit: null });
    expect(splitUnit("S_XX")).toEqual({ name: "S_XX", unit: null });
  });
});

describe("stress columns: 2-D tensors, shear order, components where principal stresses belong", () => {
  it("part-plane-stress: SXX, SYY, SXY are a plane-stress tensor (refused before; with --stress SXX,SYY,SXY they were summed as three principal stresses)", async () => {
    const expected = effectiveSize([
      [2, ...mohr(100, 20, 30)],
      [0.5, ...mohr(250, 10, 4)],
    ]);
    for (const more of [[], ["--stress", "SXX,SYY,SXY"], ["--stress", "SXY,SXX,SYY"]]) {
      const { code, io, json } = await part("part-plane-stress.csv", ...more, "--json");
      expect(code, io.stderr).toBe(0);
      expect(json.columns.tensor).toBe("plane stress");
      expect(relativeError(json.effectiveSize, expected), more.join(" ")).toBeLessThan(1e-13);
      expect(relativeError(json.peak, mohr(250, 10, 4)[0])).toBeLessThan(1e-15);
    }
    const { io } = await part("part-plane-stress.csv");
    expect(io.stdout).toMatch(/\ncolumns {9}stresses SXX, SYY, SXY \(2-D tensor, plane stress: szz = syz = szx = 0; principal stresses computed\); size AREA; id ELEM\n/);
  });

  it("part-axisymmetric: SXX, SYY, SZZ, SXY are a 2-D tensor with SZZ the hoop stress (refused before)", async () => {
    const { code, io, json } = await part("part-axisymmetric.csv", "--json");
    expect(code, io.stderr).toBe(0);
    expect(json.columns.tensor).toBe("axisymmetric or plane strain");
    const expected = effectiveSize([
      [2, ...mohr(100, 20, 30, 40)],
      [0.5, ...mohr(250, 10, 4, 60)],
    ]);
    expect(relativeError(json.effectiveSize, expected)).toBeLessThan(1e-13);
  });

  it("part-shear-order: --stress naming the components in the file's order (S12, S13, S23) places them by name (S13 was taken as syz)", async () => {
    // Positions in the documented order sxx, syy, szz, sxy, syz, szx: S23 is field 11, S13 field 10.
    const byPosition = (await part("part-shear-order.csv", "--stress", "6,7,8,9,11,10", "--json")).json;
    const auto = (await part("part-shear-order.csv", "--json")).json;
    const named = await part("part-shear-order.csv", "--stress", "S11,S22,S33,S12,S13,S23", "--json");
    expect(named.code, named.io.stderr).toBe(0);
    expect(named.json.effectiveSize).toBe(byPosition.effectiveSize);
    expect(auto.effectiveSize).toBe(byPosition.effectiveSize);
    // Read the wrong way round the sum differs: the check above can fail.
    const swapped = (await part("part-shear-order.csv", "--stress", "6,7,8,9,10,11", "--json")).json;
    expect(relativeError(swapped.effectiveSize, byPosition.effectiveSize)).toBeGreaterThan(1e-6);
  });

  it("normal components named where principal stresses are meant are refused (--stress SXX,SYY,SZZ was summed as principal stresses)", async () => {
    const { code, io } = await part("part-shear-order.csv", "--stress", "S11,S22,S33");
    expect(code).toBe(1);
    expect(io.stderr).toBe(
      "brittle part: --stress S11, S22, S33: stress components are not principal stresses; give the maximum principal stress, the three principal stresses, " +
        "all six components, or a 2-D tensor (SXX,SYY,SXY for plane stress; SXX,SYY,SZZ,SXY for axisymmetric or plane strain)\n",
    );
    expect((await part("part-shear-order.csv", "--stress", "S11")).io.stderr).toMatch(/^brittle part: --stress S11: a stress component is not principal stresses/);
  });

  it("part-two-principal: S1 and S2 without S3 are two principal stresses, the third 0 (S2 was left out: only S1 was summed)", async () => {
    const { code, io, json } = await part("part-two-principal.txt", "--json");
    expect(code, io.stderr).toBe(0);
    expect(relativeError(json.effectiveSize, effectiveSize([[2, 100.5, 50, 0], [0.5, 250, 100, 0], [1, -40, -60, 0]]))).toBeLessThan(1e-14);
    expect((await part("part-two-principal.txt")).io.stdout).toMatch(
      /\ncolumns {9}stresses S1, S2 \(principal, two columns: the third principal stress is 0, as in plane stress\); size AREA; id ELEM\n/,
    );
    expect(paste("part-two-principal.txt").table.stresses).toEqual([[100.5, 50, 0], [250, 100, 0], [-40, -60, 0]]);
  });

  it("part-max-and-min-principal: the largest and smallest principal stresses without the middle one are refused (only the largest was summed)", async () => {
    const { code, io } = await part("part-max-and-min-principal.txt");
    expect(code).toBe(1);
    expect(io.stderr).toBe(
      "brittle part: the header has the largest and smallest principal stresses (SMAX, SMIN) but not the middle one: give all three, or choose the largest alone with --stress SMAX\n",
    );
  });

  it("part-side-by-side: a header naming S1 twice (two tables side by side) is refused (the second table was left out: S_E from elements 1 and 2 only)", async () => {
    const { code, io } = await part("part-side-by-side.csv");
    expect(code).toBe(1);
    expect(io.stderr).toBe(
      'brittle part: the header names "S1" twice (columns 2 and 5): two tables side by side? Put every element on a line of its own, or choose the columns with --stress, --size and --id\n',
    );
    // Columns chosen by the caller are taken as chosen.
    const chosen = await part("part-side-by-side.csv", "--stress", "5", "--size", "6", "--id", "4", "--json");
    expect(relativeError(chosen.json.effectiveSize, effectiveSize([[0.5, 250], [1.5, 120]]))).toBeLessThan(1e-14);
    expect(() => readElementTable(readFileSync(at("part-side-by-side.csv"), "utf8"))).toThrow(
      'The header names "S1" twice (columns 2 and 5): two tables side by side? Put every element on a line of its own.',
    );
  });

  it("von Mises and coordinate columns beside the stresses are ignored, and the full tensor is chosen", () => {
    const c = resolveColumns(["ID", "X", "Y", "Z", "MISES", "S11", "S22", "S33", "S12", "S13", "S23", "VOL"], 12);
    expect(c).toMatchObject({ stress: [5, 6, 7, 8, 10, 9], kind: 6, tensor: "3-D", size: 11, id: 0 });
  });
});

describe("Fortran-style fields say what they are (they were 'is not a number')", () => {
  it("part-touching-numbers: two numbers with no blank between them", async () => {
    const { code, io } = await part("part-touching-numbers.txt");
    expect(code).toBe(1);
    expect(io.stderr).toBe(
      'brittle part: line 3: the stress field 2 ("-1.234E+02-5.678E+01") holds two numbers with nothing between them (-1.234E+02 and -5.678E+01), ' +
        "as fixed-width columns print a negative number that fills its field: export with a delimiter or wider columns\n",
    );
  });

  it("part-touching-in-unread-column: touching coordinates make the row a field short; the message says why (it said only 'found 4')", async () => {
    const { code, io } = await part("part-touching-in-unread-column.txt");
    expect(code).toBe(1);
    expect(io.stderr).toBe(
      'brittle part: line 3: expected at least 5 fields as on line 2, found 4 ("-1.000E+02-5.000E+01" holds two numbers with nothing between them ' +
        "(-1.000E+02 and -5.000E+01), as fixed-width columns print a negative number that fills its field: export with a delimiter or wider columns)\n",
    );
  });

  it("part-exponent-letter-dropped: 1.234+002 could be 1.234E+002 or two numbers: refused, saying both", async () => {
    const { code, io } = await part("part-exponent-letter-dropped.txt");
    expect(code).toBe(1);
    expect(io.stderr).toBe(
      'brittle part: line 3: the stress field 2 ("1.234+002") is a mantissa and a signed exponent with no exponent letter (1.234E+002, as some Fortran formats write ' +
        "three-digit exponents), or two numbers touching (1.234 and +002): it is not read; export with an exponent letter and blanks or a delimiter between columns\n",
    );
  });

  it("pasted into the task pane, the same fields say the same (they were 'is not a number')", () => {
    expect(() => paste("part-asterisks.txt")).toThrow(
      'Line 4: "*********" is a run of asterisks, which Fortran-style writers print when a number does not fit its field: the value is lost; export with a wider number format.',
    );
    expect(() => paste("part-exponent-letter-dropped.txt")).toThrow(/^Line 3: "1\.234\+002" is a mantissa and a signed exponent with no exponent letter/);
  });

  it("part-asterisks: a field of asterisks is a number that overflowed its field", async () => {
    const { code, io } = await part("part-asterisks.txt");
    expect(code).toBe(1);
    expect(io.stderr).toBe(
      'brittle part: line 4: the stress field 2 ("*********") is a run of asterisks, which Fortran-style writers print when a number does not fit its field: ' +
        "the value is lost; export with a wider number format\n",
    );
  });
});

describe("element tables pasted into the task pane, and selected ranges", () => {

  it("paste-element-size-first: a header naming the size first is read by its names (the sizes were taken as stresses)", () => {
    const { table, notes } = paste("paste-element-size-first.txt");
    expect(table).toEqual({ stresses: [[100.5], [40], [250]], columns: 1, sizes: [2, 1, 0.5] });
    expect(notes).toEqual(["Skipped line 1 (comment), line 2 (header).", "Read stresses S1 and sizes VOL by the header."]);
  });

  it("paste-element-plane-stress: SXX, SYY, SXY with an id are a plane-stress tensor (refused for its width; without the id, summed as principal stresses)", () => {
    expect(paste("paste-element-plane-stress.txt").table).toEqual({
      stresses: [
        [100, 20, 0, 30, 0, 0],
        [250, 10, 0, 4, 0, 0],
      ],
      columns: 6,
      sizes: [2, 0.5],
    });
  });

  it("paste-element-shear-order: S13 before S23 is placed by its name (it was read as syz)", () => {
    // The documented order sxx, syy, szz, sxy, syz, szx, read off the file's S23 and S13 columns.
    expect(paste("paste-element-shear-order.txt").table.stresses).toEqual([
      [100, 20, 5, 30, 3, 7],
      [250, 10, 0, 4, 2, 1],
    ]);
  });

  it("paste-element-repeated-ids: two rows per element are refused (summed, they counted each volume twice)", () => {
    expect(() => paste("paste-element-repeated-ids.txt")).toThrow(
      /^Element 1 is on line 3 and again on line 4: several rows per element, as integration-point or nodal output writes them\? /,
    );
  });

  it("paste-element-units: a unit in the header must be the check's unit (m^3 against mm^3 is a factor 1e9)", () => {
    expect(() => paste("paste-element-units.txt", { stressUnit: "MPa", sizeUnit: "mm^3" })).toThrow(
      "The header gives the sizes in m^3, but the size unit of this check is mm^3: choose m^3 as the size unit, or convert the table.",
    );
    expect(() => paste("paste-element-units.txt", { stressUnit: "psi", sizeUnit: "m^3" })).toThrow(/stresses in MPa, but the stress unit of this check is psi/);
    expect(paste("paste-element-units.txt", { stressUnit: "N/mm²", sizeUnit: "m^3" }).table.sizes).toEqual([2e-9, 0.5e-9]);
  });

  it("part-units-space-aligned pasted: 'S1 (MPa)' between blanks is one name (the header was two fields wider than the rows)", () => {
    expect(paste("part-units-space-aligned.txt", { stressUnit: "MPa", sizeUnit: "mm^3" }).table).toEqual({ stresses: [[100.5], [250], [-40]], columns: 1, sizes: [2, 0.5, 1] });
  });

  it("part-repeated-header pasted: the header repeated after a blank line is skipped and named (it was refused: '\"ELEM\" is not a number')", () => {
    const { table, notes } = paste("part-repeated-header.csv");
    expect(table).toEqual({ stresses: [[100.5], [-40], [250], [120]], columns: 1, sizes: [2, 1, 0.5, 1.5] });
    expect(notes).toEqual(["Skipped line 1 (comment), line 2 (header), line 5 (blank), line 6 (repeated header).", "Read stresses S1 and sizes VOL by the header."]);
  });

  it("a header naming no known column is read by position, and the note says so", () => {
    const { table, notes } = readElementTable("sigma\tdV\n100.5\t2\n");
    expect(table).toEqual({ stresses: [[100.5]], columns: 1, sizes: [2] });
    expect(notes).toEqual(["Skipped line 1 (header).", "No column names recognised in the header (sigma, dV): read by position, stresses first, size last."]);
    expect(parseElementTable("100.5\t2\n250\t0.5\n")).toEqual({ stresses: [[100.5], [250]], columns: 1, sizes: [2, 0.5] });
  });

  it("a selected range's header must agree with reading by position (a size-first range had its sizes read as stresses)", () => {
    expect(positionalHeaderProblem(["VOL", "S1"])).toBe(
      "the header names the columns S1, VOL, but a selected range is read by position: 1, 3 or 6 stress columns (sxx, syy, szz, sxy, syz, szx), then the size",
    );
    expect(positionalHeaderProblem(["S11", "S22", "S33", "S12", "S13", "S23", "V"])).toMatch(/^the header names the columns S11, S22, S33, S12, S23, S13, V/);
    expect(positionalHeaderProblem(["SXX", "SYY", "SXY", "A"])).toMatch(/^the header names the columns SXX, SYY, SXY, A/);
    expect(positionalHeaderProblem(["s1", "s2", "s3", "V"])).toBeNull();
    expect(positionalHeaderProblem(["sigma", "dV"])).toBeNull();
  });
});

describe("sizes of zero", () => {
  it("part-sizes-printed-as-zero: every element in tension of size 0 is refused (the effective size 0 and a failure probability 0 were printed as results)", async () => {
    const { code, io } = await part("part-sizes-printed-as-zero.txt", "--scale", "400");
    expect(code).toBe(1);
    expect(io.stderr).toBe(
      "brittle part: every element in tension has size 0, so the effective size is 0 (and the failure probability would be 0): " +
        "sizes printed with too few digits (volumes in m^3 in a fixed format?), or the wrong size column? Export the sizes with more digits or in a smaller unit\n",
    );
  });

  it("part-zero-size: elements of size 0 are counted and named in the report", async () => {
    const { code, io, json } = await part("part-zero-size.csv", "--json");
    expect(code, io.stderr).toBe(0);
    expect(json.zeroSizes).toBe(1);
    expect(relativeError(json.effectiveSize, effectiveSize([[2, 100.5], [0.5, 250], [0, 180]]))).toBeLessThan(1e-14);
    expect((await part("part-zero-size.csv")).io.stdout).toMatch(/\nzero sizes {6}1 element has size 0 and adds nothing \(sizes printed with too few digits\?\)\n/);
  });
});
