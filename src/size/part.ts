/**
 * A part's failure probability, effective size and hot spots from a table of
 * element stresses (ASTM C1683 Annex A3 approach; docs/methods.md section 6):
 *
 *   Pf   = 1 - exp(-sum_e V_e I_e(s_e / sigma_0))
 *   S_E  = sum_e V_e I_e(s_e / s_max)          (effective size at the peak)
 *   Pf   = 1 - exp(-S_E (s_max / sigma_0)^m)   (the same thing, computed this way)
 *   share_e = V_e I_e(s_e / s_max) / S_E
 *
 * I_e is the criterion's intensity (criteria.ts) of the element's principal
 * stresses; compressive stresses contribute nothing. V_e are element
 * volumes (with sigma_0V) or areas (with sigma_0S): surface and volume
 * elements go in separate tables with their own scale parameters, and their
 * risks add (README).
 *
 * Stresses come as one column (maximum principal, counted as uniaxial),
 * three (principal stresses, any order) or six (tensor sxx, syy, szz, sxy,
 * syz, szx; principal stresses by principal.ts). Sums are compensated; the
 * stresses are divided by s_max before the power, so nothing overflows.
 */
import { ensure, ensureApplicable, ensurePositive, InputError, notRepresentable } from "../errors";
import { type Criterion, NsaEvaluator } from "./criteria";
import { type CompensatedTotal, ScaledPower, additionError, newTotal, totalValue } from "./power-kernel";
import { principalStresses } from "./principal";

export type StressColumns = 1 | 3 | 6;

export interface PartRiskInput {
  /** Principal stresses, row-major: stride 3 (s1, s2, s3 in any order) or stride 1 (maximum principal). */
  principal: Float64Array;
  stride: 1 | 3;
  /** Element volumes or areas, one per row (>= 0). */
  sizes: Float64Array;
  /** Weibull modulus m. */
  shape: number;
  /** Multiaxial criterion; default "PIA". */
  criterion?: Criterion;
}

export interface PartRiskSum {
  /** Largest tensile principal stress in the table; 0 if nothing is in tension. */
  peak: number;
  /** Row (0-based) holding the peak; -1 if none. */
  peakRow: number;
  /** sum_e V_e I_e(s_e / peak): the part's effective size referenced to uniaxial tension at the peak. */
  effectiveSize: number;
  rows: number;
}

/** Checks finiteness and sizes, returns the peak tensile stress and its row. */
function scan(principal: Float64Array, stride: number, sizes: Float64Array): { peak: number; peakRow: number } {
  const rows = sizes.length;
  if (principal.length !== rows * stride) {
    throw new InputError("input", `stresses have ${principal.length / stride} rows but sizes have ${rows}`);
  }
  // One branch-free pass: x * 0 is 0 for finite x and NaN otherwise, so `bad` turns NaN at the
  // first non-finite value, and the smallest size tells a negative one; only then does the slow
  // pass below run, to name the row. A running maximum per column (no compare-and-branch, which
  // mispredicts on mixed-sign columns); the peak's row is found afterwards, the first that holds it.
  let bad = 0;
  let smallestSize = 0;
  let peak = 0;
  if (stride === 3) {
    let top0 = 0;
    let top1 = 0;
    let top2 = 0;
    for (let r = 0; r < rows; r++) {
      const a = principal[3 * r];
      const b = principal[3 * r + 1];
      const c = principal[3 * r + 2];
      const s = sizes[r];
      bad += a * 0 + b * 0 + c * 0 + s * 0;
      smallestSize = Math.min(smallestSize, s);
      top0 = Math.max(top0, a);
      top1 = Math.max(top1, b);
      top2 = Math.max(top2, c);
    }
    peak = Math.max(top0, top1, top2);
  } else {
    for (let r = 0; r < rows; r++) {
      const a = principal[r];
      const s = sizes[r];
      bad += a * 0 + s * 0;
      smallestSize = Math.min(smallestSize, s);
      peak = Math.max(peak, a);
    }
  }
  if (bad !== 0 || smallestSize < 0) scanSlowly(principal, stride, sizes);
  let peakRow = -1;
  if (peak > 0) {
    let i = 0;
    while (principal[i] !== peak) i++;
    peakRow = Math.floor(i / stride);
  }
  return { peak, peakRow };
}

