import { InputError } from '../errors.js';
import type { CompiledNetwork } from '../formulation/compile-network.js';
import type { InputsInForce } from '../formulation/network-inputs.js';
import type { NetworkDescription } from '../network/description.js';
import type { ElectricNode, FluxTube, MagneticNode, TwoTerminal, Winding } from '../network/handles.js';
import { elementKind } from '../elements/registry.js';
import { StateReader, type QuantityRequest } from './state-reader.js';
import type { DaeFailure, DaeStatus, SolverStats } from '../solver/types.js';
import { evaluateRecordedStep } from '../simulation/recorded-step.js';
import type { NetworkRun } from '../simulation/network-run.js';
import type { SampleRecord } from '../simulation/sample-record.js';
import { StepBuffer, type StepRecord } from '../simulation/step-record.js';
import { computeEnergyAudit, type EnergyAudit } from './energy-audit.js';
import { resultToCsv, resultToJson, type CsvOptions, type ResultJson } from './export.js';

/** What the run stopped on, with the unknowns named by element. */
export interface SimulationFailure {
  /** Last accepted time, s: all data up to here is valid (NaN when the run failed at its start and holds no valid sample). */
  readonly time: number;
  /** The unknowns involved (largest in the error estimate, non-finite, or at a singular pivot). */
  readonly unknowns: readonly { readonly index: number; readonly label: string; readonly elements: readonly string[] }[];
  /** What f threw, for status `'rhs-error'` (for example a user waveform returning NaN). */
  readonly cause?: unknown;
  /**
   * For status `'non-finite'` found in the recorded data: the first quantity
   * that was not finite (`'state'` for a raw unknown), whose element, tube or
   * node, its value and time. The result ends before it.
   */
  readonly nonFinite?: { readonly quantity: string; readonly name: string; readonly value: number; readonly time: number };
}

/**
 * Construction data of a {@link SimulationResult} (built by `simulate`).
 *
 * @internal
 */
export interface SimulationResultInit {
  readonly compiled: CompiledNetwork;
  readonly networkId: number | undefined;
  /** Samples in time order, each with the input interval it belongs to (a record that does not change). */
  readonly samples: SampleRecord;
  /** The inputs in force over each input interval (between breakpoints of sources and switches, and input changes). */
  readonly intervals: readonly InputsInForce[];
  /** Every accepted step's collocation polynomial, for the energy audit (a record that does not change). */
  readonly steps: StepRecord;
  /** State at the start of the run (after consistent initialisation). */
  readonly initialState: Float64Array | undefined;
  /** State at the end of the run. */
  readonly finalState: Float64Array;
  readonly stats: SolverStats;
  readonly status: DaeStatus;
  readonly message: string;
  readonly failure: DaeFailure | undefined;
  /** Differential unknowns the initialisation moved to meet index-2 hidden constraints. */
  readonly adjustedAtStart: readonly number[];
  /** Further warnings on the model (sanity checks of values far outside practical ranges). */
  readonly modelWarnings?: readonly string[];
  /** Projection of interpolated states onto the algebraic equations (for the energy audit). */
  readonly project?: (t: number, y: Float64Array) => void;
  /** The non-finite value that stopped the run, if that is why it stopped. */
  readonly nonFinite?: SimulationFailure['nonFinite'];
  /** False when the run kept only its samples (simulate's `keepSteps: false`); default true. */
  readonly stepsKept?: boolean;
}

/**
 * Time series of a simulated network, read through the builder's handles.
 * All series are Float64Array aligned with {@link SimulationResult.time}, in
 * SI units. At a switching instant the time vector holds the instant twice:
 * first the state just before, then just after.
 *
 * Sign conventions: a tube's flux is positive from its `from` node to its
 * `to` node; a passive element's or winding's current enters its plus
 * terminal and its power is the power it absorbs; a source's current leaves
 * its plus terminal and its power is the power it delivers.
 *
 * @example
 * ```ts
 * const r = simulate(net, { stopTime: 0.2 });
 * const peakB = Math.max(...r.fluxDensity(leg).map(Math.abs));
 * const iPrimary = r.current(primary);
 * ```
 */
export class SimulationResult {
  /** `'success'` when the run reached the stop time; otherwise why it stopped (see {@link DaeStatus}). */
  readonly status: DaeStatus;
  /** One line on the outcome, naming elements where it can. */
  readonly message: string;
  /** Sample times, s. */
  readonly time: Float64Array;
  /** Solver work, summed over the run. */
  readonly stats: Readonly<SolverStats>;
  /** Present when the run stopped early. */
  readonly failure?: SimulationFailure;
  /** The simulated network as plain data. */
  readonly network: NetworkDescription;
  /**
   * Notes on what the run had to assume, for example initial fluxes moved to
   * agree with a current source that forces a winding's current.
   */
  readonly warnings: readonly string[];

