import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { MU0 } from '../../../src/constants.js';
import { InputError } from '../../../src/errors.js';
import { inverseJilesAtherton, type JilesAthertonSpec } from '../../../src/materials/hysteresis/inverse-jiles-atherton.js';
import { traceFluxDensityPath } from '../../../src/materials/hysteresis/flux-density-path.js';
import { hysteresisLoopFeatures } from '../../../src/materials/hysteresis/hysteresis-loop-features.js';
import { residualFluxDensity } from '../../../src/materials/hysteresis/residual-flux-density.js';
import { Solver } from '../../support/odex.js';

// Parameter set attributed to D. C. Jiles, D. L. Atherton, J. Magn. Magn. Mater. 61 (1986) 48-60
// (read in a secondary source; /work/shared/REFERENCES.md section 5). No published loop values
// (coercivity, remanence) for it were found, so the loop is checked against the FORWARD model of
// the same paper (H-driven; dM/dH as in D. C. Jiles, J. B. Thoelke, M. K. Devine, IEEE Trans. Magn.
// 28(1) (1992) 27-35, from memory) integrated by odex 2.0.4 at tight tolerance.
const spec: JilesAthertonSpec = {
  kind: 'jiles-atherton',
  name: 'JA 1986 set',
  saturationMagnetisation: 1.6e6,
  anhystereticShape: 1100,
  pinning: 400,
  reversibility: 0.2,
  interdomainCoupling: 1.6e-3,
};
const model = inverseJilesAtherton(spec);

/** Forward JA, written independently of src: dM/dH = P/(1 - alpha P), P = (1-c) dMirr/dHe + c dMan/dHe. */
function forwardSlope(h: number, m: number, delta: number): number {
  const { saturationMagnetisation: ms, anhystereticShape: a, pinning: k, reversibility: c, interdomainCoupling: alpha } = spec;
  const x = (h + alpha * m) / a;
  const small = Math.abs(x) < 1e-4;
  const man = ms * (small ? x / 3 : 1 / Math.tanh(x) - 1 / x);
  const dman = (ms / a) * (small ? 1 / 3 : 1 / (x * x) - 1 / Math.sinh(x) ** 2);
  const mirr = (m - c * man) / (1 - c);
  const pull = man - mirr;
  const dmirr = delta * pull > 0 ? pull / (delta * k) : 0;
  const p = (1 - c) * dmirr + c * dman;
  return p / (1 - alpha * p);
}

/** Forward model along H from (h0, m0) to h1 by odex; returns m at h1. */
function forward(h0: number, m0: number, h1: number): number {
  const delta = Math.sign(h1 - h0);
  const solver = new Solver(1);
  solver.absoluteTolerance = 1e-7;
  solver.relativeTolerance = 1e-13;
  solver.maxSteps = 1e6;
  const r = solver.solve((h, y) => [forwardSlope(h, y[0]!, delta)], h0, [m0], h1);
  expect(r.outcome).toBe(0);
  return r.y[0]!;
}

/** Bisection for the h in [hi, lo] (descending branch from (h0, m0)) where level(h, m) changes sign. */
function forwardCrossing(h0: number, m0: number, level: (h: number, m: number) => number, lo: number): number {
  let a = h0;
  let b = lo;
  for (let i = 0; i < 60; i++) {
    const mid = 0.5 * (a + b);
    if (Math.sign(level(mid, forward(h0, m0, mid))) === Math.sign(level(h0, m0))) a = mid;
    else b = mid;
  }
  return 0.5 * (a + b);
}