/** The first non-finite stress or bad size, named. */
function scanSlowly(principal: Float64Array, stride: number, sizes: Float64Array): void {
  for (let i = 0; i < principal.length; i++) {
    const v = principal[i];
    if (v - v !== 0) throw new InputError("input", `row ${Math.floor(i / stride) + 1}: a stress is not a finite number`);
  }
  for (let r = 0; r < sizes.length; r++) {
    const s = sizes[r];
    if (!(s >= 0 && s < Infinity)) throw new InputError("input", `row ${r + 1}: the element size must be a finite number >= 0 (got ${s})`);
  }
}

/**
 * The risk sum over a table of principal stresses: the fast core behind
 * every part function (and the benchmark's entry point). PIA and
 * MAXPRINCIPAL use the table-driven power kernel; NSA evaluates the sphere
 * average per element (about 10-50 us each).
 */
export function partRiskSum({ principal, stride, sizes, shape, criterion = "PIA" }: PartRiskInput): PartRiskSum {
  ensurePositive(shape, "modulus");
  ensure(stride === 1 || stride === 3, () => `stride must be 1 or 3 (got ${stride})`);
  const rows = sizes.length;
  const { peak, peakRow } = scan(principal, stride, sizes);
  if (peak === 0) return { peak: 0, peakRow: -1, effectiveSize: 0, rows };
  const total = newTotal();
  accumulate(principal, stride, sizes, 0, rows, shape, criterion, peak, total);
  return { peak, peakRow, effectiveSize: totalValue(total), rows };
}

/** Adds rows [start, end) to a running total at reference stress `peak`. Shared with the streaming reader. */
export function accumulate(
  principal: Float64Array,
  stride: number,
  sizes: Float64Array,
  start: number,
  end: number,
  shape: number,
  criterion: Criterion,
  peak: number,
  total: CompensatedTotal,
  power: ScaledPower = new ScaledPower(shape, peak),
  nsa: NsaEvaluator | null = null,
  visit: ((row: number, term: number) => void) | null = null,
  threshold: () => number = () => Infinity,
): void {
  if (criterion === "NSA" && stride === 3) {
    const evaluator = nsa ?? new NsaEvaluator(shape);
    const inv = 1 / peak;
    let sum = total.sum;
    let comp = total.compensation;
    let limit = visit ? threshold() : Infinity;
    for (let row = start; row < end; row++) {
      const b = row * 3;
      const intensity = evaluator.volume(principal[b] * inv, principal[b + 1] * inv, principal[b + 2] * inv);
      if (intensity > 0) {
        const term = intensity * sizes[row];
        const t = sum + term;
        comp += additionError(sum, term, t);
        sum = t;
        if (term > limit && visit) {
          visit(row, term);
          limit = threshold();
        }
      }
    }
    total.sum = sum;
    total.compensation = comp;
    return;
  }
  // One column is uniaxial: every criterion gives <s>^m.
  const mode = criterion === "MAXPRINCIPAL" ? "MAX" : "PIA";
  power.sumRows(principal, stride, sizes, start, end, mode, total, visit, threshold);
}

/** Principal stresses (stride 3, largest first) of a row-major table of tensors sxx, syy, szz, sxy, syz, szx. */
export function principalFromTensors(tensors: Float64Array): Float64Array {
  ensure(tensors.length % 6 === 0, "a tensor table needs six columns");
  const rows = tensors.length / 6;
  const out = new Float64Array(rows * 3);
  for (let r = 0; r < rows; r++) {
    const b = r * 6;
    for (let k = 0; k < 6; k++) {
      const v = tensors[b + k];
      if (v - v !== 0) throw new InputError("input", `row ${r + 1}: a stress component is not a finite number`);
    }
    principalStresses(tensors[b], tensors[b + 1], tensors[b + 2], tensors[b + 3], tensors[b + 4], tensors[b + 5], out, r * 3);
  }
  return out;
}

