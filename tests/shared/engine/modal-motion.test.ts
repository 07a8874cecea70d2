import { describe, expect, it } from 'vitest';
import { modeAmplitudesAt, modeShapeTable, stringShapeM } from '../../../shared/engine/modal-motion';
import { sineProjection } from '../../../shared/engine/sine-projection';

/** The initial shape: a triangle of height h at x = p on a string of length L (a plain pluck). */
const L = 0.65;
const p = 0.17;
const h = 0.003;
const triangle = (x: number) => (x <= p ? (h * x) / p : (h * (L - x)) / (L - p));
/** Its odd, 2L-periodic extension, as d'Alembert's solution needs it. */
const oddExtension = (x: number) => {
  const wrapped = ((x % (2 * L)) + 2 * L) % (2 * L);
  return wrapped <= L ? triangle(wrapped) : -triangle(2 * L - wrapped);
};

describe('the string in motion, built from its modes', () => {
  it("matches d'Alembert's travelling-wave solution of the ideal string, ½[F(x − ct) + F(x + ct)] (Kinsler et al., Fundamentals of Acoustics, ch. 2)", () => {
    const count = 4000;
    const c = 150; // m/s: f_n = n c / 2L
    const aM = sineProjection([[0, 0], [p, h], [L, 0]], L, count);
    const modes = {
      frequencyHz: Float64Array.from({ length: count }, (_, m) => ((m + 1) * c) / (2 * L)),
      aM,
      vMPerS: new Float64Array(count),
      decayRatePerS: new Float64Array(count),
    };
    const xs = Float64Array.from({ length: 101 }, (_, j) => (L * j) / 100);
    const shapes = modeShapeTable(L, count, xs);
    const period = (2 * L) / c;
    for (const fraction of [0, 0.13, 0.25, 0.5, 0.77]) {
      const t = fraction * period;
      const y = stringShapeM(modeAmplitudesAt(modes, count, t), shapes, xs.length);
      let worst = 0;
      for (let j = 0; j < xs.length; j++) worst = Math.max(worst, Math.abs(y[j] - 0.5 * (oddExtension(xs[j] - c * t) + oddExtension(xs[j] + c * t))));
      // The series truncated at N modes of a 1/n² spectrum errs by about h·L²/(p(L − p)π²N): ~1e-7 m here.
      expect(worst, `t = ${fraction} of a period`).toBeLessThan(2e-3 * h);
    }
  });

  it('each mode solves q″ + 2σq′ + ω²q = 0 with q(0) = a, q′(0) = v in the ringing, critical and overdamped regimes (checked by finite differences)', () => {
    const cases = [
      { f: 110, sigma: 3 }, // ringing
      { f: 1, sigma: 2 * Math.PI }, // critical: σ = ω
      { f: 0.5, sigma: 9 }, // overdamped
    ];
    for (const { f, sigma } of cases) {
      const modes = { frequencyHz: [f], aM: [0.002], vMPerS: [-0.4], decayRatePerS: [sigma] };
      const q = (t: number) => modeAmplitudesAt(modes, 1, t)[0];
      const dt = 1e-5;
      expect(q(0)).toBeCloseTo(0.002, 12);
      expect((q(dt) - q(-dt)) / (2 * dt)).toBeCloseTo(-0.4, 5);
      const omega = 2 * Math.PI * f;
      for (const t of [0.003, 0.02, 0.11]) {
        const first = (q(t + dt) - q(t - dt)) / (2 * dt);
        const second = (q(t + dt) - 2 * q(t) + q(t - dt)) / (dt * dt);
        const residual = second + 2 * sigma * first + omega * omega * q(t);
        const scale = omega * omega * Math.abs(q(t)) + Math.abs(second) + 1e-9;
        expect(Math.abs(residual) / scale, `f ${f} Hz, σ ${sigma}/s, t ${t} s`).toBeLessThan(1e-3);
      }
    }
  });

  it('a mode decays as e^(−σt) at its peaks: after one T60 its envelope is 60 dB down (derived: T60 = 3 ln 10 / σ)', () => {
    const sigma = 6.9078 / 1.5; // T60 of 1.5 s
    const modes = { frequencyHz: [200], aM: [1], vMPerS: [0], decayRatePerS: [sigma] };
    const omegaD = Math.sqrt((2 * Math.PI * 200) ** 2 - sigma ** 2);
    // At whole damped periods the phase is back at its start: q = e^(−σt)(cos 0 + σ/ω_d sin 0) = e^(−σt).
    const t = Math.round((1.5 * omegaD) / (2 * Math.PI)) * ((2 * Math.PI) / omegaD);
    expect(20 * Math.log10(Math.abs(modeAmplitudesAt(modes, 1, t)[0]))).toBeCloseTo(-60 * (t / 1.5), 2);
  });
});
