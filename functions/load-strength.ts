/**
 * Cell adapters: fracture strength from the breaking load and the specimen's
 * dimensions. Every argument is one value or a column with a value per
 * specimen; the result spills one strength per row of the load column, so it
 * sits beside the test record. A row whose load is blank stays blank (no
 * specimen); a row that breaks its formula's validity limits, or has a bad
 * cell, is #VALUE! with the reason, alone: it must not flow into a fit unseen.
 */
import {
  flexureStrength,
  type LoadStrength,
  pistonOnBallsStrength,
  ringOnRingStrength,
  rodFlexureStrength,
} from "../src/design/strength-from-load";
import { CellError, type PerRowArgument, type SpillCell, perRowCount, perRowNumber, readPerRow, toFailure } from "./cells";
import { declareSpills } from "./spill-shapes";

declareSpills({
  FLEXSTRENGTH: { rows: { cellsOf: 0 }, cols: 1 },
  RODFLEXSTRENGTH: { rows: { cellsOf: 0 }, cols: 1 },
  RINGSTRENGTH: { rows: { cellsOf: 0 }, cols: 1 },
  PISTONSTRENGTH: { rows: { cellsOf: 0 }, cols: 1 },
});

/** Each argument read as one value or a column, named as the user sees it, in argument order. */
function perRow(args: Record<string, unknown>): PerRowArgument[] {
  return Object.entries(args).map(([name, value]) => readPerRow(value, name));
}

/** One strength per row; `compute` gets the row's numbers in argument order. */
function strengthsByRow(args: PerRowArgument[], compute: (values: number[]) => LoadStrength): SpillCell[][] {
  const rows = perRowCount(args);
  const out: SpillCell[][] = [];
  for (let row = 0; row < rows; row++) {
    try {
      const load = perRowNumber(args[0], row);
      if (load === null || load === 0) {
        out.push([""]);
        continue;
      }
      const values = args.map((a, k) => {
        if (k === 0) return load;
        const v = perRowNumber(a, row);
        if (v === null) throw new CellError("#VALUE!", `${a.name} is blank beside a load`);
        return v;
      });
      const { strength, outsideLimits } = compute(values);
      if (outsideLimits.length > 0) {
        out.push([{ cellError: "#VALUE!", message: `row ${row + 1}: outside the formula's limits: ${outsideLimits.join("; ")}` }]);
      } else {
        out.push([strength]);
      }
    } catch (error) {
      const failure = toFailure(error);
      out.push([{ cellError: failure.cellError, message: `row ${row + 1}: ${failure.message}` }]);
    }
  }
  return out;
}

/**
 * Flexural strength of rectangular bars from the breaking load: 3 F (L - Li) / (2 b d^2) (ASTM C1161; innerSpan 0 for
 * three-point). Load in N and lengths in mm give MPa. Example: =BRITTLE.FLEXSTRENGTH(400, 40, 20, 4, 3) is about 333.33.
 * @customfunction
 * @param load Breaking load of each specimen (N, or any force unit): one value or a column; the result has its rows.
 * @param outerSpan Support span L (mm, or any length unit): one value or a column.
 * @param innerSpan Load span Li, 0 for three-point flexure (same unit as outerSpan): one value or a column.
 * @param width Width b of the bar, the tensile face (same length unit): one value or a column.
 * @param depth Depth d of the bar, along the load (same length unit): one value or a column.
 * @returns Flexural strength per specimen (MPa from N and mm); #VALUE! in a row outside beam theory's limits (span below 10 depths).
 */
export function FLEXSTRENGTH(load: any[][], outerSpan: any[][], innerSpan: any[][], width: any[][], depth: any[][]): any[][] {
  const args = perRow({ load, outerSpan, innerSpan, width, depth });
  return strengthsByRow(args, ([F, L, Li, b, d]) => flexureStrength({ load: F, outerSpan: L, innerSpan: Li, width: b, depth: d }));
}

