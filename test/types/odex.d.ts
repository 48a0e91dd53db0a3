/**
 * Local type declarations for odex 2.0.4 (E. Hairer's ODEX extrapolation code
 * ported to JavaScript). The package ships its TypeScript source beside the
 * compiled file but no declarations, and that source does not compile under
 * this project's strict settings, so it is loaded through test/support/odex.ts
 * with these types. Only what the tests and the benchmark use.
 * Source: node_modules/odex/src/odex.ts.
 */

/** y' = f(x, y), returning a new array. */
export type OdexDerivative = (x: number, y: number[]) => number[];

/** Per-step observer; return false to stop. */
export type OdexOutputFunction = (
  nr: number,
  xold: number,
  x: number,
  y: number[],
  dense?: (c: number, x: number) => number,
) => boolean | void;

export interface OdexResult {
  y: number[];
  /** 0 converged, 1 maxSteps exceeded, 2 early return. */
  outcome: 0 | 1 | 2;
  nStep: number;
  xEnd: number;
  nAccept: number;
  nReject: number;
  nEval: number;
}

export interface OdexSolver {
  absoluteTolerance: number | number[];
  relativeTolerance: number | number[];
  maxSteps: number;
  initialStepSize: number;
  maxStepSize: number;
  denseOutput: boolean;
  /** Observer that samples the dense output on a uniform grid (needs denseOutput = true). */
  grid(dt: number, out: (xOut: number, yOut: number[]) => unknown): OdexOutputFunction;
  solve(f: OdexDerivative, x: number, y0: number[], xEnd: number, solOut?: OdexOutputFunction): OdexResult;
}

export interface OdexModule {
  Solver: new (n: number) => OdexSolver;
}