export interface PartTable {
  /** Row-major stresses with `columns` values per element. */
  stresses: Float64Array;
  /** 1: maximum principal; 3: principal stresses; 6: tensor sxx, syy, szz, sxy, syz, szx. */
  columns: StressColumns;
  /** Element volumes or areas, one per row. */
  sizes: Float64Array;
  shape: number;
  criterion?: Criterion;
}

function asPrincipal(table: PartTable): { principal: Float64Array; stride: 1 | 3 } {
  switch (table.columns) {
    case 1:
      return { principal: table.stresses, stride: 1 };
    case 3:
      return { principal: table.stresses, stride: 3 };
    case 6:
      return { principal: principalFromTensors(table.stresses), stride: 3 };
    default:
      throw new InputError("input", `stresses need 1, 3 or 6 columns (got ${String(table.columns)})`);
  }
}

/**
 * Why a table whose tensile elements all have size 0 is refused: its effective size and failure
 * probability would come out 0, a pass for any stress, while the cause is nearly always the export
 * (sizes rounded to 0 by too few digits, or the wrong column).
 */
export const NO_SIZE_IN_TENSION =
  "every element in tension has size 0, so the effective size is 0 (and the failure probability would be 0): " +
  "sizes printed with too few digits (volumes in m^3 in a fixed format?), or the wrong size column? Export the sizes with more digits or in a smaller unit";

/** The risk sum of a table given as 1, 3 or 6 stress columns. */
export function partRisk(table: PartTable): PartRiskSum {
  const { principal, stride } = asPrincipal(table);
  return partRiskSum({ principal, stride, sizes: table.sizes, shape: table.shape, criterion: table.criterion });
}

/** Effective size of the part referenced to uniaxial tension at its peak stress. */
export function partEffectiveSize(table: PartTable): number {
  const risk = partRisk(table);
  ensureApplicable(risk.peak > 0, "no element carries tensile stress, so the effective size is undefined");
  return risk.effectiveSize;
}

/** Risk of rupture sum_e V_e I_e(s_e/sigma_0) from a risk sum, without overflow. */
export function riskOfRupture(risk: PartRiskSum, shape: number, materialScale: number): number {
  ensurePositive(materialScale, "material scale");
  if (risk.peak === 0 || risk.effectiveSize === 0) return 0;
  return Math.exp(Math.log(risk.effectiveSize) + shape * Math.log(risk.peak / materialScale));
}

/** Failure probability of the part: -expm1(-risk), accurate at tiny probabilities. */
export function partFailureProbability(table: PartTable & { materialScale: number }): number {
  const risk = partRisk(table);
  const pf = -Math.expm1(-riskOfRupture(risk, table.shape, table.materialScale));
  // With tension somewhere the probability is positive: 0 then is an underflow, an error rather than a probability.
  if (pf === 0 && risk.peak > 0 && risk.effectiveSize > 0) throw notRepresentable("failure probability", "small");
  return pf;
}

/** Each element's share of the part's risk (sums to 1). */
export function partRiskShares(table: PartTable): Float64Array {
  const { principal, stride } = asPrincipal(table);
  const { peak } = scan(principal, stride, table.sizes);
  ensureApplicable(peak > 0, "no element carries tensile stress, so there is no risk to share");
  const rows = table.sizes.length;
  const terms = new Float64Array(rows);
  const criterion = table.criterion ?? "PIA";
  const power = new ScaledPower(table.shape, peak);
  const nsa = criterion === "NSA" && stride === 3 ? new NsaEvaluator(table.shape) : null;
  const total = newTotal();
  const visit = (row: number, term: number) => {
    terms[row] = term;
  };
  // Threshold 0 visits every element with a positive term.
  accumulate(principal, stride, table.sizes, 0, rows, table.shape, criterion, peak, total, power, nsa, visit, () => 0);
  const inv = 1 / totalValue(total);
  for (let r = 0; r < rows; r++) terms[r] *= inv;
  return terms;
}
