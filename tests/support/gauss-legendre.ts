/**
 * Gauss–Legendre quadrature, built here from the Legendre recurrence and Newton's method
 * (Abramowitz & Stegun 25.4.29; Press et al., Numerical Recipes §4.6), independent of the engine.
 */
export function gaussLegendreRule(order: number): { nodes: Float64Array; weights: Float64Array } {
  const nodes = new Float64Array(order);
  const weights = new Float64Array(order);
  for (let i = 0; i < order; i++) {
    let x = Math.cos((Math.PI * (i + 0.75)) / (order + 0.5));
    let derivative = 0;
    for (let iteration = 0; iteration < 100; iteration++) {
      let p0 = 1;
      let p1 = x;
      for (let k = 2; k <= order; k++) {
        const p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
        p0 = p1;
        p1 = p2;
      }
      derivative = (order * (x * p1 - p0)) / (x * x - 1);
      const step = p1 / derivative;
      x -= step;
      if (Math.abs(step) < 1e-16) break;
    }
    nodes[i] = x;
    weights[i] = 2 / ((1 - x * x) * derivative * derivative);
  }
  return { nodes, weights };
}

/** ∫ₐᵇ f(x) dx, splitting [a, b] into `panels` equal parts with an `order`-point rule on each. */
export function integrate(f: (x: number) => number, a: number, b: number, panels = 8, order = 24): number {
  const { nodes, weights } = gaussLegendreRule(order);
  const width = (b - a) / panels;
  let sum = 0;
  for (let p = 0; p < panels; p++) {
    const mid = a + (p + 0.5) * width;
    for (let i = 0; i < order; i++) sum += weights[i] * f(mid + (width / 2) * nodes[i]) * (width / 2);
  }
  return sum;
}
