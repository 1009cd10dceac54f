/**
 * Principal stresses of a symmetric 3x3 stress tensor by cyclic Jacobi
 * rotations. Jacobi is slower than the closed-form (trigonometric) solution
 * but keeps full accuracy for nearly equal eigenvalues and nearly diagonal
 * tensors, where the closed form loses digits to cancellation; each
 * eigenvalue comes out within a few ulp of the tensor's norm. The tensor is
 * scaled by its largest component first, so no intermediate overflows.
 */

const MAX_SWEEPS = 30;

/**
 * Writes the principal stresses of (sxx, syy, szz, sxy, syz, szx), largest
 * first, to out[offset..offset+2]. Returns false if the rotations did not
 * converge (never observed; the values written are then the best available).
 */
export function principalStresses(
  sxx: number,
  syy: number,
  szz: number,
  sxy: number,
  syz: number,
  szx: number,
  out: Float64Array | number[],
  offset = 0,
): boolean {
  const scale = Math.max(Math.abs(sxx), Math.abs(syy), Math.abs(szz), Math.abs(sxy), Math.abs(syz), Math.abs(szx));
  if (scale === 0 || !Number.isFinite(scale)) {
    out[offset] = out[offset + 1] = out[offset + 2] = scale === 0 ? 0 : NaN;
    return scale === 0;
  }
  const inv = 1 / scale;
  let a00 = sxx * inv;
  let a11 = syy * inv;
  let a22 = szz * inv;
  let a01 = sxy * inv;
  let a12 = syz * inv;
  let a02 = szx * inv;
  let converged = false;
  for (let sweep = 0; sweep < MAX_SWEEPS; sweep++) {
    const off = a01 * a01 + a12 * a12 + a02 * a02;
    const diag = a00 * a00 + a11 * a11 + a22 * a22;
    if (off <= 1e-36 * diag || off === 0) {
      converged = true;
      break;
    }
    // Rotation in the (0,1) plane.
    if (a01 !== 0) {
      const theta = (a11 - a00) / (2 * a01);
      const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
      const c = 1 / Math.sqrt(t * t + 1);
      const s = t * c;
      a00 -= t * a01;
      a11 += t * a01;
      a01 = 0;
      const r02 = a02;
      const r12 = a12;
      a02 = c * r02 - s * r12;
      a12 = s * r02 + c * r12;
    }
    // Rotation in the (1,2) plane.
    if (a12 !== 0) {
      const theta = (a22 - a11) / (2 * a12);
      const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
      const c = 1 / Math.sqrt(t * t + 1);
      const s = t * c;
      a11 -= t * a12;
      a22 += t * a12;
      a12 = 0;
      const r01 = a01;
      const r02 = a02;
      a01 = c * r01 - s * r02;
      a02 = s * r01 + c * r02;
    }
    // Rotation in the (0,2) plane.
    if (a02 !== 0) {
      const theta = (a22 - a00) / (2 * a02);
      const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
      const c = 1 / Math.sqrt(t * t + 1);
      const s = t * c;
      a00 -= t * a02;
      a22 += t * a02;
      a02 = 0;
      const r01 = a01;
      const r12 = a12;
      a01 = c * r01 - s * r12;
      a12 = s * r01 + c * r12;
    }
  }
  // Sort descending.
  let x = a00;
  let y = a11;
  let z = a22;
  if (x < y) [x, y] = [y, x];
  if (y < z) [y, z] = [z, y];
  if (x < y) [x, y] = [y, x];
  out[offset] = x * scale;
  out[offset + 1] = y * scale;
  out[offset + 2] = z * scale;
  return converged;
}
