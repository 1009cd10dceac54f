// Element tables (src/size/part.ts, principal.ts, power-kernel.ts) and the
// streaming reader (part-stream.ts, csv-bytes.ts, part-columns.ts) against
// numpy (effective_size.json "parts", "principal": numpy.linalg.eigvalsh) and
// against Math.pow / Number().
import { describe, expect, it } from "vitest";
import { InputError } from "../src/errors";
import { NsaEvaluator } from "../src/size/criteria";
import { parseNumber } from "../src/size/csv-bytes";
import {
  partEffectiveSize,
  partFailureProbability,
  partRisk,
  partRiskShares,
  partRiskSum,
  principalFromTensors,
} from "../src/size/part";
import { resolveColumns } from "../src/size/part-columns";
import { PartTableReader, readPartTable } from "../src/size/part-stream";
import { MAX_TABLE_SHAPE, ScaledPower } from "../src/size/power-kernel";
import { principalStresses } from "../src/size/principal";
import { fixture, relativeError } from "./helpers";

const ref = fixture("effective_size.json");
const f64 = (xs: number[]) => Float64Array.from(xs);
const bytes = (text: string) => new TextEncoder().encode(text);

describe("principal stresses", () => {
  it("equal LAPACK's eigenvalues (numpy.linalg.eigvalsh) to a few ulp of the tensor norm", () => {
    const out = new Float64Array(3);
    ref.principal.tensors.forEach((t: number[], i: number) => {
      expect(principalStresses(t[0], t[1], t[2], t[3], t[4], t[5], out)).toBe(true);
      const norm = Math.max(...t.map(Math.abs));
      for (let k = 0; k < 3; k++) {
        expect(Math.abs(out[k] - ref.principal.eigenvalues[i][k])).toBeLessThanOrEqual(1e-14 * norm);
      }
    });
  });

  it("keep the invariants: trace and determinant", () => {
    const out = new Float64Array(3);
    principalStresses(120, -40, 15, 33, -7, 21, out);
    expect(out[0] + out[1] + out[2]).toBeCloseTo(95, 11);
    const det = 120 * (-40 * 15 - 49) - 33 * (33 * 15 - -7 * 21) + 21 * (33 * -7 - -40 * 21);
    expect(relativeError(out[0] * out[1] * out[2], det)).toBeLessThan(1e-12);
  });
});

describe("power kernel", () => {
  it("matches Math.pow to a few ulp x m over the whole range of stresses", () => {
    let seed = 7;
    const rnd = () => ((seed = (seed * 16807) % 2147483647) / 2147483647);
    for (const m of [0.7, 3, 10, 10.37, 47.5, 150]) {
      const peak = 412.7;
      const k = new ScaledPower(m, peak);
      let worst = 0;
      for (let i = 0; i < 20000; i++) {
        const x = peak * Math.exp(-rnd() * 12);
        const exact = Math.pow(x / peak, m);
        if (exact > 1e-300) worst = Math.max(worst, relativeError(k.of(x), exact));
      }
      expect(worst).toBeLessThan(4e-16 * Math.max(1, m) * 8);
      expect(relativeError(k.of(peak), 1)).toBeLessThan(1e-15 * Math.max(1, m));
      expect(k.of(0)).toBe(0);
      expect(k.of(-3)).toBe(0);
      expect(k.of(1e-310)).toBe(Math.pow(1e-310 / peak, m)); // subnormal: Math.pow fallback
    }
    // Above the table limit the kernel uses Math.pow itself.
    expect(new ScaledPower(MAX_TABLE_SHAPE * 2, 1).of(0.999)).toBe(Math.pow(0.999, MAX_TABLE_SHAPE * 2));
  });
});

