/**
 * An independent time-stepping simulation of the stiff, lossy string
 *   y_tt = c²·y_xx − κ²·y_xxxx − 2b1·y_t + 2b2·y_txx,  y = y_xx = 0 at both ends
 * (Bensa, Bilbao, Kronland-Martinet & Smith, JASA 114(2), 2003), by explicit finite differences:
 * centred second differences in space and time, the b1 term centred, the b2 term backward in time
 * (the explicit form of their scheme), pinned ends by antisymmetric ghost points. Second-order
 * accurate in space; used only to check the modal engine over the first milliseconds.
 */
export interface FiniteDifferenceInput {
  lengthM: number;
  waveSpeedMPerS: number;
  /** κ = √(EI/μ); κ² = B·c²·L²/π². */
  stiffnessM2PerS: number;
  b1PerS: number;
  b2M2PerS: number;
  intervals: number;
  timeStepS: number;
  steps: number;
  displacement: (x: number) => number;
  velocity: (x: number) => number;
  /** Grid index read every step. */
  pickupIndex: number;
}

function secondDifference(y: Float64Array, h: number, out: Float64Array): void {
  const last = y.length - 1;
  out[0] = 0;
  out[last] = 0;
  for (let j = 1; j < last; j++) out[j] = (y[j + 1] - 2 * y[j] + y[j - 1]) / (h * h);
}

/** Returns the displacement at the pickup at every step, index 0 being t = 0. */
export function simulateFiniteDifference(input: FiniteDifferenceInput): Float64Array {
  const { intervals, lengthM, timeStepS: k, waveSpeedMPerS: c, stiffnessM2PerS: kappa, b1PerS: b1, b2M2PerS: b2 } = input;
  const h = lengthM / intervals;
  const size = intervals + 1;
  const lambdaSquared = (c * k) / h;
  const stiffNumber = (kappa * k) / (h * h);
  if (lambdaSquared * lambdaSquared + 4 * stiffNumber * stiffNumber > 1) throw new Error('finite-difference step is unstable');

  let previous = new Float64Array(size);
  let current = new Float64Array(size);
  let next = new Float64Array(size);
  const velocity = new Float64Array(size);
  for (let j = 1; j < intervals; j++) {
    previous[j] = input.displacement(j * h);
    velocity[j] = input.velocity(j * h);
  }
  const dxx = new Float64Array(size);
  const dxxxx = new Float64Array(size);
  const dxxVelocity = new Float64Array(size);
  const dxxHistory = new Float64Array(size);

  const operator = (y: Float64Array) => {
    secondDifference(y, h, dxx);
    secondDifference(dxx, h, dxxxx);
  };

  // First step from the Taylor series y(k) = y + k·y_t + (k²/2)·y_tt, y_tt from the equation.
  operator(previous);
  secondDifference(velocity, h, dxxVelocity);
  for (let j = 1; j < intervals; j++) {
    const acceleration = c * c * dxx[j] - kappa * kappa * dxxxx[j] - 2 * b1 * velocity[j] + 2 * b2 * dxxVelocity[j];
    current[j] = previous[j] + k * velocity[j] + 0.5 * k * k * acceleration;
  }

  const out = new Float64Array(input.steps + 1);
  out[0] = previous[input.pickupIndex];
  out[1] = current[input.pickupIndex];
  const difference = new Float64Array(size);
  for (let step = 1; step < input.steps; step++) {
    operator(current);
    for (let j = 0; j < size; j++) difference[j] = current[j] - previous[j];
    secondDifference(difference, h, dxxHistory);
    for (let j = 1; j < intervals; j++) {
      const spatial = k * k * (c * c * dxx[j] - kappa * kappa * dxxxx[j]);
      next[j] = (2 * current[j] - (1 - b1 * k) * previous[j] + spatial + 2 * b2 * k * dxxHistory[j]) / (1 + b1 * k);
    }
    [previous, current, next] = [current, next, previous];
    out[step + 1] = current[input.pickupIndex];
  }
  return out;
}
