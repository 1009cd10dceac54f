/**
 * Cell adapters for effective volume and area: test fixtures, standard
 * specimens and parts from element tables. Each reads its cells through
 * cells.ts and calls the core in src/size; the JSDoc here is the source of
 * functions.json (custom-functions-metadata).
 *
 * Element tables follow the cell policy with one difference the data needs:
 * stresses may be negative (compression). A row whose stress and size cells
 * are all blank or zero is skipped; a blank stress cell beside a size counts
 * as 0 (desktop hosts pass empty cells as 0, so the web must agree); a blank
 * or zero size beside stresses is #VALUE! (a missing size would hide risk).
 *
 * Only adapters are exported: the registry registers every export.
 */
import { CRITERIA, type Criterion } from "../src/size/criteria";
import { pistonOnBallsArea, pistonOnBallsVolume, ringOnRingArea, ringOnRingVolume } from "../src/size/disk";
import { barFlexureArea, barFlexureVolume, rodFlexureArea, rodFlexureVolume } from "../src/size/flexure";
import { type PartTable, type StressColumns, partEffectiveSize, partFailureProbability, partRiskShares } from "../src/size/part";
import { specimenEffectiveSize } from "../src/size/presets";
import { CellError, asRange, readChoice, readNumber, type CellValue } from "./cells";
import { declareSpills } from "./spill-shapes";

declareSpills({
  RISKSHARE: { rows: { rowsOf: 0 }, cols: 1 },
});

function readCriterion(value: unknown): Criterion {
  return readChoice(value, "criterion", CRITERIA, "PIA");
}

function isBlank(v: unknown): boolean {
  return v === null || v === undefined || v === 0 || (typeof v === "string" && v.trim() === "");
}

interface CellTable {
  stresses: Float64Array;
  columns: StressColumns;
  sizes: Float64Array;
  /** Row of the range each kept element came from. */
  rowOf: number[];
  rows: number;
}

/** Reads a stress range (1, 3 or 6 columns) and a size column of the same rows. */
function readElementTable(stressCells: unknown, sizeCells: unknown): CellTable {
  const stresses = asRange(stressCells, "stresses");
  const sizes = asRange(sizeCells, "sizes");
  const rows = stresses.length;
  const cols = stresses[0].length;
  if (cols !== 1 && cols !== 3 && cols !== 6) {
    throw new CellError(
      "#VALUE!",
      `stresses need 1 (maximum principal), 3 (principal) or 6 (sxx, syy, szz, sxy, syz, szx) columns (got ${cols})`,
    );
  }
  if (sizes.length !== rows || sizes[0].length !== 1) {
    throw new CellError(
      "#VALUE!",
      `sizes (${sizes.length} x ${sizes[0].length}) must be one column with as many rows as stresses (${rows})`,
    );
  }
  const kept: number[] = [];
  const values: number[] = [];
  const sizeValues: number[] = [];
  for (let r = 0; r < rows; r++) {
    const row = stresses[r];
    if (row.length !== cols) throw new CellError("#VALUE!", "stresses must be a rectangular range");
    const size = sizes[r][0];
    if (isBlank(size) && row.every(isBlank)) continue;
    for (let c = 0; c < cols; c++) {
      const v = row[c];
      if (isBlank(v)) {
        values.push(0);
        continue;
      }
      const where = cols > 1 ? `stresses, row ${r + 1} column ${c + 1}` : `stresses, row ${r + 1}`;
      if (typeof v !== "number") throw new CellError("#VALUE!", `${where} is not a number`);
      if (!Number.isFinite(v)) throw new CellError("#VALUE!", `${where} is too large to represent`);
      values.push(v);
    }
    // A blank or zero size beside stresses is a missing element size, not a zero one.
    if (isBlank(size)) throw new CellError("#VALUE!", `sizes, row ${r + 1} is blank or zero beside stresses`);
    if (typeof size !== "number") throw new CellError("#VALUE!", `sizes, row ${r + 1} is not a number`);
    if (!Number.isFinite(size)) throw new CellError("#VALUE!", `sizes, row ${r + 1} is too large to represent`);
    if (size < 0) throw new CellError("#VALUE!", `sizes, row ${r + 1} is negative`);
    sizeValues.push(size);
    kept.push(r);
  }
  if (kept.length === 0) throw new CellError("#VALUE!", "the element table is empty");
  return {
    stresses: Float64Array.from(values),
    columns: cols as StressColumns,
    sizes: Float64Array.from(sizeValues),
    rowOf: kept,
    rows,
  };
}

