/**
 * fluxstate: time-domain simulation of magnetic networks coupled to electric
 * circuits, with flux as a state variable.
 *
 * @packageDocumentation
 * @module fluxstate
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
  JacobianEntriesFunction,
  JacobianEntryTarget,
  MassMatrixInput,
  MassEntries,
} from './solver/types.js';
export { SPARSE_MIN_SIZE } from './solver/types.js';
// --- solver (generic DAE integrator) ---
export { solveDae } from './solver/solve-dae.js';
export {
  createDaeIntegrator,
  type DaeIntegrator,
  type DaeIntegratorSnapshot,
  type DaeStepInterpolant,
  type DaeStepResult,
  type DaeStepStatus,
  type RestartOptions,
} from './solver/dae-integrator.js';
export { finiteDifferenceJacobian } from './solver/finite-difference-jacobian.js';
export { consistentInitialValues, type ConsistentInitialValues } from './solver/consistent-initial-values.js';
export type { RealLinearSolver, ComplexLinearSolver } from './solver/linear-solver.js';
export { createDenseLu } from './solver/dense-lu.js';
export { createComplexLu } from './solver/complex-lu.js';
export type { TakeFloat64 } from './solver/float64-chunks.js';
export { createSparseLu, type SparseRealLinearSolver } from './solver/sparse-lu.js';
export { createSparseComplexLu, type SparseComplexLinearSolver } from './solver/sparse-complex-lu.js';
export { createSparseMatrix, sparsePattern, patternOfDense, type SparseMatrix, type SparsePattern } from './solver/sparse-pattern.js';
export { analyseBand, type BandStructure } from './solver/band-structure.js';
export { reverseCuthillMcKee } from './solver/reverse-cuthill-mckee.js';
export { createMlMatrixLu, createEmbeddedComplexLu } from './solver/ml-matrix-lu.js';
export type { MaterialLaw } from './materials/material-law.js';
export { linearMaterial, type LinearMaterialSpec } from './materials/linear.js';
export { compileMaterial, type MaterialSpec } from './materials/material-spec.js';
// Waveforms (source waveforms with their breakpoints)
// Nonlinear materials: analytic laws, B-H tables, fitting, demo materials.
export { frohlichKennellyMaterial, type FrohlichKennellySpec } from './materials/frohlich-kennelly.js';
export { brauerMaterial, brauerAirLineJoin, type BrauerSpec, type BrauerJoin } from './materials/brauer.js';
export { bhTableMaterial, type BhTableSpec } from './materials/bh-table.js';
export type { BhTableData } from './materials/bh-table-data.js';
export {
  fitMaterial,
  type FitMaterialOptions,
  type FitError,
  type MaterialFit,
  type FrohlichKennellyParameters,
  type BrauerParameters,
} from './materials/fit-material.js';
export {
  levenbergMarquardt,
  type LeastSquaresProblem,
  type LevenbergMarquardtOptions,
  type LevenbergMarquardtResult,
  type LevenbergMarquardtStatus,
} from './materials/levenberg-marquardt.js';
export { demoMaterials, type DemoMaterials } from './materials/demo-materials.js';
// Hysteresis (issue 13): inverse Jiles-Atherton material, loops, fits, the constant-mass reactor form
export {
  inverseJilesAtherton,
  checkJilesAthertonSpec,
  type JilesAthertonSpec,
  type JilesAthertonPoint,
  type HystereticMaterial,
} from './materials/hysteresis/inverse-jiles-atherton.js';
export {
  traceFluxDensityPath,
  advanceAlongPath,
  type FluxDensityPathOptions,
  type FluxDensityTrace,
  type PathState,
} from './materials/hysteresis/flux-density-path.js';
export { hysteresisLoopFeatures, type HysteresisLoopFeatures } from './materials/hysteresis/hysteresis-loop-features.js';
export { residualFluxDensity } from './materials/hysteresis/residual-flux-density.js';
export {
  fitHysteresisLoop,
  fitLoopFeatures,
  type JilesAthertonParameters,
  type MeasuredLoopBranch,
  type LoopFeatureData,
  type JilesAthertonFit,
  type JilesAthertonFitOptions,
} from './materials/hysteresis/fit-jiles-atherton.js';
export { REVERSAL_BAND, hysteresisLossRate, magnetisationRate, magnetisationRatePartials } from './materials/hysteresis/magnetisation-rate.js';
export {
  hystereticReactorProblem,
  HYSTERETIC_REACTOR_UNKNOWNS,
  type HystereticReactorSpec,
} from './materials/hysteresis/hysteretic-reactor-problem.js';
export { demoHystereticMaterials, type DemoHystereticMaterials } from './materials/hysteresis/demo-hysteretic-materials.js';
export { hystereticTubeReadings, residualFluxDensityAtEnd, type HystereticTubeReadings } from './elements/hysteretic-tube-readings.js';
export type { Waveform } from './waveforms/waveform.js';
export { constant, constantWaveform, type ConstantSpec } from './waveforms/constant.js';
export { sine, sineWaveform, type SineSpec } from './waveforms/sine.js';
export { pulse, pulseWaveform, type PulseSpec } from './waveforms/pulse.js';
export {
  bipolarSquare,
  bipolarSquareWaveform,
  bipolarSquareOnTimes,
  type BipolarSquareSpec,
} from './waveforms/bipolar-square.js';
export { piecewiseLinear, piecewiseLinearWaveform, type PiecewiseLinearSpec } from './waveforms/piecewise-linear.js';
export { userFunction, userFunctionWaveform, type UserFunctionSpec } from './waveforms/user-function.js';
export { resolveFunctionWaveform, type ResolveFunctionOptions } from './waveforms/resolve-function-waveform.js';
export { compileWaveform, type WaveformSpec } from './waveforms/waveform-spec.js';
export { GATE_THRESHOLD } from './formulation/network-inputs.js';

// Network builder, simulation and results
export { createNetwork, NetworkBuilder } from './network/network-builder.js';
export type {
  FluxTubeOptions,
  AirGapOptions,
  ReluctanceOptions,
  WindingOptions,
  SwitchOptions,
  DiodeOptions,
  TubeInitialCondition,
} from './network/network-builder.js';
export type {
  HandleBase,
  ElectricNode,
  MagneticNode,
  FluxTube,
  Winding,
  Resistor,
  Capacitor,
  Inductor,
  VoltageSource,
  CurrentSource,
  Switch,
  Diode,
  TwoTerminal,
  Source,
  AnyHandle,
} from './network/handles.js';
export type {
  NetworkDescription,
  TubeDescription,
  TubeLaw,
  HystereticTubeLaw,
  ElementDescription,
  ResistorDescription,
  CapacitorDescription,
  InductorDescription,
  VoltageSourceDescription,
  CurrentSourceDescription,
  SwitchDescription,
  DiodeDescription,
  WindingDescription,
} from './network/description.js';
export { handlesOf, type DescriptionHandles } from './network/handles-of.js';
export { simulate } from './simulate.js';
export type { SimulateOptions, AbsoluteTolerances, SolverSettings, NetworkInput, Sampling, SimulationProgress } from './simulate.js';
export { SimulationResult } from './result/simulation-result.js';
export type { SimulationFailure } from './result/simulation-result.js';
export type { EnergyAudit, TubeLosses } from './result/energy-audit.js';
export type { ExportColumn, CsvOptions, ResultJson } from './result/export.js';
// Analysis: metrics on sampled time series
export type { WindowOptions, CycleOptions } from './analysis/metrics/series-options.js';
export { seriesIntegral } from './analysis/metrics/series-integral.js';
export { seriesMean } from './analysis/metrics/series-mean.js';
export { seriesRms } from './analysis/metrics/series-rms.js';
export { seriesPeak, type SeriesPeak } from './analysis/metrics/series-peak.js';
export { cumulativeIntegral, type CumulativeOptions } from './analysis/metrics/cumulative-integral.js';
export { energyIntegral, type EnergyIntegral } from './analysis/metrics/energy-integral.js';
export { lossTotals, type LossTotals, type LossTotalsOptions } from './analysis/metrics/loss-totals.js';
export { cycleMeans, type CycleMeans } from './analysis/metrics/cycle-means.js';
export {
  fitExponentialDecay,
  type ExponentialFit,
  type ExponentialFitOptions,
} from './analysis/metrics/fit-exponential-decay.js';
export { dcOffsetDecay, type DcOffsetDecay, type DcOffsetDecayOptions } from './analysis/metrics/dc-offset-decay.js';
export { voltSecondsPerHalfCycle, type VoltSeconds } from './analysis/metrics/volt-seconds.js';
export {
  fluxDensityMargin,
  fluxDensityMargins,
  type FluxDensityMargin,
  type FluxDensityMarginOptions,
  type FluxDensitySeries,
} from './analysis/metrics/flux-density-margin.js';
export { inrushRatio, type InrushRatio, type InrushRatioOptions } from './analysis/metrics/inrush-ratio.js';
export { harmonics, type Harmonics, type HarmonicsOptions } from './analysis/metrics/harmonics.js';

// Analysis: core loss post-processing (Steinmetz, iGSE)
export type { SteinmetzCoefficients } from './analysis/core-loss/steinmetz-coefficients.js';
export { gammaFunction } from './analysis/core-loss/gamma-function.js';
export { cosinePowerIntegral } from './analysis/core-loss/cosine-power-integral.js';
export { steinmetzLossDensity } from './analysis/core-loss/steinmetz.js';
export { igseCoefficient } from './analysis/core-loss/igse-coefficient.js';
export { igseLossDensity, type IgseOptions } from './analysis/core-loss/igse-loss-density.js';
export {
  coreLoss,
  type CoreLoss,
  type CoreLossOptions,
  type CoreLossTube,
  type TubeCoreLoss,
} from './analysis/core-loss/core-loss.js';
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
export { addCoreLayout, type AddCoreLayoutOptions, type CoreHandles } from './network/add-core-layout.js';
export { QUANTITY_UNITS, type QuantityRequest, type QuantityName } from './result/state-reader.js';
export { createStepper, NetworkStepper, type StepperOptions, type StepperSnapshot, type Threshold } from './stepping/network-stepper.js';
export { periodicSteadyState, type PeriodicSteadyStateOptions, type PeriodicSteadyState } from './analysis/periodic-steady-state.js';
export { resultCoreLoss, type ResultCoreLossOptions } from './analysis/core-loss/result-core-loss.js';
// Reliability: checks of plain-data descriptions and live material laws (see docs/errors.md)
export { validateDescription } from './network/validate-description.js';
export { checkMaterialLaw } from './materials/check-material-law.js';
export type { WaveformOwner } from './waveforms/waveform-error.js';
// Analysis: inductances of windings at an operating point
export {
  inductanceMatrix,
  type InductanceMatrix,
  type InductanceMatrixOptions,
  type OperatingPointTube,
} from './analysis/inductance/inductance-matrix.js';
export { incrementalInductance, type InductanceCurve } from './analysis/inductance/incremental-inductance.js';
export { worstCase, type WorstCase, type WorstCaseOptions, type WorstCaseParameter } from './analysis/search/worst-case.js';
export { sanityWarnings, resultSanityWarnings, type SanityWarning } from './analysis/sanity-warnings.js';
export { zeroSequenceReluctance, type ZeroSequencePath } from './geometry/tank-path.js';
export type { LayoutTankPath } from './geometry/core-layout.js';
