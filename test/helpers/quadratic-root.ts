/**
 * The real root of the quadratic through three points (x[i], y[i]) nearest the middle one, else
 * NaN (a straight line's root where the points are collinear). Newton's divided differences:
 * y = y0 + d1·(x − x0) + d2·(x − x0)·(x − x1).
 */
export function quadraticRoot(x: readonly number[], y: readonly number[]): number {
  const [x0 = NaN, x1 = NaN, x2 = NaN] = x;
  const [y0 = NaN, y1 = NaN, y2 = NaN] = y;
  const d1 = (y1 - y0) / (x1 - x0);
  const d2 = ((y2 - y1) / (x2 - x1) - d1) / (x2 - x0);
  const a = d2;
  const b = d1 - d2 * (x0 + x1);
  const c = y0 - d1 * x0 + d2 * x0 * x1;
  if (Math.abs(a) < 1e-12 * Math.abs(b)) return -c / b;
  const disc = b * b - 4 * a * c;
  if (!(disc >= 0)) return NaN;
  const roots = [(-b + Math.sqrt(disc)) / (2 * a), (-b - Math.sqrt(disc)) / (2 * a)];
  return roots.reduce((best, r) => (Math.abs(r - x1) < Math.abs(best - x1) ? r : best));
}
