/**
 * Linear algebra for Newton's method on more than three unknowns (the forwards' light-load event
 * solve with several outputs): the step from a square Jacobian by Gaussian elimination with
 * partial pivoting, and Broyden's update of that Jacobian along a step taken. Jacobians are
 * n² numbers by rows. ref: Gaussian elimination with partial pivoting, common practice;
 * Broyden (1965), "A class of methods for solving nonlinear simultaneous equations", Math.
 * Comp. 19 (from memory), common practice. Three unknowns keep `three-unknowns.ts`.
 */

/**
 * Solves J·s = b for s (J by rows, n = b.length); undefined where J is singular or the solution
 * is not finite.
 */
export function solveLinear(j: readonly number[], b: readonly number[]): number[] | undefined {
  const n = b.length;
  const a = j.slice(0, n * n);
  const x = b.slice();
  for (let col = 0; col < n; col++) {
    let pivot = col;
    let best = Math.abs(a[col * n + col] as number);
    for (let row = col + 1; row < n; row++) {
      const m = Math.abs(a[row * n + col] as number);
      if (m > best) {
        best = m;
        pivot = row;
      }
    }
    if (!(best > 0) || !Number.isFinite(best)) return undefined;
    if (pivot !== col) {
      for (let k = 0; k < n; k++) {
        const t = a[col * n + k] as number;
        a[col * n + k] = a[pivot * n + k] as number;
        a[pivot * n + k] = t;
      }
      const t = x[col] as number;
      x[col] = x[pivot] as number;
      x[pivot] = t;
    }
    const diagonal = a[col * n + col] as number;
    for (let row = col + 1; row < n; row++) {
      const factor = (a[row * n + col] as number) / diagonal;
      if (factor === 0) continue;
      for (let k = col; k < n; k++) {
        a[row * n + k] = (a[row * n + k] as number) - factor * (a[col * n + k] as number);
      }
      x[row] = (x[row] as number) - factor * (x[col] as number);
    }
  }
  for (let row = n - 1; row >= 0; row--) {
    let sum = x[row] as number;
    for (let k = row + 1; k < n; k++) sum -= (a[row * n + k] as number) * (x[k] as number);
    x[row] = sum / (a[row * n + row] as number);
  }
  return x.every(Number.isFinite) ? x : undefined;
}

/**
 * Broyden's update of `j` (by rows, in place) after the step s that changed the residuals by d:
 * J += (d − J·s)·sᵀ/(sᵀ·s). Nothing changes for a zero step.
 */
export function broydenUpdate(j: number[], s: readonly number[], d: readonly number[]): void {
  const n = s.length;
  let denominator = 0;
  for (const si of s) denominator += si * si;
  if (!(denominator > 0)) return;
  for (let r = 0; r < n; r++) {
    let js = 0;
    for (let k = 0; k < n; k++) js += (j[r * n + k] as number) * (s[k] as number);
    const miss = (d[r] as number) - js;
    for (let k = 0; k < n; k++) {
      j[r * n + k] = (j[r * n + k] as number) + (miss * (s[k] as number)) / denominator;
    }
  }
}