  /** Identity of the builder whose handles this result accepts (undefined when simulated from a description). */
  readonly networkId: number | undefined;

  private readonly compiled: CompiledNetwork;
  /** The samples' states (and their input intervals, so inputs are evaluated on the right side of breakpoints). */
  private readonly samples: SampleRecord;
  private readonly intervals: readonly InputsInForce[];
  private readonly steps: StepRecord;
  private readonly stepsKept: boolean;
  private readonly finalState: Float64Array;
  private readonly initialState: Float64Array | undefined;
  private readonly project: ((t: number, y: Float64Array) => void) | undefined;
  private readonly cache = new Map<string, Float64Array>();
  private audit: EnergyAudit | undefined;
  private readonly reader: StateReader;

  /**
   * Built by `simulate`.
   *
   * @internal
   */
  constructor(init: SimulationResultInit) {
    this.compiled = init.compiled;
    this.networkId = init.networkId;
    this.reader = new StateReader(init.compiled, init.networkId);
    this.network = init.compiled.description;
    this.intervals = init.intervals;
    this.steps = init.steps;
    this.stepsKept = init.stepsKept ?? true;
    this.finalState = init.finalState;
    this.initialState = init.initialState;
    this.project = init.project;
    this.status = init.status;
    this.message = init.message;
    this.stats = Object.freeze({ ...init.stats });
    this.samples = init.samples;
    const time = new Float64Array(init.samples.length);
    for (let k = 0; k < time.length; k++) time[k] = init.samples.time(k);
    this.time = time;
    const layout = init.compiled.layout;
    const d = init.compiled.description;
    this.warnings = Object.freeze([
      ...init.adjustedAtStart.flatMap((i) => {
        // A node potential fixed by ideal voltage sources overrides the initial voltage of capacitors on it: name them.
        const node = layout.potential.indexOf(i);
        const caps = node < 0 ? [] : d.elements.filter((e) => (elementKind(e).initialVoltage?.(e) ?? 0) !== 0 && (e.plus === node || e.minus === node));
        const named = caps.map(
          (c) => `${elementKind(c).noun} "${c.name}": its initial voltage was overridden, because ideal voltage sources fix the potential of its node ` +
            `"${d.electricNodes[node]!.name}" (a loop of capacitors and voltage sources); drop initialVoltage or give the source's value`,
        );
        return named.length > 0
          ? named
          : [`initial ${layout.labels[i]} was changed to agree with the sources (an index-2 structure fixes it); set it in the model to silence this`];
      }),
      ...(init.modelWarnings ?? []),
    ]);
    if (init.failure) {
      this.failure = {
        time: init.steps.length > 0 ? init.steps.t(init.steps.length - 1) : this.time[0] ?? NaN,
        unknowns: init.failure.components.map((i) => ({
          index: i,
          label: layout.labels[i] ?? `unknown ${i}`,
          elements: layout.owners[i] ?? [],
        })),
        ...(init.failure.cause !== undefined ? { cause: init.failure.cause } : {}),
        ...(init.nonFinite ? { nonFinite: init.nonFinite } : {}),
      };
      const named = this.failure.unknowns.map((u) => u.label).join('; ');
      if (named) this.message = `${init.message} (involved: ${named})`;
    }
  }

  /** Refuse what needs every step's polynomial when the run kept only its samples (an audit over part of the run would be wrong). */
  private needSteps(what: string): void {
    if (!this.stepsKept) {
      throw new InputError('steps-not-kept', `${what} needs every solver step, but this run kept only its samples (keepSteps: false); simulate again with keepSteps: true`, []);
    }
  }

  /** Number of samples. @example `r.length === r.time.length` */
  get length(): number {
    return this.time.length;
  }

  /**
   * Flux of a tube, Wb, positive from its `from` node to its `to` node.
   *
   * @example
   * ```ts
   * const phi = r.flux(leg);
   * ```
   */
  flux(tube: FluxTube): Float64Array {
    return this.read({ quantity: 'flux', handle: tube });
  }

  /**
   * Flux density of a tube, T (flux / area). Throws for a reluctance given
   * without an area.
   *
   * @example
   * ```ts
   * const b = r.fluxDensity(leg);
   * ```
   */
  fluxDensity(tube: FluxTube): Float64Array {
    return this.read({ quantity: 'fluxDensity', handle: tube });
  }

  /**
   * Magnetic field strength in a tube of material or an air gap, A/m.
   *
   * @example
   * ```ts
   * const h = r.fieldStrength(leg);
   * ```
   */
  fieldStrength(tube: FluxTube): Float64Array {
    return this.read({ quantity: 'fieldStrength', handle: tube });
  }

