import { describe, expectTypeOf, it } from 'vitest';
import { createDaeIntegrator, solveDae, type DaeIntegrator, type DaeProblem, type DaeSolution, type DaeStepResult } from '../../src/index.js';

const problem: DaeProblem = { size: 1, y0: [1], t0: 0, tEnd: 1, rhs: (_t, y, out) => void (out[0] = -y[0]!) };

describe('solver types', () => {
  it('solveDae returns a DaeSolution; the integrator steps return DaeStepResult', () => {
    expectTypeOf(solveDae(problem)).toEqualTypeOf<DaeSolution>();
    expectTypeOf(createDaeIntegrator(problem)).toEqualTypeOf<DaeIntegrator>();
    expectTypeOf(createDaeIntegrator(problem).step()).toEqualTypeOf<DaeStepResult>();
    expectTypeOf<DaeSolution['status']>().toEqualTypeOf<
      'success' | 'terminal-event' | 'step-size-underflow' | 'newton-failure' | 'singular-matrix' | 'non-finite' | 'rhs-error' | 'inconsistent-init' | 'step-budget' | 'time-budget' | 'aborted'
    >();
  });

  it('rejects misuse at compile time', () => {
    // @ts-expect-error: rhs writes into `out`; it does not return the derivative
    const bad: DaeProblem = { size: 1, y0: [1], t0: 0, tEnd: 1, rhs: (t: number, y: number[]) => y };
    void bad;
    // @ts-expect-error: linearAlgebra is 'flat' or 'ml-matrix'
    solveDae(problem, { linearAlgebra: 'gpu' });
    // @ts-expect-error: t is read-only on the integrator
    createDaeIntegrator(problem).t = 3;
  });
});