function partTable(stresses: unknown, sizes: unknown, modulus: unknown, criterion: unknown): PartTable & { cells: CellTable } {
  const cells = readElementTable(stresses, sizes);
  return {
    cells,
    stresses: cells.stresses,
    columns: cells.columns,
    sizes: cells.sizes,
    shape: readNumber(modulus, "modulus"),
    criterion: readCriterion(criterion),
  };
}

function spans(modulus: unknown, outerSpan: unknown, innerSpan: unknown) {
  return {
    shape: readNumber(modulus, "modulus"),
    outerSpan: readNumber(outerSpan, "outerSpan"),
    innerSpan: readNumber(innerSpan, "innerSpan"),
  };
}

/**
 * Effective volume of a rectangular bar in three- or four-point flexure: V_E = b d (m Li + L) / (2 (m+1)^2)
 * (beam theory, ASTM C1683), referenced to the peak stress. Example: =BRITTLE.FLEXVOLUME(10, 40, 20, 4, 3) is about
 * 11.90 (mm^3, ASTM C1161 configuration B in four-point flexure at m = 10).
 * @customfunction
 * @param modulus Weibull modulus m (dimensionless, > 0).
 * @param outerSpan Outer (support) span L (length unit, > 0).
 * @param innerSpan Inner (load) span Li (same unit, 0 for three-point flexure, shorter than outerSpan).
 * @param width Width b of the tensile face (same unit, > 0).
 * @param depth Depth d in the direction of the load (same unit, > 0).
 * @returns Effective volume, in length unit^3.
 */
export function FLEXVOLUME(modulus: number, outerSpan: number, innerSpan: number, width: number, depth: number): number {
  return barFlexureVolume({ ...spans(modulus, outerSpan, innerSpan), width: readNumber(width, "width"), depth: readNumber(depth, "depth") });
}

/**
 * Effective area of a rectangular bar in three- or four-point flexure, tensile face plus the tensile halves of both
 * side faces: S_E = ((m Li + L)/(m+1)) (b + d/(m+1)) (ASTM C1683). Example: =BRITTLE.FLEXAREA(10, 40, 20, 4, 3) is
 * about 93.22 (mm^2).
 * @customfunction
 * @param modulus Weibull modulus m (dimensionless, > 0).
 * @param outerSpan Outer (support) span L (length unit, > 0).
 * @param innerSpan Inner (load) span Li (same unit, 0 for three-point flexure, shorter than outerSpan).
 * @param width Width b of the tensile face (same unit, > 0).
 * @param depth Depth d in the direction of the load (same unit, > 0).
 * @returns Effective area, in length unit^2.
 */
export function FLEXAREA(modulus: number, outerSpan: number, innerSpan: number, width: number, depth: number): number {
  return barFlexureArea({ ...spans(modulus, outerSpan, innerSpan), width: readNumber(width, "width"), depth: readNumber(depth, "depth") });
}

/**
 * Effective volume of a round rod in three- or four-point flexure (beam theory, integrated over the circular section).
 * Example: =BRITTLE.RODFLEXVOLUME(10, 40, 20, 5) is about 8.786 (mm^3).
 * @customfunction
 * @param modulus Weibull modulus m (dimensionless, > 0).
 * @param outerSpan Outer (support) span L (length unit, > 0).
 * @param innerSpan Inner (load) span Li (same unit, 0 for three-point flexure, shorter than outerSpan).
 * @param diameter Rod diameter (same unit, > 0).
 * @returns Effective volume, in length unit^3.
 */
export function RODFLEXVOLUME(modulus: number, outerSpan: number, innerSpan: number, diameter: number): number {
  return rodFlexureVolume({ ...spans(modulus, outerSpan, innerSpan), diameter: readNumber(diameter, "diameter") });
}

