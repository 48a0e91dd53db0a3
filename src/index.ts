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
export type { MaterialLaw } from './materials/material-law.js';
export { linearMaterial, type LinearMaterialSpec } from './materials/linear.js';
export { compileMaterial, type MaterialSpec } from './materials/material-spec.js';
export type { Waveform } from './waveforms/waveform.js';
export { constant, constantWaveform, type ConstantSpec } from './waveforms/constant.js';
export { sine, sineWaveform, type SineSpec } from './waveforms/sine.js';
export { compileWaveform, type WaveformSpec } from './waveforms/waveform-spec.js';
// geometry: core constants, gaps, leakage, shape layouts
export { mm, mm2 } from './geometry/units.js';
export { coreConstants, type CoreSection, type CoreConstants, type CoreConstantsOptions } from './geometry/core-constants.js';
export { toroidConstants, type ToroidDimensions } from './geometry/toroid-constants.js';
export { mclymanFringingFactor, matschFringingFactor, SHORT_GAP_LIMIT, type FringingModel } from './geometry/fringing-factor.js';
export { gapReluctance, type GapReluctanceInput, type GapReluctance } from './geometry/gap-reluctance.js';
export { concentricLeakageReluctance, type ConcentricWindingsGeometry } from './geometry/leakage-reluctance.js';
export type {
  CoreLayout,
  CoreShape,
  MeanPathConvention,
  LayoutMember,
  LayoutPath,
  LayoutCorePath,
  LayoutGapPath,
  LayoutLeakagePath,
  LayoutLeg,
  LayoutWindings,
  LayoutWindow,
} from './geometry/core-layout.js';
export { pathReluctance } from './geometry/path-reluctance.js';
export type { LegGap, LegGapFringing, LegWindings, RectangularCoreDimensions } from './geometry/row-layout.js';
export { toroidLayout, type ToroidInput } from './geometry/toroid-layout.js';
export { uCoreLayout, type UCoreInput } from './geometry/u-core-layout.js';
export { eCoreLayout, type ECoreInput } from './geometry/e-core-layout.js';
export { threeLimbLayout, type ThreeLimbInput, type PhaseLimb } from './geometry/three-limb-layout.js';
export { fiveLimbLayout, type FiveLimbInput } from './geometry/five-limb-layout.js';
