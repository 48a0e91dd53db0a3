/**
 * Minimal local type declarations for odex 2.0.4 (E. Hairer's ODEX
 * extrapolation code ported to JavaScript), which ships none. Only what the
 * tests and the benchmark use. Source: node_modules/odex/src/odex.ts.
 */
declare module 'odex' {
  export enum Outcome {
    Converged = 0,
    MaxStepsExceeded = 1,
    EarlyReturn = 2,
  }
  export type Derivative = (x: number, y: number[]) => number[];
  export type OutputFunction = (
    nr: number,
    xold: number,
    x: number,
    y: number[],
    dense?: (c: number, x: number) => number,
  ) => boolean | void;
  export interface SolverResult {
    y: number[];
    outcome: Outcome;
    nStep: number;
    xEnd: number;
    nAccept: number;
    nReject: number;
    nEval: number;
  }
  export class Solver {
    constructor(n: number);
    absoluteTolerance: number | number[];
    relativeTolerance: number | number[];
    maxSteps: number;
    initialStepSize: number;
    maxStepSize: number;
    denseOutput: boolean;
    solve(f: Derivative, x: number, y0: number[], xEnd: number, solOut?: OutputFunction): SolverResult;
  }
}