/**
 * Flexural strength of round rods from the breaking load: 8 F (L - Li) / (pi D^3) (beam theory; innerSpan 0 for
 * three-point). Load in N and lengths in mm give MPa. Example: =BRITTLE.RODFLEXSTRENGTH(300, 40, 20, 3) is about 565.88.
 * @customfunction
 * @param load Breaking load of each specimen (N, or any force unit): one value or a column; the result has its rows.
 * @param outerSpan Support span L (mm, or any length unit): one value or a column.
 * @param innerSpan Load span Li, 0 for three-point flexure (same unit): one value or a column.
 * @param diameter Rod diameter D (same length unit): one value or a column.
 * @returns Flexural strength per specimen (MPa from N and mm); #VALUE! in a row outside beam theory's limits (span below 10 diameters).
 */
export function RODFLEXSTRENGTH(load: any[][], outerSpan: any[][], innerSpan: any[][], diameter: any[][]): any[][] {
  const args = perRow({ load, outerSpan, innerSpan, diameter });
  return strengthsByRow(args, ([F, L, Li, D]) => rodFlexureStrength({ load: F, outerSpan: L, innerSpan: Li, diameter: D }));
}

/**
 * Equibiaxial strength of disks in ring-on-ring loading from the breaking load (ASTM C1499 plate-theory formula). Load in
 * N and lengths in mm give MPa. Example: =BRITTLE.RINGSTRENGTH(1000, 12, 24, 30, 1.5, 0.22) is about 219.18.
 * @customfunction
 * @param load Breaking load of each specimen (N, or any force unit): one value or a column; the result has its rows.
 * @param loadDiameter Load ring diameter D_L (mm, or any length unit): one value or a column.
 * @param supportDiameter Support ring diameter D_S (same unit): one value or a column.
 * @param diskDiameter Disk diameter D (same unit): one value or a column.
 * @param thickness Disk thickness h (same unit): one value or a column.
 * @param poisson Poisson's ratio of the material (dimensionless, -1 to 0.5): one value or a column.
 * @returns Equibiaxial strength per specimen (MPa from N and mm); #VALUE! in a row outside the formula's limits (D_L/D_S outside 0.2-0.5, D_S below 10 thicknesses).
 */
export function RINGSTRENGTH(
  load: any[][],
  loadDiameter: any[][],
  supportDiameter: any[][],
  diskDiameter: any[][],
  thickness: any[][],
  poisson: any[][],
): any[][] {
  const args = perRow({ load, loadDiameter, supportDiameter, diskDiameter, thickness, poisson });
  return strengthsByRow(args, ([F, DL, DS, D, h, nu]) =>
    ringOnRingStrength({ load: F, loadDiameter: DL, supportDiameter: DS, diskDiameter: D, thickness: h, poisson: nu }),
  );
}

/**
 * Biaxial strength of disks on three balls loaded by a piston, from the breaking load (ISO 6872 formula, with 3/(4 pi)
 * where the standard prints 0.2387: 0.0136 % higher). Load in N and lengths in mm give MPa.
 * Example: =BRITTLE.PISTONSTRENGTH(100, 1.4, 10, 14, 1.2, 0.25) is about 108.49.
 * @customfunction
 * @param load Breaking load of each specimen (N, or any force unit): one value or a column; the result has its rows.
 * @param pistonDiameter Diameter of the loading piston's flat face (mm, or any length unit): one value or a column.
 * @param supportDiameter Diameter of the circle through the three support balls' contact points (same unit).
 * @param diskDiameter Disk diameter (same unit): one value or a column.
 * @param thickness Disk thickness (same unit): one value or a column.
 * @param poisson Poisson's ratio of the material (dimensionless, -1 to 0.5): one value or a column.
 * @returns Biaxial strength at the disk's centre per specimen (MPa from N and mm); #VALUE! in a row outside the formula's limits (support circle below 5 thicknesses).
 */
export function PISTONSTRENGTH(
  load: any[][],
  pistonDiameter: any[][],
  supportDiameter: any[][],
  diskDiameter: any[][],
  thickness: any[][],
  poisson: any[][],
): any[][] {
  const args = perRow({ load, pistonDiameter, supportDiameter, diskDiameter, thickness, poisson });
  return strengthsByRow(args, ([P, dp, ds, D, t, nu]) =>
    pistonOnBallsStrength({ load: P, pistonDiameter: dp, supportDiameter: ds, diskDiameter: D, thickness: t, poisson: nu }),
  );
}