  /**
   * MMF drop across a tube, A (ampere-turns): F(phi) from its law plus the
   * eddy-current term R_e dphi/dt when the tube has one.
   *
   * @example
   * ```ts
   * const f = r.mmf(gap);
   * ```
   */
  mmf(tube: FluxTube): Float64Array {
    return this.read({ quantity: 'mmf', handle: tube });
  }

  /**
   * Eddy-current power of a tube, W: R_e (dphi/dt)^2 (zero without eddy resistance).
   *
   * @example
   * ```ts
   * const p = r.eddyPower(leg);
   * ```
   */
  eddyPower(tube: FluxTube): Float64Array {
    return this.read({ quantity: 'eddyPower', handle: tube });
  }

  /**
   * Magnetic scalar potential (MMF) of a magnetic node, A, relative to the
   * first node of its magnetic circuit.
   *
   * @example
   * ```ts
   * const u = r.magneticPotential(topYoke);
   * ```
   */
  magneticPotential(node: MagneticNode): Float64Array {
    return this.read({ quantity: 'magneticPotential', handle: node });
  }

  /**
   * Potential of an electric node, V (ground is 0).
   *
   * @example
   * ```ts
   * const va = r.potential(a);
   * ```
   */
  potential(node: ElectricNode): Float64Array {
    return this.read({ quantity: 'potential', handle: node });
  }

  /**
   * Voltage v_plus - v_minus across a two-terminal element or winding, V.
   *
   * @example
   * ```ts
   * const vLoad = r.voltage(load);
   * ```
   */
  voltage(element: TwoTerminal): Float64Array {
    return this.read({ quantity: 'voltage', handle: element });
  }

  /**
   * Current of an element, A: entering the plus terminal for passive
   * elements and windings; leaving the plus terminal for sources.
   *
   * @example
   * ```ts
   * const i = r.current(primary);
   * ```
   */
  current(element: TwoTerminal): Float64Array {
    return this.read({ quantity: 'current', handle: element });
  }

  /**
   * Power, W: absorbed by passive elements and windings, delivered by sources.
   *
   * @example
   * ```ts
   * const p = r.power(load);
   * ```
   */
  power(element: TwoTerminal): Float64Array {
    return this.read({ quantity: 'power', handle: element });
  }

  /**
   * Induced voltage of a winding, V: orientation * N dphi/dt = v - R i.
   *
   * @example
   * ```ts
   * const e = r.emf(secondary);
   * ```
   */
  emf(winding: Winding): Float64Array {
    return this.read({ quantity: 'emf', handle: winding });
  }

  /**
   * Flux linkage of a winding, Wb-turns: orientation * N * phi of its tube.
   *
   * @example
   * ```ts
   * const lambda = r.fluxLinkage(primary);
   * ```
   */
  fluxLinkage(winding: Winding): Float64Array {
    return this.read({ quantity: 'fluxLinkage', handle: winding });
  }

  /**
   * The energy audit of the run: energy delivered by the sources against
   * energy dissipated plus the change of stored energy, integrated over the
   * solver's steps on its dense output (4-point Gauss-Legendre per step).
   *
   * @example
   * ```ts
   * const audit = r.energy();
   * console.log(audit.relativeError);
   * ```
   */
  energy(): EnergyAudit {
    this.needSteps('energy()');
    // Each step is audited with the inputs recorded for its interval (never those in force now).
    this.audit ??= computeEnergyAudit(
      this.compiled,
      { steps: this.steps, intervals: this.intervals, start: this.initialState, end: this.finalState, ...(this.project ? { project: this.project } : {}) },
      (b, y, t) => this.reader.fluxDerivative(b, y, t),
      this.reader,
    );
    return this.audit;
  }

  /**
   * The raw state vector at sample k (for debugging and advanced use).
   *
   * @example
   * ```ts
   * const y = r.state(r.length - 1);
   * ```
   */
  state(k: number): Float64Array {
    if (!(Number.isInteger(k) && k >= 0 && k < this.length)) throw new InputError('bad-sample', `sample ${k} is outside 0..${this.length - 1}`, []);
    return this.samples.state(k, new Float64Array(this.samples.size));
  }

  /**
   * CSV text: a time column and one column per requested quantity (default:
   * flux density of every tube, current and voltage of every element).
   *
   * @example
   * ```ts
   * writeFileSync('out/run.csv', r.toCSV());
   * ```
   */
  toCSV(options: CsvOptions = {}): string {
    return resultToCsv(this, options);
  }

  /**
   * Plain-data summary: network, status, statistics, energy audit and the
   * default series, ready for JSON.stringify.
   *
   * @example
   * ```ts
   * writeFileSync('out/run.json', JSON.stringify(r.toJSON()));
   * ```
   */
  toJSON(): ResultJson {
    return resultToJson(this);
  }

