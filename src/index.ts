/**
 * fluxstate: time-domain simulation of magnetic networks coupled to electric
 * circuits, with flux as a state variable.
 *
 * @packageDocumentation
 */
export { FluxstateError, InputError, TopologyError } from './errors.js';
export { MU0 } from './constants.js';
export type {
  DaeProblem,
  DaeEvent,
  DaeProgress,
  DaeSolution,
  DaeStatus,
  DaeFailure,
  DaeEventRecord,
  SolveDaeOptions,
  SolverStats,
  RhsFunction,
  JacobianFunction,
  MassMatrixInput,
} from './solver/types.js';
// --- solver (generic DAE integrator) ---
export { solveDae } from './solver/solve-dae.js';
export {
  createDaeIntegrator,
  type DaeIntegrator,
  type DaeIntegratorSnapshot,
  type DaeStepInterpolant,
  type DaeStepResult,
  type DaeStepStatus,
} from './solver/dae-integrator.js';
export { finiteDifferenceJacobian } from './solver/finite-difference-jacobian.js';
export { consistentInitialValues, type ConsistentInitialValues } from './solver/consistent-initial-values.js';
export type { RealLinearSolver, ComplexLinearSolver } from './solver/linear-solver.js';
export { createDenseLu } from './solver/dense-lu.js';
export { createComplexLu } from './solver/complex-lu.js';
export { createMlMatrixLu, createEmbeddedComplexLu } from './solver/ml-matrix-lu.js';
export type { MaterialLaw } from './materials/material-law.js';
export { linearMaterial, type LinearMaterialSpec } from './materials/linear.js';
export { compileMaterial, type MaterialSpec } from './materials/material-spec.js';
export type { Waveform } from './waveforms/waveform.js';
export { constant, constantWaveform, type ConstantSpec } from './waveforms/constant.js';
export { sine, sineWaveform, type SineSpec } from './waveforms/sine.js';
export { compileWaveform, type WaveformSpec } from './waveforms/waveform-spec.js';
