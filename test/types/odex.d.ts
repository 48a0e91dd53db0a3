// Local declaration for odex@2.0.4, mapped by tsconfig "paths": the package ships its TypeScript
// source beside its CommonJS entry point, which would otherwise be type-checked under our strict
// settings. Only what the tests and the benchmark use.
export type Derivative = (x: number, y: number[]) => number[];
export type OutputFunction = (
  nr: number,
  xold: number,
  x: number,
  y: number[],
  dense?: (c: number, x: number) => number,
) => boolean | void;
export declare enum Outcome {
  Converged = 0,
  MaxStepsExceeded = 1,
  EarlyReturn = 2,
}
export declare class Solver {
  constructor(n: number);
  n: number;
  absoluteTolerance: number | number[];
  relativeTolerance: number | number[];
  maxSteps: number;
  initialStepSize: number;
  maxStepSize: number;
  denseOutput: boolean;
  grid(dt: number, out: (xOut: number, yOut: number[]) => unknown): OutputFunction;
  solve(
    f: Derivative,
    x: number,
    y0: number[],
    xEnd: number,
    solOut?: OutputFunction,
  ): { y: number[]; outcome: Outcome; nStep: number; xEnd: number; nAccept: number; nReject: number; nEval: number };
}
