/**
 * Weighted least-squares line through (day, ln value) points, with the uncertainty
 * of its level and slope. Pure arithmetic; the forecast uses it to fit a falling
 * ammonia or nitrite curve as an exponential decay.
 */

/** One point: x in days, y a natural log, w a weight > 0. */
export interface FitPoint {
  x: number
  y: number
  w: number
}

/** A fitted line y = level + slope * (x - x0), with standard errors. */
export interface LineFit {
  /** x the level is given at (the last point's x). */
  x0: number
  level: number
  slope: number
  levelSe: number
  slopeSe: number
  /** Weighted standard deviation of the residuals. */
  scatter: number
  /** Degrees of freedom of the residuals (points - 2). */
  dof: number
}

/**
 * Two-sided 80 % quantiles of Student's t (0.90 one-sided) for 1..30 degrees of
 * freedom, from standard statistical tables; beyond 30 the normal 1.2816 is close.
 */
const T90 = [3.078, 1.886, 1.638, 1.533, 1.476, 1.440, 1.415, 1.397, 1.383, 1.372,
  1.363, 1.356, 1.350, 1.345, 1.341, 1.337, 1.333, 1.330, 1.328, 1.325,
  1.323, 1.321, 1.319, 1.318, 1.316, 1.315, 1.314, 1.313, 1.311, 1.310]

/** Student's t quantile for an 80 % two-sided interval with `dof` degrees of freedom. */
export function t80(dof: number): number {
  if (dof < 1) return Number.POSITIVE_INFINITY
  return T90[Math.min(dof, T90.length) - 1] ?? 1.2816
}

/**
 * Fits the line by weighted least squares, level given at the last point's x.
 * Returns null for fewer than three points or points that share one x.
 * Weights are treated as relative (the scatter is estimated from the residuals).
 */
export function fitLine(points: readonly FitPoint[]): LineFit | null {
  const n = points.length
  if (n < 3) return null
  const x0 = points[n - 1]!.x
  let sw = 0
  let sx = 0
  let sy = 0
  for (const p of points) {
    sw += p.w
    sx += p.w * (p.x - x0)
    sy += p.w * p.y
  }
  const mx = sx / sw
  const my = sy / sw
  let sxx = 0
  let sxy = 0
  for (const p of points) {
    const dx = p.x - x0 - mx
    sxx += p.w * dx * dx
    sxy += p.w * dx * (p.y - my)
  }
  if (!(sxx > 0)) return null
  const slope = sxy / sxx
  const level = my - slope * mx
  let ssr = 0
  for (const p of points) {
    const r = p.y - (level + slope * (p.x - x0))
    ssr += p.w * r * r
  }
  const dof = n - 2
  // Relative weights: scale so they sum to n, then the usual unbiased residual variance.
  const variance = (ssr * n / sw) / dof
  const slopeSe = Math.sqrt(variance / (sxx * n / sw))
  const levelSe = Math.sqrt(variance * (1 / n + (mx * mx) / (sxx / sw * n)))
  return { x0, level, slope, levelSe, slopeSe, scatter: Math.sqrt(variance), dof }
}