describe("part risk sums against numpy", () => {
  it("effective size (PIA and MAXPRINCIPAL), peak and shares (effective_size.json parts)", () => {
    for (const c of ref.parts) {
      const table = { stresses: f64(c.stresses), columns: c.columns, sizes: f64(c.sizes), shape: c.shape };
      const risk = partRisk(table);
      expect(relativeError(risk.peak, c.peak)).toBeLessThan(1e-14);
      expect(relativeError(partEffectiveSize(table), c.effectiveSizePIA)).toBeLessThan(1e-12);
      expect(relativeError(partEffectiveSize({ ...table, criterion: "MAXPRINCIPAL" }), c.effectiveSizeMAX)).toBeLessThan(1e-12);
      const shares = partRiskShares(table);
      c.sharesPIA.forEach((s: number, i: number) => expect(Math.abs(shares[i] - s)).toBeLessThan(1e-14));
      expect(Math.abs(shares.reduce((a, b) => a + b, 0) - 1)).toBeLessThan(1e-12);
    }
  });

  it("failure probability = -expm1(-S_E (peak/sigma_0)^m), accurate at 1e-12", () => {
    const c = ref.parts[0];
    const table = { stresses: f64(c.stresses), columns: c.columns, sizes: f64(c.sizes), shape: c.shape };
    // Choose sigma_0 so the risk is 1e-12: sigma_0 = peak (S_E / 1e-12)^(1/m).
    const scale = c.peak * (c.effectiveSizePIA / 1e-12) ** (1 / c.shape);
    expect(relativeError(partFailureProbability({ ...table, materialScale: scale }), -Math.expm1(-1e-12))).toBeLessThan(1e-12);
    // Enormous risk: probability 1, never NaN.
    expect(partFailureProbability({ ...table, materialScale: 1e-30 })).toBe(1);
  });

  it("one column is uniaxial under every criterion; NSA on three columns uses the sphere average", () => {
    const stresses = f64([100, -20, 250, 0]);
    const sizes = f64([1, 2, 0.5, 3]);
    const pia = partEffectiveSize({ stresses, columns: 1, sizes, shape: 9 });
    expect(relativeError(pia, 1 * 0.4 ** 9 + 0.5)).toBeLessThan(1e-14);
    expect(partEffectiveSize({ stresses, columns: 1, sizes, shape: 9, criterion: "NSA" })).toBe(pia);
    const three = f64([200, 100, -50, 150, 150, 0]);
    const nsa = partEffectiveSize({ stresses: three, columns: 3, sizes: f64([1, 1]), shape: 6, criterion: "NSA" });
    const e = new NsaEvaluator(6);
    expect(relativeError(nsa, e.volume(1, 0.5, -0.25) + e.volume(0.75, 0.75, 0))).toBeLessThan(1e-14);
  });

  it("six tensor columns give the same answer as their principal stresses", () => {
    const c = ref.parts[2];
    const tensors = f64(c.stresses);
    const principal = principalFromTensors(tensors);
    const a = partEffectiveSize({ stresses: tensors, columns: 6, sizes: f64(c.sizes), shape: 12 });
    const b = partEffectiveSize({ stresses: principal, columns: 3, sizes: f64(c.sizes), shape: 12 });
    expect(a).toBe(b);
  });

  it("compression only: failure probability 0, effective size and shares undefined", () => {
    const table = { stresses: f64([-1, -2, 0]), columns: 1 as const, sizes: f64([1, 1, 1]), shape: 10 };
    expect(partFailureProbability({ ...table, materialScale: 300 })).toBe(0);
    expect(() => partEffectiveSize(table)).toThrow(/no element carries tensile stress/);
    expect(() => partRiskShares(table)).toThrow(InputError);
  });

  it("rejects non-finite stresses, negative sizes and mismatched rows", () => {
    expect(() => partRiskSum({ principal: f64([1, NaN]), stride: 1, sizes: f64([1, 1]), shape: 5 })).toThrow(/row 2/);
    expect(() => partRiskSum({ principal: f64([1, 2]), stride: 1, sizes: f64([1, -1]), shape: 5 })).toThrow(/row 2: the element size/);
    expect(() => partRiskSum({ principal: f64([1, 2, 3]), stride: 1, sizes: f64([1, 1]), shape: 5 })).toThrow(/rows/);
    // Rows of three principal stresses: the row is named whichever column holds the fault.
    expect(() => partRiskSum({ principal: f64([1, 2, 3, 4, 5, Infinity]), stride: 3, sizes: f64([1, 1]), shape: 5 })).toThrow(/row 2/);
    expect(() => partRiskSum({ principal: f64([1, 2, 3, 4, 5, 6]), stride: 3, sizes: f64([-1e-300, 1]), shape: 5 })).toThrow(
      /row 1: the element size/,
    );
  });

  it("the peak's row is the first that holds it, in any column; -0 is a valid size", () => {
    const principal = f64([5, -1, 2, 1, 9, -3, 9, 0, 0, -2, -2, -2]);
    const r = partRiskSum({ principal, stride: 3, sizes: f64([1, -0, 1, 1]), shape: 2 });
    expect(r.peak).toBe(9);
    expect(r.peakRow).toBe(1);
    const single = partRiskSum({ principal: f64([-1, 4, 4, 2]), stride: 1, sizes: f64([1, 1, 1, 1]), shape: 2 });
    expect([single.peak, single.peakRow]).toEqual([4, 1]);
    const compressed = partRiskSum({ principal: f64([-1, -4]), stride: 1, sizes: f64([1, 1]), shape: 2 });
    expect([compressed.peak, compressed.peakRow, compressed.effectiveSize]).toEqual([0, -1, 0]);
  });

  it("a million elements: the compensated sum matches a plain double-double check", () => {
    const n = 1 << 20;
    const p = new Float64Array(3 * n);
    const sizes = new Float64Array(n).fill(1e-3);
    for (let i = 0; i < 3 * n; i++) p[i] = 100 + (i % 997) * 0.1;
    const r = partRiskSum({ principal: p, stride: 3, sizes, shape: 10 });
    // Exact by grouping: each residue class of i mod 997 occurs a known number of times.
    const peak = 100 + 996 * 0.1;
    let exact = 0;
    for (let k = 0; k < 997; k++) {
      const count = Math.floor((3 * n - 1 - k) / 997) + 1;
      exact += count * Math.pow((100 + k * 0.1) / peak, 10);
    }
    expect(relativeError(r.effectiveSize, exact * 1e-3)).toBeLessThan(1e-13);
  });
});

