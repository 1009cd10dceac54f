// What the user documentation quotes, checked against what the code says now: links and headings, the
// printed `brittle check` verdict, messages and report lines of the file readers, the JSON fields named for
// `brittle check --json`, the check file's required fields, function signatures written out in full, limits
// and lists the pages state, the measured tables of docs/uncertainty.md against the committed records they
// come from, and the worked numbers of docs/material-fit-and-planning.md. Each quote is read from the
// document itself, so a changed message fails here instead of going stale on the page. The inputs are
// invented (made-up numbers), written to a temporary folder.
import { mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync } from "node:fs";
import { tmpdir } from "node:os";
import { dirname, join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { main, summaryLine } from "../cli/cli";
import { SAFE_BUILTINS } from "../cli/formula-safety";
import { PARALLEL_MIN_BYTES } from "../cli/part-parallel";
import { MAX_RANGE_CELLS } from "../cli/range-budget";
import { MAX_COLUMNS, MAX_CONTENT_CELLS, MAX_ROWS } from "../cli/workbook-limits";
import { MAX_PACKAGE_BYTES, MAX_PART_BYTES } from "../cli/xlsx-parts";
import { generateMetadata, type FunctionMetadata } from "../functions/metadata";
import { guarded } from "../functions/registry";
import { parseCheckFile } from "../src/design/check-file";
import { PLANNING_SIZES } from "../src/design/specimens-needed";
import { MAX_LINE_BYTES } from "../src/size/part-stream";

const DOCS = [
  "README.md",
  "docs/design-check.md",
  "docs/check-file.md",
  "docs/files-and-formats.md",
  "docs/load-to-strength.md",
  "docs/material-fit-and-planning.md",
  "docs/uncertainty.md",
  "docs/deploy.md",
  "docs/signatures.md",
];

const read = (file: string) => readFileSync(file, "utf8");
/** Runs of blanks and line breaks as one space: quotes in the documents are wrapped. */
const flat = (text: string) => text.replace(/\s+/g, " ");

async function run(args: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = "";
  let err = "";
  const code = await main(args, { out: (t) => void (out += t), err: (t) => void (err += t) });
  return { code, out, err };
}

const dir = mkdtempSync(join(tmpdir(), "brittle-docs-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
function invented(name: string, text: string): string {
  const path = join(dir, name);
  writeFileSync(path, text);
  return path;
}

/** The text between two markers in a document, whitespace flattened. */
function between(page: string, start: string, end: string): string {
  const text = flat(page);
  const i = text.indexOf(start);
  expect(i, `"${start}" in the document`).toBeGreaterThanOrEqual(0);
  const j = text.indexOf(end, i + start.length);
  expect(j, `"${end}" after "${start}"`).toBeGreaterThan(i);
  return text.slice(i + start.length, j);
}

/** The quote in backticks that follows `lead` (a backticked span may be wrapped over lines). */
function quoteAfter(text: string, lead: string): string {
  const i = flat(text).indexOf(lead);
  expect(i, `"${lead}" in the document`).toBeGreaterThanOrEqual(0);
  const m = flat(text).slice(i + lead.length).match(/`([^`]+)`/);
  expect(m, `a quote after "${lead}"`).not.toBeNull();
  return m![1];
}

describe("links in the user documentation", () => {
  // GitHub's heading anchors: lower case, punctuation dropped, spaces to hyphens.
  const anchor = (heading: string) => heading.replace(/`/g, "").trim().toLowerCase().replace(/[^\p{L}\p{N}\s_-]/gu, "").replace(/\s/g, "-");
  const anchors = (file: string) => [...read(file).replace(/```[\s\S]*?```/g, "").matchAll(/^#+\s+(.*)$/gm)].map((m) => anchor(m[1]));

  for (const doc of DOCS) {
    it(`${doc}: every relative link names a file that exists, and a heading it has`, () => {
      const links = [...read(doc).matchAll(/\]\(([^)\s]+)\)/g)].map((m) => m[1]).filter((l) => !/^[a-z]+:/.test(l));
      for (const link of links) {
        const [path, hash] = link.split("#");
        const target = path ? join(dirname(doc), path) : doc;
        expect(existsSync(target), `${doc}: ${link}`).toBe(true);
        if (hash) expect(anchors(target), `${doc}: ${link}`).toContain(hash);
      }
    });
  }
});

