import { describe, expect, it } from 'vitest';
import { levenbergMarquardt as mlLevenbergMarquardt } from 'ml-levenberg-marquardt';
import {
  InputError,
  brauerMaterial,
  compileMaterial,
  fitMaterial,
  frohlichKennellyMaterial,
  type MaterialLaw,
} from '../../src/index.js';

// Known truths the fitter must recover (invented parameters).
const fkTruth = { kind: 'frohlich-kennelly', initialRelativePermeability: 5000, saturationPolarisation: 1.6 } as const;
const brauerTruth = { kind: 'brauer', k1: 8e-9, k2: 7, k3: 19 } as const;
const fkB = Array.from({ length: 15 }, (_, i) => 0.12 * (i + 1));
const brB = Array.from({ length: 20 }, (_, i) => 0.1 * (i + 1));

/** Samples of a law, optionally with a deterministic relative perturbation of up to 2 %. */
function sample(law: MaterialLaw, bs: number[], noise: number): number[] {
  return bs.map((b, i) => law.fieldStrength(b) * (1 + noise * Math.sin(2.3 * (i + 1))));
}

describe('fitMaterial', () => {
  it('recovers the Frohlich-Kennelly parameters from exact samples of that law', () => {
    const hs = sample(frohlichKennellyMaterial(fkTruth), fkB, 0);
    const fit = fitMaterial({ fluxDensity: fkB, fieldStrength: hs, name: 'sampled' }, { model: 'frohlich-kennelly' });
    expect(fit.converged).toBe(true);
    expect(fit.spec.kind).toBe('frohlich-kennelly');
    expect(fit.spec.name).toBe('sampled');
    expect(fit.spec.initialRelativePermeability / 5000).toBeCloseTo(1, 9);
    expect(fit.spec.saturationPolarisation / 1.6).toBeCloseTo(1, 9);
    expect(fit.error.maxRelative).toBeLessThan(1e-12);
  });

  it('recovers the Brauer parameters from exact samples of that law (beyond its air-line join too)', () => {
    const hs = sample(brauerMaterial(brauerTruth), brB, 0);
    const fit = fitMaterial({ fluxDensity: brB, fieldStrength: hs }, { model: 'brauer' });
    expect(fit.converged).toBe(true);
    expect(fit.spec.k1 / 8e-9).toBeCloseTo(1, 8);
    expect(fit.spec.k2 / 7).toBeCloseTo(1, 9);
    expect(fit.spec.k3 / 19).toBeCloseTo(1, 9);
    expect(fit.error.maxRelative).toBeLessThan(1e-12);
  });

  it('reaches the same optimum as ml-levenberg-marquardt on the same perturbed data and model', () => {
    // Outside reference: ml-levenberg-marquardt 5.1.0, same objective (sum of squared relative
    // H errors), same log parameters, same start. Unit weights in both (the relative scaling is
    // inside the model). Tolerance: 1e-8 relative in parameters, 1e-10 in the objective; both
    // stop with steps near rounding on a well-conditioned minimum.
    const hs = sample(frohlichKennellyMaterial(fkTruth), fkB, 0.02);
    const start = { initialRelativePermeability: 3000, saturationPolarisation: 1.3 };
    const ours = fitMaterial({ fluxDensity: fkB, fieldStrength: hs }, { model: 'frohlich-kennelly', initial: start });
    const model = (q: number[]) => {
      const law = frohlichKennellyMaterial({
        kind: 'frohlich-kennelly',
        initialRelativePermeability: 1 + Math.exp(q[0] as number),
        saturationPolarisation: Math.exp(q[1] as number),
      });
      return (i: number): number => law.fieldStrength(fkB[i] as number) / (hs[i] as number);
    };
    const ref = mlLevenbergMarquardt({ x: fkB.map((_, i) => i), y: fkB.map(() => 1) }, model, {
      initialValues: [Math.log(start.initialRelativePermeability - 1), Math.log(start.saturationPolarisation)],
      damping: 1e-2,
      gradientDifference: 1e-6,
      centralDifference: true,
      maxIterations: 1000,
      errorTolerance: 0,
    });
    const refMu = 1 + Math.exp(ref.parameterValues[0] as number);
    const refJs = Math.exp(ref.parameterValues[1] as number);
    expect(Math.abs(ours.spec.initialRelativePermeability / refMu - 1)).toBeLessThan(1e-8);
    expect(Math.abs(ours.spec.saturationPolarisation / refJs - 1)).toBeLessThan(1e-8);
    const ourObjective = ours.error.rmsRelative ** 2 * fkB.length;
    expect(Math.abs(ourObjective / ref.parameterError - 1)).toBeLessThan(1e-10);
    // A 2 % perturbation leaves a non-zero optimum near the truth.
    expect(ours.error.maxRelative).toBeGreaterThan(0.01);
    expect(Math.abs(ours.spec.initialRelativePermeability / 5000 - 1)).toBeLessThan(0.05);
  });

  it('reaches the same Brauer optimum as ml-levenberg-marquardt on perturbed data', () => {
    const hs = sample(brauerMaterial(brauerTruth), brB, 0.02);
    // Start near the optimum: ml-levenberg-marquardt ends its loop at the first step whose error is
    // NaN (a step outside the Brauer domain), where ours rejects the step and raises the damping.
    const start = { k1: 2e-8, k2: 6.5, k3: 17 };
    const ours = fitMaterial({ fluxDensity: brB, fieldStrength: hs }, { model: 'brauer', initial: start });
    const model = (q: number[]) => {
      let law: MaterialLaw;
      try {
        law = brauerMaterial({ kind: 'brauer', k1: Math.exp(q[0] as number), k2: Math.exp(q[1] as number), k3: Math.exp(q[2] as number) });
      } catch {
        return (): number => Number.NaN;
      }
      return (i: number): number => law.fieldStrength(brB[i] as number) / (hs[i] as number);
    };
    const ref = mlLevenbergMarquardt({ x: brB.map((_, i) => i), y: brB.map(() => 1) }, model, {
      initialValues: [Math.log(start.k1), Math.log(start.k2), Math.log(start.k3)],
      damping: 1e-2,
      gradientDifference: 1e-6,
      centralDifference: true,
      maxIterations: 2000,
      errorTolerance: 0,
    });
    const refK = ref.parameterValues.map((q) => Math.exp(q));
    expect(Math.abs(ours.spec.k1 / (refK[0] as number) - 1)).toBeLessThan(1e-8);
    expect(Math.abs(ours.spec.k2 / (refK[1] as number) - 1)).toBeLessThan(1e-8);
    expect(Math.abs(ours.spec.k3 / (refK[2] as number) - 1)).toBeLessThan(1e-8);
    expect(Math.abs((ours.error.rmsRelative ** 2 * brB.length) / ref.parameterError - 1)).toBeLessThan(1e-10);
  });

  it('reports RMS and max errors in H, absolute (A/m) and relative, at the data flux densities', () => {
    const hs = sample(frohlichKennellyMaterial(fkTruth), fkB, 0.02);
    const fit = fitMaterial({ fluxDensity: fkB, fieldStrength: hs }, { model: 'frohlich-kennelly' });
    const law = compileMaterial(fit.spec);
    const e = fkB.map((b, i) => law.fieldStrength(b) - (hs[i] as number));
    const rel = e.map((v, i) => v / (hs[i] as number));
    const rms = (v: number[]): number => Math.sqrt(v.reduce((s, x) => s + x * x, 0) / v.length);
    expect(fit.error.rmsAbsolute).toBeCloseTo(rms(e), 9);
    expect(fit.error.maxAbsolute).toBeCloseTo(Math.max(...e.map(Math.abs)), 9);
    expect(fit.error.rmsRelative).toBeCloseTo(rms(rel), 14);
    expect(fit.error.maxRelative).toBeCloseTo(Math.max(...rel.map(Math.abs)), 14);
  });

  it('validates the data like a table and rejects bad starts and unknown models', () => {
    expect(() => fitMaterial({ fluxDensity: [0.1, 0.2], fieldStrength: [1, 2], name: 'short' }, { model: 'brauer' })).toThrow(/short/);
    const data = { fluxDensity: fkB, fieldStrength: sample(frohlichKennellyMaterial(fkTruth), fkB, 0), name: 'd' };
    const bad = (): unknown =>
      fitMaterial(data, { model: 'frohlich-kennelly', initial: { initialRelativePermeability: 0.5, saturationPolarisation: 1 } });
    expect(bad).toThrow(InputError);
    try {
      bad();
    } catch (e) {
      expect((e as InputError).code).toBe('fit-bad-start');
    }
    const unknown = (): unknown => fitMaterial(data, { model: 'spline' } as unknown as { model: 'brauer' });
    expect(unknown).toThrow(InputError);
    try {
      unknown();
    } catch (e) {
      expect((e as InputError).code).toBe('unknown-fit-model');
    }
  });
});