describe("reading numbers from bytes", () => {
  it("agrees with Number() exactly, 17 significant digits included (more in test/size-number-bytes.test.ts)", () => {
    let seed = 11;
    const rnd = () => ((seed = (seed * 16807) % 2147483647) / 2147483647);
    for (let i = 0; i < 20000; i++) {
      const v = (rnd() - 0.3) * 10 ** Math.floor(rnd() * 30 - 15);
      const fixed = v.toFixed(4);
      const texts = [v.toPrecision(1 + Math.floor(rnd() * 15)), v.toExponential(Math.floor(rnd() * 14))];
      if (fixed.replace(/^[-0.]+/, "").replace(".", "").length <= 15) texts.push(fixed);
      for (const text of texts) {
        const b = bytes(text);
        expect(parseNumber(b, 0, b.length, -1)).toBe(Number(text));
      }
      const long = v.toPrecision(17);
      const b = bytes(long);
      expect(parseNumber(b, 0, b.length, -1)).toBe(Number(long));
    }
  });

  it("handles spaces, quotes, signs, decimal commas and rejects junk", () => {
    const p = (t: string, alt = -1) => {
      const b = bytes(t);
      return parseNumber(b, 0, b.length, alt);
    };
    expect(p('  "-1.5e3" ')).toBe(-1500);
    expect(p("+.25")).toBe(0.25);
    expect(p("3,75", 0x2c)).toBe(3.75);
    expect(p("1e-400")).toBe(0);
    for (const bad of ["", " ", "abc", "1.2.3", "1e", "--1", "NaN", "inf", "1e999", "12x"]) expect(p(bad)).toBeNaN();
  });
});

describe("element-table columns", () => {
  it("recognises tensor, principal and single stress headers, sizes and ids", () => {
    const t = resolveColumns(["Elem", "S_XX", "SYY", "szz", "SXY", "SYZ", "SXZ", "IVOL"], 8);
    expect(t.kind).toBe(6);
    expect(t.stress).toEqual([1, 2, 3, 4, 5, 6]);
    expect(t.size).toBe(7);
    expect(t.id).toBe(0);
    const p = resolveColumns(["S3", "S1", "S2", "Volume"], 4);
    expect(p.stress).toEqual([1, 2, 0]);
    expect(p.id).toBe(-1);
    const s = resolveColumns(["id", "Max Principal", "area"], 3);
    expect(s.kind).toBe(1);
  });

  it("by count without a header, explicit choices by name or position", () => {
    expect(resolveColumns(null, 5)).toMatchObject({ id: 0, stress: [1, 2, 3], size: 4, kind: 3 });
    expect(resolveColumns(null, 2)).toMatchObject({ id: -1, stress: [0], size: 1 });
    expect(() => resolveColumns(null, 6)).toThrow(/needs --stress and --size/);
    expect(resolveColumns(null, 6, { stress: [2, 3, 4], size: 6, id: null })).toMatchObject({ stress: [1, 2, 3], size: 5, id: -1 });
    expect(resolveColumns(["a", "b", "c"], 3, { stress: ["B"], size: "c" })).toMatchObject({ stress: [1], size: 2 });
    expect(() => resolveColumns(["a", "b"], 2, { stress: ["x"], size: "b" })).toThrow(/not in the header/);
    expect(() => resolveColumns(["a", "b", "c"], 3, { stress: ["a", "b"], size: "c" })).toThrow(/1, 3 or 6/);
    expect(() => resolveColumns(["x", "y"], 2)).toThrow(/no stress columns/);
  });
});