/**
 * Effective area of a round rod in three- or four-point flexure (its tensile half-perimeter along the span).
 * Example: =BRITTLE.RODFLEXAREA(10, 40, 20, 5) is about 42.17 (mm^2).
 * @customfunction
 * @param modulus Weibull modulus m (dimensionless, > 0).
 * @param outerSpan Outer (support) span L (length unit, > 0).
 * @param innerSpan Inner (load) span Li (same unit, 0 for three-point flexure, shorter than outerSpan).
 * @param diameter Rod diameter (same unit, > 0).
 * @returns Effective area, in length unit^2.
 */
export function RODFLEXAREA(modulus: number, outerSpan: number, innerSpan: number, diameter: number): number {
  return rodFlexureArea({ ...spans(modulus, outerSpan, innerSpan), diameter: readNumber(diameter, "diameter") });
}

function disk(modulus: unknown, supportDiameter: unknown, diskDiameter: unknown, poisson: unknown, criterion: unknown) {
  return {
    shape: readNumber(modulus, "modulus"),
    supportDiameter: readNumber(supportDiameter, "supportDiameter"),
    diskDiameter: readNumber(diskDiameter, "diskDiameter"),
    poisson: readNumber(poisson, "poisson"),
    criterion: readCriterion(criterion),
  };
}

/**
 * Effective area of a ring-on-ring disk (ASTM C1499 plate-theory field, overhang included), both faces, the rim left
 * out, referenced to uniaxial tension at the peak stress: under "PIA" the equibiaxial region inside the load ring
 * counts twice. Example: =BRITTLE.RINGAREA(10, 10, 20, 25, 0.25) is about 195.5 (mm^2).
 * @customfunction
 * @param modulus Weibull modulus m (dimensionless, > 0).
 * @param loadDiameter Load ring diameter D_L (length unit, > 0, smaller than supportDiameter).
 * @param supportDiameter Support ring diameter D_S (same unit, not larger than diskDiameter).
 * @param diskDiameter Disk diameter D (same unit).
 * @param poisson Poisson's ratio of the material, between -1 and 0.5.
 * @param [criterion] Multiaxial criterion: "PIA" (default), "NSA" or "MAXPRINCIPAL".
 * @returns Effective area, in length unit^2.
 */
export function RINGAREA(
  modulus: number,
  loadDiameter: number,
  supportDiameter: number,
  diskDiameter: number,
  poisson: number,
  criterion?: string,
): number {
  return ringOnRingArea({ ...disk(modulus, supportDiameter, diskDiameter, poisson, criterion), loadDiameter: readNumber(loadDiameter, "loadDiameter") });
}

/**
 * Effective volume of a ring-on-ring disk (ASTM C1499 plate-theory field, overhang included), referenced to uniaxial
 * tension at the peak stress. Example: =BRITTLE.RINGVOLUME(10, 10, 20, 25, 1, 0.25) is about 8.888 (mm^3).
 * @customfunction
 * @param modulus Weibull modulus m (dimensionless, > 0).
 * @param loadDiameter Load ring diameter D_L (length unit, > 0, smaller than supportDiameter).
 * @param supportDiameter Support ring diameter D_S (same unit, not larger than diskDiameter).
 * @param diskDiameter Disk diameter D (same unit).
 * @param thickness Disk thickness h (same unit, > 0; plate theory wants h well below the support diameter).
 * @param poisson Poisson's ratio of the material, between -1 and 0.5.
 * @param [criterion] Multiaxial criterion: "PIA" (default), "NSA" or "MAXPRINCIPAL".
 * @returns Effective volume, in length unit^3.
 */
export function RINGVOLUME(
  modulus: number,
  loadDiameter: number,
  supportDiameter: number,
  diskDiameter: number,
  thickness: number,
  poisson: number,
  criterion?: string,
): number {
  return ringOnRingVolume({
    ...disk(modulus, supportDiameter, diskDiameter, poisson, criterion),
    loadDiameter: readNumber(loadDiameter, "loadDiameter"),
    thickness: readNumber(thickness, "thickness"),
  });
}

