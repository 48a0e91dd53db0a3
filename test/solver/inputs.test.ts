import { describe, expect, it } from 'vitest';
import { InputError, solveDae, type DaeProblem, type SolveDaeOptions } from '../../src/index.js';

const ok: DaeProblem = {
  size: 2,
  y0: [1, 0],
  t0: 0,
  tEnd: 1,
  rhs: (_t, y, out) => {
    out[0] = y[1]!;
    out[1] = -y[0]!;
  },
};

function code(problem: DaeProblem, options?: SolveDaeOptions): string {
  try {
    solveDae(problem, options);
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    expect((e as InputError).message.length).toBeGreaterThan(10);
    return (e as InputError).code;
  }
  return 'no error';
}

describe('solveDae input checks', () => {
  it('throws InputError with a stable code for each kind of bad call', () => {
    expect(code({ ...ok, size: 0 })).toBe('bad-problem-size');
    expect(code({ ...ok, size: 2.5 })).toBe('bad-problem-size');
    expect(code({ ...ok, rhs: 3 as never })).toBe('bad-rhs');
    expect(code({ ...ok, y0: [1] })).toBe('bad-initial-state');
    expect(code({ ...ok, y0: [1, NaN] })).toBe('bad-initial-state');
    expect(code({ ...ok, tEnd: 0 })).toBe('bad-time-span');
    expect(code({ ...ok, tEnd: -1 })).toBe('bad-time-span');
    expect(code({ ...ok, t0: Infinity })).toBe('bad-time-span');
    expect(code(ok, { rtol: -1e-6 })).toBe('bad-tolerance');
    expect(code(ok, { atol: [1e-6] })).toBe('bad-tolerance');
    expect(code(ok, { atol: [1e-6, NaN] })).toBe('bad-tolerance');
    expect(code(ok, { rtol: 0 })).toBe('bad-tolerance');
    expect(code({ ...ok, mass: new Float64Array(3) })).toBe('bad-mass-matrix');
    expect(code({ ...ok, mass: [[1, 0]] })).toBe('bad-mass-matrix');
    expect(code({ ...ok, mass: [[1, 0], [0, NaN]] })).toBe('bad-mass-matrix');
    expect(code({ ...ok, breakpoints: [2] })).toBe('bad-breakpoint');
    expect(code({ ...ok, breakpoints: [-0.5] })).toBe('bad-breakpoint');
    expect(code({ ...ok, breakpoints: [NaN] })).toBe('bad-breakpoint');
    expect(code({ ...ok, index2: [2] })).toBe('bad-index2');
    expect(code({ ...ok, events: [{ fn: 1 as never }] })).toBe('bad-event');
    expect(code({ ...ok, events: [{ fn: () => 0, direction: 2 as never }] })).toBe('bad-event');
    expect(code(ok, { maxStep: 0 })).toBe('bad-option');
    expect(code(ok, { initialStep: -1 })).toBe('bad-option');
    expect(code(ok, { maxSteps: 0 })).toBe('bad-option');
    expect(code(ok, { eventTolerance: 0 })).toBe('bad-option');
    expect(code(ok, { linearAlgebra: 'gpu' as never })).toBe('bad-option');
    expect(code(ok, { outputTimes: [2] })).toBe('bad-output-time');
    expect(code(ok)).toBe('no error');
  });

  it('names the offending value in the message', () => {
    expect(() => solveDae({ ...ok, y0: [1, NaN] })).toThrow(/y0\[1\]/);
    expect(() => solveDae({ ...ok, breakpoints: [2] })).toThrow(/breakpoint 2 lies outside/);
  });

  it('checks a mass matrix given by its non-zeros (massEntries) and names the bad entry', () => {
    const mass = (rows: number[], cols: number[], values: number[]): DaeProblem => ({ ...ok, massEntries: { rows, cols, values } });
    expect(code(mass([0, 1], [0, 1], [1, 1]))).toBe('no error');
    expect(code(mass([0, 1], [0], [1, 1]))).toBe('bad-mass-matrix');
    expect(code(mass([0, 2], [0, 1], [1, 1]))).toBe('bad-mass-matrix');
    expect(code(mass([0, -1], [0, 1], [1, 1]))).toBe('bad-mass-matrix');
    expect(code(mass([0, 0.5], [0, 1], [1, 1]))).toBe('bad-mass-matrix');
    expect(code({ ...ok, massEntries: {} as never })).toBe('bad-mass-matrix');
    expect(code({ ...mass([0], [0], [1]), mass: [[1, 0], [0, 1]] })).toBe('bad-mass-matrix');
    // A non-finite value is caught and named by its entry and position, as a dense one is.
    expect(() => solveDae(mass([0, 1, 1], [0, 1, 0], [1, 1, NaN]))).toThrow(/massEntries entry 2, mass \(1, 0\) = NaN/);
    expect(() => solveDae(mass([0, 1], [0, 1], [1, Infinity]))).toThrow(/mass \(1, 1\) = Infinity/);
    expect(() => solveDae({ ...ok, mass: Float64Array.of(1, 0, -Infinity, 1) })).toThrow(/mass entry \(1, 0\) = -Infinity/);
  });

  it('solves an RC step by massEntries as by the dense mass (closed form v = 1 - exp(-(t - t1)/RC))', () => {
    // RC low-pass, R = 1 kOhm, C = 1 uF, 1 V step at t1 = 1 ms: C v' = (u - v)/R (first-order circuit, closed form).
    // Entries at one position add up: C given as two halves.
    const base = {
      size: 1, y0: [0], t0: 0, tEnd: 0.01, breakpoints: [1e-3],
      rhs: (t: number, v: Float64Array, out: Float64Array) => { out[0] = ((t >= 1e-3 ? 1 : 0) - v[0]!) / 1e3; },
    };
    const dense = solveDae({ ...base, mass: [[1e-6]] }, { rtol: 1e-8, atol: 1e-12 });
    const sparse = solveDae({ ...base, massEntries: { rows: [0, 0], cols: [0, 0], values: [0.5e-6, 0.5e-6] } }, { rtol: 1e-8, atol: 1e-12 });
    expect(sparse.status).toBe('success');
    expect(sparse.t).toEqual(dense.t);
    expect(sparse.y).toEqual(dense.y);
    const exact = 1 - Math.exp(-(0.01 - 1e-3) / 1e-3);
    expect(Math.abs(sparse.y[sparse.y.length - 1]![0]! - exact)).toBeLessThan(1e-6);
  });

  it('does not mutate the caller\'s y0, mass or tolerance arrays', () => {
    const y0 = [0.5, 9]; // y2 inconsistent: corrected internally
    const mass = [[1, 0], [0, 0]];
    const atol = [1e-9, 1e-9];
    const sol = solveDae(
      {
        size: 2,
        y0,
        t0: 0,
        tEnd: 1,
        mass,
        rhs: (_t, y, out) => {
          out[0] = -y[0]!;
          out[1] = y[1]! - y[0]!;
        },
      },
      { atol },
    );
    expect(sol.status).toBe('success');
    expect(y0).toEqual([0.5, 9]);
    expect(mass).toEqual([[1, 0], [0, 0]]);
    expect(atol).toEqual([1e-9, 1e-9]);
  });

  it('solution.at() and component() reject bad arguments', () => {
    const sol = solveDae(ok);
    expect(() => sol.at(-1)).toThrow(InputError);
    expect(() => sol.component(2)).toThrow(InputError);
    const noDense = solveDae(ok, { denseOutput: false });
    expect(() => noDense.at(0.5 * (noDense.t[0]! + noDense.t[1]!))).toThrow(/denseOutput/);
  });
});