describe("streaming reader", () => {
  const c = ref.parts[0];
  const rows = c.sizes.length;
  const csv = ["elem,s1,s2,s3,vol"];
  for (let r = 0; r < rows; r++) csv.push([r + 1, ...c.stresses.slice(3 * r, 3 * r + 3).map(String), String(c.sizes[r])].join(","));
  const text = csv.join("\r\n") + "\r\n";

  it("agrees with numpy and the in-memory sum whatever the chunking", async () => {
    const data = bytes(text);
    for (const chunk of [1, 7, 64, 100000]) {
      const chunks: Uint8Array[] = [];
      for (let i = 0; i < data.length; i += chunk) chunks.push(data.subarray(i, i + chunk));
      const res = await readPartTable(chunks, { shape: c.shape, batchRows: 37, top: 5 });
      expect(res.rows).toBe(rows);
      expect(res.skippedLines).toBe(1);
      expect(relativeError(res.effectiveSize, c.effectiveSizePIA)).toBeLessThan(1e-12);
      expect(res.peak).toBe(c.peak);
      // Hot spots: the five largest shares, in order, with their ids and lines.
      const shares = partRiskShares({ stresses: f64(c.stresses), columns: 3, sizes: f64(c.sizes), shape: c.shape });
      const order = [...shares.keys()].sort((a, b) => shares[b] - shares[a]).slice(0, 5);
      expect(res.hotSpots.map((h) => h.id)).toEqual(order.map((i) => String(i + 1)));
      expect(res.hotSpots.map((h) => h.line)).toEqual(order.map((i) => i + 2));
      res.hotSpots.forEach((h, k) => expect(Math.abs(h.share - shares[order[k]])).toBeLessThan(1e-14));
    }
  });

  it("failure probability with a material scale; semicolons, decimal commas, comments and blank lines", async () => {
    const euro = ["# invented test table", "id;s;v", "1;100,5;2", "", ";;", "2;-40;1", "3;250;0,5"].join("\n");
    const res = await readPartTable([bytes(euro)], { shape: 8, materialScale: 400 });
    expect(res.delimiter).toBe(";");
    expect(res.rows).toBe(3);
    const S = 2 * (100.5 / 250) ** 8 + 0.5;
    expect(relativeError(res.effectiveSize, S)).toBeLessThan(1e-14);
    expect(relativeError(res.failureProbability!, -Math.expm1(-S * (250 / 400) ** 8))).toBeLessThan(1e-13);
    expect(res.peakId).toBe("3");
  });

  it("whitespace-aligned tables without a header", async () => {
    const res = await readPartTable([bytes("  1   200.0   0.1\n  2   100.0   0.2\n")], { shape: 4, delimiter: "space" });
    expect(res.columns.id).toBe(0);
    expect(relativeError(res.effectiveSize, 0.1 + 0.2 / 16)).toBeLessThan(1e-15);
  });

  it("stops at the first bad line with its number", async () => {
    // The reader reads up to 200 lines ahead to settle the dialect, so a short table's error surfaces at finish().
    const read = (text: string) => () => {
      const reader = new PartTableReader({ shape: 10 });
      reader.push(bytes(text));
      reader.finish();
    };
    expect(read("s,v\n1,2\n3,x\n")).toThrow(/line 3: the size field 2 \("x"\) is not a number/);
    expect(read("a,s1,s2,s3,v\n1,2,3,4,5\n1,2\n")).toThrow(/line 3: expected at least 5 fields/);
    expect(read("s,v\n1,-2\n")).toThrow(/line 2: the element size must be >= 0/);
    expect(() => new PartTableReader({ shape: 10 }).finish()).toThrow(/empty/);
  });

  it("six tensor columns are turned into principal stresses", async () => {
    const t = ref.parts[2];
    const lines = ["SXX,SYY,SZZ,SXY,SYZ,SZX,VOL"];
    for (let r = 0; r < t.sizes.length; r++) lines.push([...t.stresses.slice(6 * r, 6 * r + 6), t.sizes[r]].join(","));
    const res = await readPartTable([bytes(lines.join("\n"))], { shape: t.shape });
    expect(res.columns.kind).toBe(6);
    expect(relativeError(res.effectiveSize, t.effectiveSizePIA)).toBeLessThan(1e-12);
  });
});
