import { describe, expect, it } from 'vitest';
import { MU0 } from '../../../src/constants.js';
import { InputError } from '../../../src/errors.js';
import { inverseJilesAtherton } from '../../../src/materials/hysteresis/inverse-jiles-atherton.js';
import { hysteresisLoopFeatures } from '../../../src/materials/hysteresis/hysteresis-loop-features.js';
import { traceFluxDensityPath } from '../../../src/materials/hysteresis/flux-density-path.js';
import { hystereticReactorProblem } from '../../../src/materials/hysteresis/hysteretic-reactor-problem.js';
import { fitHysteresisLoop, fitLoopFeatures } from '../../../src/materials/hysteresis/fit-jiles-atherton.js';

// Truth: the parameter set attributed to Jiles and Atherton 1986 (REFERENCES.md section 5);
// the "measured" loop is this model's own settled loop (a derived, self-consistency check of the
// fit; the loop itself is checked against the forward model in inverse-jiles-atherton.test.ts).
const truth = { saturationMagnetisation: 1.6e6, anhystereticShape: 1100, pinning: 400, reversibility: 0.2, interdomainCoupling: 1.6e-3 };
const model = inverseJilesAtherton({ kind: 'jiles-atherton', ...truth });
const start = { saturationMagnetisation: 1.4e6, anhystereticShape: 800, pinning: 300, reversibility: 0.3, interdomainCoupling: 1e-3 };
const features = hysteresisLoopFeatures(model, 1.5, { stepsPerSegment: 800 });

describe('fitHysteresisLoop', () => {
  it('recovers all five parameters from 21 samples of a settled descending branch', () => {
    const t = features.trace;
    const bs: number[] = [];
    const hs: number[] = [];
    for (let i = features.lastCycleStart; i <= t.turningIndices[4]!; i += 40) {
      bs.push(t.fluxDensity[i]!);
      hs.push(t.fieldStrength[i]!);
    }
    const fit = fitHysteresisLoop({ fluxDensity: bs, fieldStrength: hs, name: 'sampled' }, { initial: start });
    expect(fit.converged).toBe(true);
    expect(fit.spec.name).toBe('sampled');
    for (const key of Object.keys(truth) as (keyof typeof truth)[]) expect(fit.spec[key] / truth[key]).toBeCloseTo(1, 6);
    expect(fit.maxRelativeError).toBeLessThan(1e-8);
  });

  it('rejects loop data that does not fall along the branch with bad-loop-data', () => {
    const call = () => fitHysteresisLoop({ fluxDensity: [1, 0.5, 0.6, 0, -1], fieldStrength: [9, 1, 2, -3, -9] }, { initial: start });
    expect(call).toThrow(InputError);
    expect(call).toThrow(/sample 2/);
    try {
      call();
    } catch (e) {
      expect((e as InputError).code).toBe('bad-loop-data');
    }
  });
});

describe('fitLoopFeatures', () => {
  it('matches coercive field, remanence and peak field of a loop to 1e-8 (the three features do not fix a, k, c uniquely)', () => {
    const fit = fitLoopFeatures(
      {
        peakFluxDensity: 1.5,
        peakFieldStrength: features.peakFieldStrength,
        coerciveField: features.coerciveField,
        remanence: features.remanence,
        saturationPolarisation: MU0 * truth.saturationMagnetisation,
      },
      { initial: { ...start, interdomainCoupling: truth.interdomainCoupling } },
    );
    expect(fit.converged).toBe(true);
    expect(fit.spec.saturationMagnetisation).toBeCloseTo(truth.saturationMagnetisation, 3);
    const again = hysteresisLoopFeatures(inverseJilesAtherton(fit.spec), 1.5, { stepsPerSegment: 800 });
    expect(again.coerciveField / features.coerciveField).toBeCloseTo(1, 8);
    expect(again.remanence / features.remanence).toBeCloseTo(1, 8);
    expect(again.peakFieldStrength / features.peakFieldStrength).toBeCloseTo(1, 8);
    console.log(`feature fit: a ${fit.spec.anhystereticShape.toFixed(1)} k ${fit.spec.pinning.toFixed(1)} c ${fit.spec.reversibility.toFixed(4)} (truth 1100, 400, 0.2)`);
  });

  it('rejects a non-positive feature with bad-loop-data', () => {
    const call = () =>
      fitLoopFeatures({ peakFluxDensity: 1.5, peakFieldStrength: 2000, coerciveField: 0, remanence: 0.6, saturationPolarisation: 2 }, { initial: start });
    expect(call).toThrow(/coerciveField/);
  });
});

describe('error codes of the hysteresis helpers', () => {
  it("'bad-path' and 'bad-hysteretic-reactor' for bad paths and reactor specs", () => {
    const codeOf = (f: () => unknown): string => {
      try {
        f();
      } catch (e) {
        return (e as InputError).code;
      }
      return 'none';
    };
    expect(codeOf(() => traceFluxDensityPath(model, [0, 1], { stepsPerSegment: 0 }))).toBe('bad-path');
    expect(codeOf(() => hysteresisLoopFeatures(model, -1))).toBe('bad-path');
    expect(codeOf(() => traceFluxDensityPath(model, []))).toBe('bad-path');
    expect(
      codeOf(() =>
        hystereticReactorProblem({
          material: model, pathLength: 0, area: 1e-3, turns: 10, voltage: () => 0, resistance: () => 1, t0: 0, tEnd: 1,
        }),
      ),
    ).toBe('bad-hysteretic-reactor');
  });
});