describe("the printed `brittle check` verdict the documents quote", () => {
  for (const doc of ["README.md", "docs/design-check.md"]) {
    it(`${doc}: every line of the quoted run on examples/check-fail.check.json is printed, exit status 1`, async () => {
      const text = read(doc);
      const start = text.indexOf("Design check: INVENTED EXAMPLE (made-up data, not for design): insulator sleeve SL-20");
      expect(start).toBeGreaterThan(0);
      const block = text.slice(start, text.indexOf("```", start));
      const { code, out } = await run(["check", "examples/check-fail.check.json"]);
      expect(code).toBe(1);
      const printed = out.split("\n");
      const quoted = block.split("\n").filter((l) => l.trim() && l.trim() !== "...");
      expect(quoted.length).toBeGreaterThan(3);
      for (const line of quoted) {
        // A line cut short with " ..." is a quoted beginning.
        const cut = line.endsWith(" ...") ? line.slice(0, -4) : null;
        expect(cut === null ? printed.includes(line) : printed.some((p) => p.startsWith(cut)), line).toBe(true);
      }
    });
  }
});

describe("docs/check-file.md", () => {
  const text = read("docs/check-file.md");
  const example = JSON.parse(read("examples/check-fail.check.json"));

  it("quotes the message for a strength written as text with a decimal comma", async () => {
    const quoted = quoteAfter(text, "refused with a message that names the field, for example");
    example.material.strengths[3] = "430,2";
    const { code, err } = await run(["check", invented("comma.check.json", JSON.stringify(example, null, 1))]);
    expect(code).toBe(2);
    expect(flat(err)).toContain(quoted);
  });

  it("its example is a check file the reader accepts", () => {
    const example = text.match(/## Example \(invented\)\s+```json\n([\s\S]*?)```/);
    expect(example).not.toBeNull();
    expect(parseCheckFile(example![1]).material).toMatchObject({ kind: "data", method: "MLE" });
  });

  it("names every top-level field of `brittle check --json`, and the error object's fields", async () => {
    let listed = between(text, "One object:", "On bad input");
    while (/\([^()]*\)/.test(listed)) listed = listed.replace(/\([^()]*\)/g, "");
    const names = [...listed.matchAll(/`(\w+)`/g)].map((m) => m[1]);
    const { out } = await run(["check", "examples/check-fail.check.json", "--json"]);
    expect(names).toEqual(Object.keys(JSON.parse(out)));

    expect(text).toContain('`{"error": {"file", "field", "message"}}`');
    const bad = await run(["check", invented("bad.check.json", "{}"), "--json"]);
    expect(bad.code).toBe(2);
    expect(Object.keys(JSON.parse(bad.out).error)).toEqual(["file", "field", "message"]);
  });
});

describe("docs/files-and-formats.md: quoted messages and report lines", () => {
  const text = read("docs/files-and-formats.md");

  it("mixed decimal marks", async () => {
    const quoted = quoteAfter(text, "Both in one file is refused (");
    const { code, err } = await run(["part", invented("mixed.txt", "S1;VOL\n445,3;1\n445.3;2\n"), "--modulus", "10"]);
    expect(code).toBe(1);
    expect(err).toContain(quoted);
  });

  it("skipped comment and blank lines, the delimiter line and the end-of-file mark", async () => {
    const comment = quoteAfter(text, "blank and `#` comment lines on stderr with their line numbers (");
    const a = await run(["part", invented("commented.csv", "# model A\nELEM,S1,VOL\n1,100,1.5\n\n2,120,2\n"), "--modulus", "10"]);
    expect(a.code).toBe(0);
    expect(a.err).toContain(comment);
    expect(a.out).toContain(quoteAfter(text, "the header in the report ("));

    const sep = quoteAfter(text, "`brittle part` lists it on stderr as");
    const eof = quoteAfter(text, "`part` lists it on stderr (");
    const b = await run(["part", invented("sep.csv", "sep=;\nELEM;S1;VOL\n1;100;1\n2;120;2\n3;90;1\n4;95;1\n\x1a"), "--modulus", "10"]);
    expect(b.code).toBe(0);
    expect(b.err).toContain(sep);
    expect(b.err).toContain(eof);

    const stated = quoteAfter(text, "ten lines after the header), and the read line says");
    const c = await run(["calc", invented("sep-calc.csv", "sep=;\nstrength;x\n412,5;1\n398,1;1\n367,1;1\n")]);
    expect(c.code).toBe(0);
    expect(c.err).toContain(stated);
  });

  it("a listing's page titles and repeated header, and text after the last element", async () => {
    const listed = quoteAfter(text, "both are listed on stderr");
    const { code, err } = await run(["part", "test/fixtures/hostile/part-listing-page-headers.txt", "--modulus", "10"]);
    expect(code).toBe(0);
    expect(err).toContain(listed);
    expect(err).toContain(`(${quoteAfter(text, "is skipped and listed (")})`);
  });

  it("the field count of a comma file split by decimal commas, and the read line of a .csv", async () => {
    const quoted = quoteAfter(text, "and the field count catches them").replace(/ \.\.\.$/, "");
    const a = await run(["calc", invented("split.csv", "strength,flag\n100,5,3\n")]);
    expect(a.code).toBe(1);
    expect(a.err).toContain(quoted);

    // The quoted read line names data.csv with its first decimal comma on line 8.
    const readLine = quoteAfter(text, "stderr gets one line saying how the file was read, for example");
    const lines = ["strength;specimen", "412;1", "398;2", "420;3", "445;4", "401;5", "399;6", "367,1;7", "=BRITTLE.MODULUS(A2:A8);"];
    const path = invented("data.csv", lines.join("\n") + "\n");
    const b = await run(["calc", path]);
    expect(b.code).toBe(0);
    expect(b.err.replace(path, "data.csv")).toContain(readLine);
  });

  it("the report's zero-size line, units line and --json fields", async () => {
    const zero = flat(quoteAfter(text, "the report counts such elements ("));
    const a = await run(["part", invented("zero.csv", "ELEM,S1,VOL\n1,100,1\n2,90,0\n"), "--modulus", "10"]);
    expect(a.code).toBe(0);
    expect(flat(a.out)).toContain(zero);

    const units = between(text, "The report has a `units` line (", ")");
    const [fromHeader, none] = [...units.matchAll(/`([^`]+)`/g)].map((m) => m[1]);
    const b = await run(["part", invented("units.csv", "ELEM;S1 (MPa);IVOL [mm^3]\n1;100;1\n"), "--modulus", "10"]);
    expect(b.out).toMatch(new RegExp(`^units +${fromHeader.replace(/\^/g, "\\^")}`, "m"));
    expect(a.out).toMatch(new RegExp(`^units +${none}`, "m"));

    expect(text).toContain('(`"integrationPoints": true` in `--json`)');
    const c = await run(["part", invented("points.csv", "ELEM,S1,IVOL\n1,100,0.5\n1,110,0.5\n"), "--modulus", "10", "--integration-points", "--json"]);
    expect(c.code).toBe(0);
    const json = JSON.parse(c.out);
    expect(json.integrationPoints).toBe(true);
    expect(text).toContain("`zeroSizes` in\n  `--json`");
    expect(JSON.parse((await run(["part", join(dir, "zero.csv"), "--modulus", "10", "--json"])).out).zeroSizes).toBe(1);
    expect(Object.keys(json.columns)).toEqual(expect.arrayContaining(["units", "stress", "tensor"]));
  });

  it("a unit in a cell of strengths, as the #VALUE! message says it", async () => {
    const quoted = quoteAfter(text, "`#VALUE!` message now says what the cell holds:").replace(/ \.\.\.$/, "");
    const { out } = await run(["calc", invented("unit.csv", "v;f\n400;=BRITTLE.MODULUS(A2:A4)\n0.41 GPa;\n410;\n")]);
    expect(out).toContain(quoted);
  });

  it("the summary line of `calc`", () => {
    expect(summaryLine(14, 2).trim()).toBe(quoteAfter(text, "then a summary line,"));
  });
});

describe("docs/uncertainty.md: the measured tables are the committed records", () => {
  const text = read("docs/uncertainty.md");
  const rows = (start: string) => {
    const table = text.slice(text.indexOf(start));
    return table
      .split("\n")
      .filter((l) => /^\| \d/.test(l))
      .slice(0, 12)
      .map((l) => l.split("|").slice(1, -1).map((c) => c.trim()));
  };
  // A percentage as printed: one decimal, so within 0.05 points of the record (either rounding of a tie).
  const shows = (cell: string, fraction: number) => expect(Math.abs(parseFloat(cell) - 100 * fraction), cell).toBeLessThanOrEqual(0.05 + 1e-9);

  it("coverage of the censored-sample bounds (test/fixtures/censored_coverage.json)", () => {
    const record = JSON.parse(read("test/fixtures/censored_coverage.json"));
    const doc = rows("| N | censored (asked / realised)");
    expect(doc).toHaveLength(record.cases.length);
    record.cases.forEach((c: any, i: number) => {
      const [n, censored, otherModulus, modulus, charStrength, designStress] = doc[i];
      expect(Number(n)).toBe(c.specimens);
      const [asked, realised] = censored.split("/");
      expect(parseFloat(asked)).toBe(100 * c.censoredFraction);
      shows(realised, c.meanCensoredFraction);
      expect(Number(otherModulus)).toBe(c.otherShape);
      shows(modulus, c.modulus.coverage);
      shows(charStrength, c.charStrength.coverage);
      shows(designStress, c.designStress.coverage);
    });
  });

  it("size and power of the flaw-population checks (test/fixtures/population_checks_power.json)", () => {
    const record = JSON.parse(read("test/fixtures/population_checks_power.json"));
    const doc = rows("| N | samples drawn from");
    expect(doc).toHaveLength(record.rows.length);
    record.rows.forEach((r: any, i: number) => {
      const [n, scenario, ...checks] = doc[i];
      expect(Number(n)).toBe(r.specimens);
      expect(scenario).toBe(r.scenario);
      [r.mixtureCheck, r.plotBendCheck, r.andersonDarlingOsl].forEach((check, k) => {
        const [flagged, se] = checks[k].split("±");
        shows(flagged, check.flagged);
        shows(se, check.se);
      });
    });
  });
});

describe("docs/material-fit-and-planning.md: worked numbers", () => {
  const text = read("docs/material-fit-and-planning.md");

  it("the SPECIMENSNEEDED examples give the counts the page states", () => {
    const examples = [...flat(text).matchAll(/`=BRITTLE\.SPECIMENSNEEDED\(([^)]*)\)` is (\d+)/g)];
    expect(examples.length).toBe(2);
    for (const [, args, count] of examples) {
      expect(guarded.SPECIMENSNEEDED(...args.split(",").map(Number)), args).toBe(Number(count));
    }
  });

  it("BOUNDRATIOTABLE's sample sizes are the ones listed", () => {
    const listed = between(text, "spills the planned ratio for", ", with a header row").trim();
    const sizes = [...listed.matchAll(/\d+/g)].map((m) => Number(m[0]));
    expect(listed).toMatch(/^2 to 30 specimens and then /);
    expect([...Array.from({ length: 29 }, (_, i) => i + 2), ...sizes.slice(2)]).toEqual(PLANNING_SIZES);
    const table = guarded.BOUNDRATIOTABLE(10, 0.999) as unknown[][];
    expect(table.slice(1).map((r) => r[0])).toEqual(PLANNING_SIZES);
  });
});

describe("function signatures the documents write out", () => {
  const signature = (f: FunctionMetadata) => `(${f.parameters.map((p) => (p.optional ? `[${p.name}]` : p.name)).join(", ")})`;

  it("every `NAME(arguments)` written out in full is the function's signature", async () => {
    const byName = new Map((await generateMetadata()).functions.map((f) => [f.id, signature(f)]));
    let checked = 0;
    for (const doc of DOCS) {
      for (const [, name, args] of read(doc).matchAll(/`(?:BRITTLE\.)?([A-Z]{3,})(\([\w, [\]]*\))`/g)) {
        expect(byName.get(name), `${doc}: ${name}${args}`).toBe(args);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(5);
  });

  it("docs/signatures.md: each signature in its tables is the function's, for every function its row names", async () => {
    const byName = new Map((await generateMetadata()).functions.map((f) => [f.id, signature(f)]));
    let checked = 0;
    for (const line of read("docs/signatures.md").split("\n").filter((l) => l.startsWith("| `"))) {
      const cells = line.split(" | ");
      const names = [...cells[0].matchAll(/`([A-Z]+)`/g)].map((m) => m[1]);
      // The changed table's third column is the new signature; the reviewed table's second is the signature.
      const written = (cells.length >= 4 ? cells[2] : cells[1]).match(/^`(\([\w, [\]]*\))`/);
      if (!written) continue;
      // "(stress or survival, ...)" in a row of two functions: the first takes stress, the second survival.
      names.forEach((name, i) => {
        const own = written[1].replace(/(\w+) or (\w+)/, (_, a, b) => (i === 0 ? a : b));
        expect(byName.get(name), `${name}${own}`).toBe(own);
        checked++;
      });
    }
    expect(checked).toBeGreaterThan(15);
  });
});

describe("shapes and packages the documents state", () => {
  it("FIT spills the 21 rows README.md and docs/signatures.md give it", () => {
    expect(read("README.md")).toContain("mixture-check row (21 rows)");
    expect(read("docs/signatures.md")).toContain("(21 x 2 since the mixture-check row)");
    // Invented strengths (made-up numbers).
    const table = guarded.FIT([[412], [398], [455], [430], [387], [441], [402], [419], [366], [425]]) as unknown[][];
    expect(table).toHaveLength(21);
  });

  it("docs/deploy.md names every production dependency of the package", () => {
    const listed = between(read("docs/deploy.md"), "Installed with production dependencies only (", ")");
    const names = listed.split(/, | and /).map((n) => n.toLowerCase());
    const dependencies = Object.keys(JSON.parse(read("package.json")).dependencies);
    expect(names.sort()).toEqual(dependencies.sort());
  });

  it("docs/deploy.md names every example file the package ships, and the package file name", () => {
    const text = read("docs/deploy.md");
    const pkg = JSON.parse(read("package.json"));
    for (const file of pkg.files.filter((f: string) => f.startsWith("examples/"))) expect(text).toContain(`\`${file}\``);
    expect(text).toContain(`\`${pkg.name}-${pkg.version}.tgz\``);
  });
});

describe("docs/files-and-formats.md: the limits and lists it states", () => {
  const text = read("docs/files-and-formats.md");
  const number = (s: string) => Number(s.replace(/,/g, ""));
  const limit = (label: string) => {
    const row = text.split("\n").find((l) => l.startsWith(`| ${label}`));
    expect(row, label).toBeDefined();
    return row!.split("|")[2].trim();
  };

  it("the workbook size limits are the code's", () => {
    expect(number(limit("cells holding a value"))).toBe(MAX_CONTENT_CELLS);
    expect(limit("rows and columns of a sheet")).toMatch(new RegExp(`^${MAX_ROWS.toLocaleString("en-US")} and ${MAX_COLUMNS.toLocaleString("en-US")}`));
    expect(limit("one part of the `.xlsx` package")).toBe(`${MAX_PART_BYTES / 2 ** 20} MB`);
    expect(limit("the whole package")).toBe(`${MAX_PACKAGE_BYTES / 2 ** 20} MB`);
    expect(number(limit("cells spanned by the ranges"))).toBe(MAX_RANGE_CELLS);
  });

  it("the element table's longest line and the size read on two threads are the code's", () => {
    expect(flat(text)).toContain(`A line may be at most 1 MiB (${MAX_LINE_BYTES.toLocaleString("en-US")} bytes) long`);
    expect(MAX_LINE_BYTES).toBe(2 ** 20);
    expect(flat(text)).toContain(`A file of ${PARALLEL_MIN_BYTES / 2 ** 20} MiB or more is read on two threads`);
  });

  it("the built-ins that stay formulas in a written copy are the code's list", () => {
    const listed = between(text, "these built-ins, each of which computes from its arguments alone:", "; with cell");
    expect([...listed.matchAll(/`(\w+)`/g)].map((m) => m[1])).toEqual([...SAFE_BUILTINS]);
  });
});

describe("docs/design-check.md: the formula it offers to type", () => {
  it("the Explain example evaluates to a strength with `brittle calc` too", async () => {
    const formula = quoteAfter(read("docs/design-check.md"), "type a formula with numbers and array constants, for example");
    expect(formula).toMatch(/^=BRITTLE\.CHARSTRENGTH\(\{/);
    const { code, out } = await run(["calc", invented("explain.csv", `Formula\n"${formula.replace(/"/g, '""')}"\n`), "--json"]);
    expect(code).toBe(0);
    // Censored maximum likelihood for failures 412.5 and 455 with 398.1 censored (ASTM C1239 sec. 7 equations,
    // solved by bisection in Python): 444.804369376139.
    expect((Object.values(JSON.parse(out))[0] as unknown[][])[1][0]).toBeCloseTo(444.804369376139, 9);
  });
});

describe("docs/check-file.md: fields it marks required", () => {
  const text = read("docs/check-file.md");
  /** The fields marked "yes" in the table that follows `heading`. */
  const required = (heading: string) => {
    const from = text.indexOf(heading);
    expect(from).toBeGreaterThanOrEqual(0);
    const table = text.slice(from).split("\n\n").find((block) => block.startsWith("| field | required |"))!;
    return [...table.matchAll(/^\| `(\w+)` \| yes \|/gm)].map((m) => m[1]);
  };

  for (const [heading, example, path] of [
    ["## Fields", "examples/check-fail.check.json", []],
    ["### `lifetime`", "examples/check-lifetime-proof.check.json", ["lifetime"]],
  ] as const) {
    it(`${heading}: a file without a required field is refused, naming it in plain words`, async () => {
      const names = required(heading);
      expect(names.length).toBeGreaterThan(3);
      for (const name of names) {
        const file = JSON.parse(read(example));
        const holder = path.reduce((o, key) => o[key], file);
        delete holder[name];
        const { code, out } = await run(["check", invented("missing.check.json", JSON.stringify(file)), "--json"]);
        expect(code, name).toBe(2);
        const refusal = JSON.parse(out).error;
        expect(refusal.field, name).toBe([...path, name].join("."));
        expect(refusal.message, name).not.toMatch(/undefined|NaN|Infinity/);
      }
    });
  }
});
