/**
 * Linear algebra for Newton's method on three unknowns (the light-load event solves of the
 * forwards and the double-ended family): the step from a 3×3 Jacobian by Cramer's rule, and
 * Broyden's update of that Jacobian along a step taken. Jacobians are 9 numbers by rows.
 * ref: Cramer's rule, common practice; Broyden (1965), "A class of methods for solving nonlinear
 * simultaneous equations", Math. Comp. 19 (from memory), common practice.
 */

/** The determinant of a 3×3 matrix, by rows. */
function determinant(
  a11: number,
  a12: number,
  a13: number,
  a21: number,
  a22: number,
  a23: number,
  a31: number,
  a32: number,
  a33: number,
): number {
  return (
    a11 * (a22 * a33 - a23 * a32) - a12 * (a21 * a33 - a23 * a31) + a13 * (a21 * a32 - a22 * a31)
  );
}

/**
 * Solves J·s = b for s by Cramer's rule (J by rows); undefined where J is singular or not finite.
 * The solution may still hold a non-finite number where J is nearly singular: the caller checks.
 */
export function solveThreeByThree(
  j: readonly number[],
  b1: number,
  b2: number,
  b3: number,
): [number, number, number] | undefined {
  const [a11, a12, a13, a21, a22, a23, a31, a32, a33] = j as [
    number,
    number,
    number,
    number,
    number,
    number,
    number,
    number,
    number,
  ];
  const det = determinant(a11, a12, a13, a21, a22, a23, a31, a32, a33);
  if (!(Math.abs(det) > 0) || !Number.isFinite(det)) return undefined;
  return [
    determinant(b1, a12, a13, b2, a22, a23, b3, a32, a33) / det,
    determinant(a11, b1, a13, a21, b2, a23, a31, b3, a33) / det,
    determinant(a11, a12, b1, a21, a22, b2, a31, a32, b3) / det,
  ];
}

/**
 * Broyden's update of `j` (by rows, in place) after the step s = (s1, s2, s3) that changed the
 * residuals by (d1, d2, d3), in the norm that weighs each unknown by 1/scale²:
 * J += (Δf − J·s)·(W·s)ᵀ/(sᵀ·W·s). Scales of 1 give the plain update. Nothing changes for a
 * zero step.
 */
export function broydenUpdateThree(
  j: number[],
  s1: number,
  s2: number,
  s3: number,
  d1: number,
  d2: number,
  d3: number,
  scale1 = 1,
  scale2 = 1,
  scale3 = 1,
): void {
  const w1 = s1 / (scale1 * scale1);
  const w2 = s2 / (scale2 * scale2);
  const w3 = s3 / (scale3 * scale3);
  const denominator = s1 * w1 + s2 * w2 + s3 * w3;
  if (!(denominator > 0)) return;
  const changes = [d1, d2, d3];
  for (let r = 0; r < 3; r++) {
    const miss =
      (changes[r] as number) -
      ((j[3 * r] as number) * s1 + (j[3 * r + 1] as number) * s2 + (j[3 * r + 2] as number) * s3);
    j[3 * r] = (j[3 * r] as number) + (miss * w1) / denominator;
    j[3 * r + 1] = (j[3 * r + 1] as number) + (miss * w2) / denominator;
    j[3 * r + 2] = (j[3 * r + 2] as number) + (miss * w3) / denominator;
  }
}