/**
 * Effective area of a piston-on-three-balls disk (ISO 6872 model: uniform pressure under the piston, the ball circle
 * as a ring support, free overhang), both faces, rim left out, referenced to uniaxial tension at the peak stress.
 * Example: =BRITTLE.PISTONAREA(10, 1.4, 10, 14, 0.25) is about 1.732 (mm^2).
 * @customfunction
 * @param modulus Weibull modulus m (dimensionless, > 0).
 * @param pistonDiameter Diameter of the flat piston face (length unit, > 0, smaller than supportDiameter).
 * @param supportDiameter Diameter of the circle through the three support balls (same unit, not larger than diskDiameter).
 * @param diskDiameter Disk diameter (same unit).
 * @param poisson Poisson's ratio of the material, between -1 and 0.5.
 * @param [criterion] Multiaxial criterion: "PIA" (default), "NSA" or "MAXPRINCIPAL".
 * @returns Effective area, in length unit^2.
 */
export function PISTONAREA(
  modulus: number,
  pistonDiameter: number,
  supportDiameter: number,
  diskDiameter: number,
  poisson: number,
  criterion?: string,
): number {
  return pistonOnBallsArea({
    ...disk(modulus, supportDiameter, diskDiameter, poisson, criterion),
    pistonDiameter: readNumber(pistonDiameter, "pistonDiameter"),
  });
}

/**
 * Effective volume of a piston-on-three-balls disk (ISO 6872 model), referenced to uniaxial tension at the peak
 * stress. Example: =BRITTLE.PISTONVOLUME(10, 1.4, 10, 14, 1.2, 0.25) is about 0.0945 (mm^3).
 * @customfunction
 * @param modulus Weibull modulus m (dimensionless, > 0).
 * @param pistonDiameter Diameter of the flat piston face (length unit, > 0, smaller than supportDiameter).
 * @param supportDiameter Diameter of the circle through the three support balls (same unit, not larger than diskDiameter).
 * @param diskDiameter Disk diameter (same unit).
 * @param thickness Disk thickness (same unit, > 0).
 * @param poisson Poisson's ratio of the material, between -1 and 0.5.
 * @param [criterion] Multiaxial criterion: "PIA" (default), "NSA" or "MAXPRINCIPAL".
 * @returns Effective volume, in length unit^3.
 */
export function PISTONVOLUME(
  modulus: number,
  pistonDiameter: number,
  supportDiameter: number,
  diskDiameter: number,
  thickness: number,
  poisson: number,
  criterion?: string,
): number {
  return pistonOnBallsVolume({
    ...disk(modulus, supportDiameter, diskDiameter, poisson, criterion),
    pistonDiameter: readNumber(pistonDiameter, "pistonDiameter"),
    thickness: readNumber(thickness, "thickness"),
  });
}

/**
 * Effective volume (mm^3) or area (mm^2) of a standard specimen configuration: "C1161-A-3PT" ... "C1161-C-4PT"
 * (ASTM C1161 bars), "C1499-20/10", "C1499-40/20" (ring-on-ring), "ISO6872-P3B", "F394-P3B" (piston-on-three-balls).
 * docs/methods.md section 5 lists every dimension and its source. Example: =BRITTLE.SPECIMEN("C1161-B-4PT", 10) is about 11.90.
 * @customfunction
 * @param configuration Configuration name (case, spaces and hyphens ignored), e.g. "C1161-B-4PT".
 * @param modulus Weibull modulus m (dimensionless, > 0).
 * @param [flaws] "VOLUME" (default) for volume-distributed flaws, "SURFACE" for surface flaws.
 * @param [poisson] Poisson's ratio, between -1 and 0.5: required for the disk configurations.
 * @param [criterion] Multiaxial criterion for the disk configurations: "PIA" (default), "NSA" or "MAXPRINCIPAL".
 * @returns Effective volume in mm^3, or effective area in mm^2.
 */