  /**
   * Copper loss of a winding, W: R i^2 (its `power` v i also carries the
   * energy flowing into the core).
   *
   * @example
   * ```ts
   * const p = r.copperLoss(primary);
   * ```
   */
  copperLoss(winding: Winding): Float64Array {
    return this.read({ quantity: 'copperLoss', handle: winding });
  }

  /**
   * A quantity at any time of the run, for the metrics that take a dense
   * evaluator (`at` option): the state comes from the collocation polynomial
   * of the solver step that contains t, with the algebraic unknowns solved
   * from the network's equations there. At a switching instant it gives the
   * value just after.
   *
   * @example
   * ```ts
   * const iAt = r.evaluator({ quantity: 'current', handle: primary });
   * const peak = seriesPeak(r.time, r.current(primary), { at: iAt });
   * ```
   */
  evaluator(request: QuantityRequest): (t: number) => number {
    this.needSteps('evaluator()');
    const fn = this.reader.build(request);
    const steps = this.steps;
    const y = new Float64Array(this.compiled.layout.size);
    const step = new StepBuffer(this.compiled.layout.size);
    // The step last loaded (a record that never changes): calls in time order read one step many times,
    // and loading a reduced run's step solves its algebraic unknowns at two nodes.
    let loaded = -1;
    return (t) => {
      if (steps.length === 0 || !(t >= steps.tOld(0) && t <= steps.t(steps.length - 1))) {
        throw new InputError('outside-result', `evaluator: t = ${t} s lies outside the simulated span`, []);
      }
      // Last step with tOld <= t (a switching instant belongs to the step that starts there).
      let lo = 0;
      let hi = steps.length - 1;
      while (lo < hi) {
        const mid = (lo + hi + 1) >> 1;
        if (steps.tOld(mid) <= t) lo = mid;
        else hi = mid - 1;
      }
      if (lo !== loaded) {
        steps.load(lo, step);
        loaded = lo;
      }
      // The inputs recorded for the step's interval, for this call only: a live run goes on with its own.
      return this.compiled.inputs.during(this.intervals[step.interval]!, () => {
        evaluateRecordedStep(step, t, this.compiled.index2, y);
        this.project?.(t, y);
        return fn(y, t);
      });
    };
  }

  /**
   * Any quantity by request, e.g. `r.read({ quantity: 'fluxDensity', handle: leg })`.
   *
   * @example
   * ```ts
   * const cols = [{ quantity: 'current', handle: primary }] as const;
   * const i = r.read(cols[0]);
   * ```
   */
  read(request: QuantityRequest): Float64Array {
    const key = `${request.quantity}:${request.handle.kind}:${request.handle.index}`;
    let s = this.cache.get(key);
    if (!s) {
      const fn = this.reader.build(request);
      const series = new Float64Array(this.time.length);
      const samples = this.samples;
      const y = new Float64Array(samples.size);
      // Each sample with the inputs recorded for it, for this call only: a live run goes on with its own
      // (as inputs.during per sample, without a closure per sample).
      const inputs = this.compiled.inputs;
      const before = inputs.inForce;
      try {
        for (let k = 0; k < series.length; k++) {
          const p = this.intervals[samples.interval(k)];
          if (p) inputs.use(p);
          else inputs.use(before);
          series[k] = fn(samples.state(k, y), this.time[k]!);
        }
      } finally {
        inputs.use(before);
      }
      s = series;
      this.cache.set(key, s);
    }
    return s;
  }

}

/**
 * The result of what a run recorded so far (copies of its records, so the run
 * may go on): `successMessage` is the message when the run did not fail.
 * Shared by `simulate`, the stepper's history and the periodic steady state.
 *
 * @internal
 */
export function resultFromRun(
  compiled: CompiledNetwork,
  networkId: number | undefined,
  run: NetworkRun,
  successMessage: string,
  modelWarnings: readonly string[] = [],
): SimulationResult {
  // A terminal event is handled by the stepper (it resumes); it is not an outcome of the record.
  const status = run.status === 'running' || run.status === 'terminal-event' ? 'success' : run.status;
  const samples = run.sampleRecord.snapshot();
  return new SimulationResult({
    compiled,
    networkId,
    samples,
    intervals: [...run.intervals],
    steps: run.stepRecord.snapshot(samples),
    initialState: run.initialState,
    finalState: run.y,
    stats: run.stats,
    status,
    message: status === 'success' ? successMessage : run.message,
    failure: status === 'success' ? undefined : run.failure,
    adjustedAtStart: run.adjustedAtStart,
    modelWarnings,
    project: run.project,
    ...(status !== 'success' && run.nonFinite ? { nonFinite: run.nonFinite } : {}),
    ...(run.keptEveryStep ? {} : { stepsKept: false }),
  });
}