describe('inverseJilesAtherton', () => {
  it('rejects parameters outside their domain with bad-hysteresis-parameters naming the material', () => {
    for (const bad of [{ pinning: 0 }, { reversibility: 1 }, { interdomainCoupling: -1e-3 }, { saturationMagnetisation: Number.NaN }]) {
      const call = () => inverseJilesAtherton({ ...spec, ...bad });
      expect(call).toThrow(InputError);
      expect(call).toThrow(/JA 1986 set/);
      try {
        call();
      } catch (e) {
        expect((e as InputError).code).toBe('bad-hysteresis-parameters');
      }
    }
  });

  it('gives the loop of the forward model of Jiles and Atherton (odex) to 1e-6: tip, coercive field, remanence', () => {
    // Forward: demagnetised, H up to hTip, down to -hTip, up to hTip, down again (the loop settles after one reversal).
    const hTip = 2742.5;
    let m = forward(0, 0, hTip);
    m = forward(hTip, m, -hTip);
    m = forward(-hTip, m, hTip);
    const bTip = MU0 * (hTip + m);
    const hc = -forwardCrossing(hTip, m, (h, mm) => h + mm, -hTip); // B = 0
    const mAtH0 = forward(hTip, m, 0);
    const br = MU0 * mAtH0; // B at H = 0
    // Inverse: driven by b to the forward tip flux density.
    const f = hysteresisLoopFeatures(model, bTip, { stepsPerSegment: 8000 });
    console.log(
      `JA 1986 set at Hm = ${hTip} A/m: forward Bm ${bTip.toFixed(6)} T, Hc ${hc.toFixed(4)} A/m, Br ${br.toFixed(6)} T; ` +
        `inverse Hm ${f.peakFieldStrength.toFixed(4)}, Hc ${f.coerciveField.toFixed(4)}, Br ${f.remanence.toFixed(6)}`,
    );
    expect(Math.abs(f.peakFieldStrength - hTip) / hTip).toBeLessThan(1e-6);
    expect(Math.abs(f.coerciveField - hc) / hc).toBeLessThan(1e-6);
    expect(Math.abs(f.remanence - br) / br).toBeLessThan(1e-6);
  });

  it('never has a negative dM/dB nor a negative loss rate, for any state and direction (property)', () => {
    const limit = 1 / (MU0 * (1 - spec.interdomainCoupling));
    fc.assert(
      fc.property(
        fc.double({ min: -2.5, max: 2.5, noNaN: true }),
        fc.double({ min: -0.99, max: 0.99, noNaN: true }),
        fc.constantFrom(-1, 1),
        (b, mFraction, direction) => {
          const m = mFraction * spec.saturationMagnetisation;
          const slope = model.magnetisationSlope(b, m, direction);
          expect(slope).toBeGreaterThanOrEqual(0);
          expect(slope).toBeLessThan(limit);
          expect(model.dissipationRate(b, m, direction * 3.7)).toBeGreaterThanOrEqual(0);
        },
      ),
      { numRuns: 500 },
    );
  });

  it('splits H db into a state function W(b, m) and a loss: work - loss = W(end) - W(start) along a path with minor loops', () => {
    // Derived identity (docs/materials.md, "Hysteresis"): H db = dW + p dt with W from the model.
    const path = [0, 1.6, 0.3, 1.1, -0.4, 0.7, -1.6, 0.2];
    const t = traceFluxDensityPath(model, path, { stepsPerSegment: 4000 });
    const w0 = model.storedEnergyDensity(0, 0);
    let worst = 0;
    for (let i = 0; i < t.fluxDensity.length; i += 97) {
      const stored = model.storedEnergyDensity(t.fluxDensity[i]!, t.magnetisation[i]!) - w0;
      worst = Math.max(worst, Math.abs(t.work[i]! - t.loss[i]! - stored));
    }
    const scale = t.loss[t.loss.length - 1]!;
    console.log(`energy split: largest |work - loss - dW| ${worst.toExponential(2)} J/m^3 of ${scale.toFixed(1)} J/m^3 lost`);
    expect(worst / scale).toBeLessThan(1e-7);
  });

  it('has loop area equal to the loss per cycle (1e-6) and to the trapezoid area of its own samples (1e-5)', () => {
    const f = hysteresisLoopFeatures(model, 1.5, { stepsPerSegment: 16000 });
    const t = f.trace;
    let trapezoid = 0;
    for (let i = f.lastCycleStart + 1; i < t.fluxDensity.length; i++) {
      trapezoid += 0.5 * (t.fieldStrength[i]! + t.fieldStrength[i - 1]!) * (t.fluxDensity[i]! - t.fluxDensity[i - 1]!);
    }
    console.log(`1.5 T loop: area ${f.loopArea.toFixed(4)} J/m^3, loss ${f.lossPerCycle.toFixed(4)}, trapezoid ${trapezoid.toFixed(4)}`);
    expect(Math.abs(f.loopArea - f.lossPerCycle) / f.loopArea).toBeLessThan(1e-6);
    expect(Math.abs(trapezoid - f.loopArea) / f.loopArea).toBeLessThan(1e-5);
  });

  it('gives a loop symmetric about the origin after the first cycle of an odd drive', () => {
    const steps = 4000;
    // Virgin curve, first cycle (-1.5, +1.5), then the second descending branch.
    const t = traceFluxDensityPath(model, [0, 1.5, -1.5, 1.5, -1.5], { stepsPerSegment: steps });
    const up = t.turningIndices[2]!; // ascending branch of the first cycle starts here
    const down = t.turningIndices[3]!; // descending branch after the first cycle starts here
    let worst = 0;
    for (let j = 0; j <= steps; j++) {
      // b on the ascending branch at j is minus b on the descending branch at j.
      expect(t.fluxDensity[up + j]).toBeCloseTo(-t.fluxDensity[down + j]!, 12);
      worst = Math.max(worst, Math.abs(t.fieldStrength[up + j]! + t.fieldStrength[down + j]!));
    }
    console.log(`symmetry: largest |H_up(-b) + H_down(b)| ${worst.toExponential(2)} A/m`);
    expect(worst / Math.abs(t.fieldStrength[up]!)).toBeLessThan(1e-9);
  });

  it('closes a minor loop: repeated cycling between 0.2 T and 0.9 T after a major excursion repeats its tips', () => {
    const path = [0, 1.5, 0.2];
    for (let k = 0; k < 4; k++) path.push(0.9, 0.2);
    const t = traceFluxDensityPath(model, path, { stepsPerSegment: 4000 });
    const tipsH = t.turningIndices.slice(2).map((i) => t.fieldStrength[i]!);
    // Tips of the third and fourth minor cycles (the first cycle accommodates, as the JA model does).
    const last = tipsH.length - 1;
    expect(Math.abs(tipsH[last]! - tipsH[last - 2]!)).toBeLessThan(1e-6);
    expect(Math.abs(tipsH[last - 1]! - tipsH[last - 3]!)).toBeLessThan(1e-6);
    // The loop is a true loop (positive area) that does not drift.
    const i0 = t.turningIndices[t.turningIndices.length - 3]!;
    const i1 = t.turningIndices[t.turningIndices.length - 1]!;
    expect(t.work[i1]! - t.work[i0]!).toBeGreaterThan(0);
    expect(t.magnetisation[i1]).toBeCloseTo(t.magnetisation[i0]!, 6);
  });
});

describe('residualFluxDensity', () => {
  it('at the tip of a settled loop is the loop remanence (1e-7 T), at H = 0 is b itself', () => {
    const f = hysteresisLoopFeatures(model, 1.5, { stepsPerSegment: 8000 });
    const tip = f.lastCycleStart;
    const r = residualFluxDensity(model, f.trace.fluxDensity[tip]!, f.trace.magnetisation[tip]!, 1e-4);
    expect(Math.abs(r - f.remanence)).toBeLessThan(1e-7);
    expect(residualFluxDensity(model, 0.4, 0.4 / MU0)).toBe(0.4);
  });
});
