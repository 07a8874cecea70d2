/**
 * The textbook solution of q'' + 2σq' + ω²q = 0 with q(0) = a, q'(0) = v, written out directly with
 * Math.exp / Math.cos / Math.sinh per call (Kinsler et al., Fundamentals of Acoustics, ch. 1, the
 * damped oscillator), as an independent reference for the renderer's recursion.
 */
export function exactModeSolution(sigma: number, omega: number, a: number, v: number, t: number): { q: number; dq: number } {
  if (sigma < omega) {
    const wd = Math.sqrt(omega * omega - sigma * sigma);
    const e = Math.exp(-sigma * t);
    const c = Math.cos(wd * t);
    const s = Math.sin(wd * t);
    const b = (v + sigma * a) / wd;
    const q = e * (a * c + b * s);
    const dq = e * (-sigma * (a * c + b * s) + (-a * wd * s + b * wd * c));
    return { q, dq };
  }
  if (sigma > omega) {
    const g = Math.sqrt(sigma * sigma - omega * omega);
    const r1 = -sigma + g;
    const r2 = -sigma - g;
    const c1 = (v - r2 * a) / (r1 - r2);
    const c2 = a - c1;
    return { q: c1 * Math.exp(r1 * t) + c2 * Math.exp(r2 * t), dq: c1 * r1 * Math.exp(r1 * t) + c2 * r2 * Math.exp(r2 * t) };
  }
  const e = Math.exp(-sigma * t);
  const b = v + sigma * a;
  return { q: e * (a + b * t), dq: e * (b - sigma * (a + b * t)) };
}
