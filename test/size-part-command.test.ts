// `brittle part`: the streamed table against numpy (effective_size.json parts),
// the report, JSON output, usage and data errors, and the wiring through the CLI.
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { main } from "../cli/cli";
import { runPartCommand } from "../cli/part-command";
import { fixture, relativeError } from "./helpers";

const ref = fixture("effective_size.json");
const dir = mkdtempSync(join(tmpdir(), "brittle-part-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function capture() {
  const io = { out: "", err: "", errIsTTY: false };
  return {
    io: { out: (t: string) => (io.out += t), err: (t: string) => (io.err += t), errIsTTY: false },
    text: io,
  };
}

// Invented test table: the seeded random stresses of effective_size.json parts[0].
const c = ref.parts[0];
const table = join(dir, "elements.csv");
const lines = ["elem,s1,s2,s3,ivol"];
for (let r = 0; r < c.sizes.length; r++) lines.push([1000 + r, ...c.stresses.slice(3 * r, 3 * r + 3), c.sizes[r]].join(","));
writeFileSync(table, lines.join("\n") + "\n");

describe("brittle part", () => {
  it("prints the effective size, failure probability and hot spots (numpy reference)", async () => {
    const { io, text } = capture();
    const sigma0 = 600;
    expect(await runPartCommand([table, "--modulus", String(c.shape), "--scale", String(sigma0), "--top", "3"], io)).toBe(0);
    expect(text.out).toMatch(/500 elements/);
    expect(text.out).toMatch(/stresses s1, s2, s3 \(principal\); size ivol; id elem/);
    const size = Number(/effective size\s+(\S+)/.exec(text.out)![1]);
    expect(relativeError(size, c.effectiveSizePIA)).toBeLessThan(1e-5); // printed to 6 digits
    const pf = Number(/failure prob\.\s+(\S+)/.exec(text.out)![1]);
    expect(relativeError(pf, -Math.expm1(-c.effectiveSizePIA * (c.peak / sigma0) ** c.shape))).toBeLessThan(1e-4);
    expect(text.out.match(/^\s+\d+\s+\d{4}\s+\d+\s/gm)?.length).toBe(3);
    expect(text.err).toBe("");
  });

  it("--json gives the full result", async () => {
    const { io, text } = capture();
    expect(await runPartCommand([table, "-m", String(c.shape), "--json", "--criterion", "MAXPRINCIPAL"], io)).toBe(0);
    const r = JSON.parse(text.out);
    expect(r.rows).toBe(500);
    expect(relativeError(r.effectiveSize, c.effectiveSizeMAX)).toBeLessThan(1e-12);
    expect(r.failureProbability).toBeNull();
    expect(r.hotSpots).toHaveLength(10);
    expect(r.hotSpots[0].id).toMatch(/^1\d{3}$/);
  });

  it("column choices by position and a headerless whitespace table", async () => {
    const plain = join(dir, "plain.txt");
    writeFileSync(plain, "7  0.5  x  200\n8  0.25  y  100\n");
    const { io, text } = capture();
    expect(await runPartCommand([plain, "--modulus", "2", "--stress", "4", "--size", "2", "--id", "1", "--json", "--delimiter", "space"], io)).toBe(0);
    const r = JSON.parse(text.out);
    expect(relativeError(r.effectiveSize, 0.5 + 0.25 * 0.25)).toBeLessThan(1e-15);
    expect(r.peakId).toBe("7");
  });

  it("a table of one element is counted in the singular", async () => {
    const one = join(dir, "one.csv");
    writeFileSync(one, "elem,s1,ivol\n1,100,2\n");
    const { io, text } = capture();
    expect(await runPartCommand([one, "--modulus", "10"], io)).toBe(0);
    expect(text.out).toMatch(/one\.csv: 1 element, header on line 1/);
  });

  it("usage errors exit 2 with the usage text", async () => {
    for (const args of [[table], ["--modulus", "10"], [table, "--modulus", "-1"], [table, "--modulus", "10", "--criterion", "X"], [table, "--modulus", "10", "--bogus"]]) {
      const { io, text } = capture();
      expect(await runPartCommand(args, io)).toBe(2);
      expect(text.err).toMatch(/usage: brittle part/);
    }
  });

  it("bad data exits 1 naming the line; a missing file exits 1", async () => {
    const bad = join(dir, "bad.csv");
    writeFileSync(bad, "s,vol\n100,1\n200,abc\n");
    const { io, text } = capture();
    expect(await runPartCommand([bad, "--modulus", "10"], io)).toBe(1);
    expect(text.err).toMatch(/line 3: the size field 2 \("abc"\) is not a number/);
    const missing = capture();
    expect(await runPartCommand([join(dir, "nope.csv"), "--modulus", "10"], missing.io)).toBe(1);
    expect(missing.text.err).toMatch(/ENOENT|no such file/);
  });

  it("is wired into the CLI as `brittle part`", async () => {
    const { io, text } = capture();
    expect(await main(["part", table, "--modulus", String(c.shape), "--quiet"], io)).toBe(0);
    expect(text.out).toMatch(/effective size/);
  });
});
