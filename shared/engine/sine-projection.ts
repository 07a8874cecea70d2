import type { Metres } from '../units';
import type { Polyline } from '../patch/patch-schema';

/** How many modes the rotation runs before it is re-seeded from Math.sin/Math.cos (bounds rounding drift). */
const RESEED_EVERY = 64;

/**
 * Sine-series coefficients c_n = (2/L)∫₀ᴸ f(x) sin(k_n x) dx, k_n = nπ/L, n = 1…modeCount,
 * of the piecewise-linear function through `points`, in closed form.
 *
 * Integrating by parts twice on each segment (slope s_j) gives
 *   ∫ f sin(kx) dx = [−f cos(kx)/k]₀ᴸ + (1/k²)·Σ_i (s_(i−1) − s_i)·sin(k x_i),
 * a sum over the interior vertices of the change of slope there (the end terms of the
 * second integration vanish since sin(k_n·0) = sin(k_n·L) = 0). The first term is zero for a
 * polyline pinned at both ends and is kept for generality.
 *
 * sin(n θ_i) for n = 1, 2, … is produced by a complex rotation e^(iθ_i) per vertex, re-seeded from
 * Math.sin every 64 modes, so the cost is O(points × modes) multiplies and few transcendental calls.
 *
 * @returns Float64Array of length modeCount; entry n − 1 holds c_n in the polyline's value unit.
 */
export function sineProjection(points: Polyline, lengthM: Metres, modeCount: number): Float64Array {
  const coefficients = new Float64Array(modeCount);
  const last = points.length - 1;
  const slope = (j: number) => (points[j + 1][1] - points[j][1]) / (points[j + 1][0] - points[j][0]);

  let previousSlope = slope(0);
  for (let i = 1; i < last; i++) {
    const nextSlope = slope(i);
    const kink = previousSlope - nextSlope;
    previousSlope = nextSlope;
    if (kink === 0) continue;
    const theta = (Math.PI * points[i][0]) / lengthM;
    const stepCos = Math.cos(theta);
    const stepSin = Math.sin(theta);
    for (let seedStart = 0; seedStart < modeCount; seedStart += RESEED_EVERY) {
      const seedEnd = Math.min(modeCount, seedStart + RESEED_EVERY);
      let re = Math.cos((seedStart + 1) * theta);
      let im = Math.sin((seedStart + 1) * theta);
      for (let m = seedStart; m < seedEnd; m++) {
        coefficients[m] += kink * im;
        const nextRe = re * stepCos - im * stepSin;
        im = re * stepSin + im * stepCos;
        re = nextRe;
      }
    }
  }

  const startValue = points[0][1];
  const endValue = points[last][1];
  for (let m = 0; m < modeCount; m++) {
    const k = ((m + 1) * Math.PI) / lengthM;
    const endCos = (m + 1) % 2 === 0 ? 1 : -1; // cos(nπ), exact
    const boundary = (startValue - endValue * endCos) / k;
    coefficients[m] = (2 / lengthM) * (boundary + coefficients[m] / (k * k));
  }
  return coefficients;
}