export function SPECIMEN(configuration: string, modulus: number, flaws?: string, poisson?: number, criterion?: string): number {
  if (typeof configuration !== "string" || configuration.trim() === "") {
    throw new CellError("#VALUE!", "configuration must be a name such as \"C1161-B-4PT\"");
  }
  const which = readChoice(flaws, "flaws", ["VOLUME", "SURFACE"] as const, "VOLUME");
  return specimenEffectiveSize({
    configuration,
    shape: readNumber(modulus, "modulus"),
    flaws: which === "SURFACE" ? "surface" : "volume",
    poisson: poisson === null || poisson === undefined || (poisson as unknown) === "" ? undefined : readNumber(poisson, "poisson"),
    criterion: readCriterion(criterion),
  });
}

/**
 * Failure probability of a part from its element table: 1 - exp(-sum V_e I_e(s_e/sigma_0)), with I_e the multiaxial
 * criterion's intensity of the element's principal stresses; compression counts nothing. Volume elements take sigma_0V,
 * surface elements (areas) sigma_0S: add the two risks as the README shows.
 * Example: =BRITTLE.PARTFAILPROB(B2:D5001, E2:E5001, 10, 520) gives the probability for 5000 elements.
 * @customfunction
 * @param stresses Element stresses, one row per element: 1 column (maximum principal), 3 (principal stresses) or 6 (sxx, syy, szz, sxy, syz, szx), stress unit.
 * @param sizes Element volumes or areas, one column with the same rows (size unit, >= 0).
 * @param modulus Weibull modulus m (dimensionless, > 0).
 * @param materialScale Material scale parameter sigma_0 for this size unit (stress unit x size unit^(1/m), > 0), e.g. from MATERIALSCALE.
 * @param [criterion] Multiaxial criterion: "PIA" (default), "NSA" or "MAXPRINCIPAL".
 * @returns Failure probability, between 0 and 1.
 */
export function PARTFAILPROB(stresses: any[][], sizes: any[][], modulus: number, materialScale: number, criterion?: string): number {
  const table = partTable(stresses, sizes, modulus, criterion);
  return partFailureProbability({ ...table, materialScale: readNumber(materialScale, "materialScale") });
}

/**
 * Effective volume or area of a part from its element table, referenced to uniaxial tension at the part's peak
 * principal stress: sum V_e I_e(s_e/s_max). Example: =BRITTLE.PARTEFFSIZE(B2:D5001, E2:E5001, 10) gives the size to
 * use in SIZESCALE or FAILPROB's sizeRatio.
 * @customfunction
 * @param stresses Element stresses, one row per element: 1 column (maximum principal), 3 (principal stresses) or 6 (sxx, syy, szz, sxy, syz, szx), stress unit.
 * @param sizes Element volumes or areas, one column with the same rows (size unit, >= 0).
 * @param modulus Weibull modulus m (dimensionless, > 0).
 * @param [criterion] Multiaxial criterion: "PIA" (default), "NSA" or "MAXPRINCIPAL".
 * @returns Effective size, in the size unit.
 */
export function PARTEFFSIZE(stresses: any[][], sizes: any[][], modulus: number, criterion?: string): number {
  return partEffectiveSize(partTable(stresses, sizes, modulus, criterion));
}

/**
 * Each element's share of the part's risk of rupture (the shares add up to 1): sort by it to find the hot spots.
 * Blank rows give blank cells. Example: =BRITTLE.RISKSHARE(B2:D5001, E2:E5001, 10) spills 5000 shares beside the table.
 * @customfunction
 * @param stresses Element stresses, one row per element: 1 column (maximum principal), 3 (principal stresses) or 6 (sxx, syy, szz, sxy, syz, szx), stress unit.
 * @param sizes Element volumes or areas, one column with the same rows (size unit, >= 0).
 * @param modulus Weibull modulus m (dimensionless, > 0).
 * @param [criterion] Multiaxial criterion: "PIA" (default), "NSA" or "MAXPRINCIPAL".
 * @returns One column, one row per element row: the share of the risk (0 to 1).
 */
export function RISKSHARE(stresses: any[][], sizes: any[][], modulus: number, criterion?: string): any[][] {
  const table = partTable(stresses, sizes, modulus, criterion);
  const shares = partRiskShares(table);
  const out: CellValue[][] = Array.from({ length: table.cells.rows }, () => [""]);
  table.cells.rowOf.forEach((row, k) => (out[row][0] = shares[k]));
  return out;
}
