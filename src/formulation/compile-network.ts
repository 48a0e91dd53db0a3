import type { CompiledElement, ElementEvent, ElementGroup, InputView, StampContext } from '../elements/element-kind.js';
import { elementKind, tubeKind } from '../elements/registry.js';
import { DenseStampTarget, EntryRecordingStampTarget, PatternRecordingStampTarget, type StampTarget } from '../elements/stamp-target.js';
import type { CompiledTube, TubeLoops } from '../elements/tube-kind.js';
import { packedDoublesFrom } from '../solver/packed-doubles.js';
import type { ElementDescription, NetworkDescription } from '../network/description.js';
import { fundamentalLoops, type MagneticLoops } from './magnetic-graph.js';
import { NetworkInputs } from './network-inputs.js';
import { NetworkEquations, type MmfTerm } from './network-equations.js';
import { layoutUnknowns, type UnknownLayout } from './unknown-layout.js';
import { checkTopology } from './topology-checks.js';
import { findIndexTwoUnknowns } from './index-analysis.js';
import { checkFluxRatesDetermined } from './flux-rate-check.js';
import { initialState } from './initial-state.js';
import { nonAffineUnknowns, type NonAffineUnknowns } from './affine-declarations.js';
import { algebraicJacobian, massSpaces } from '../solver/consistent-initialization.js';
import { createPatternAdaptiveLu } from '../solver/sparse-adaptive-lu.js';
import { denseOfSparseMass, sparseMassOfEntries, type SparseMass } from '../solver/sparse-mass.js';

export type { CompiledTube } from '../elements/tube-kind.js';

/**
 * A network compiled into the pieces of a DAE M y' = f(t, y): the mass
 * matrix, the right-hand side and its analytic Jacobian (assembled from
 * element stamps), the initial state, breakpoints, the index-2 unknowns and
 * the maps back to per-element quantities.
 */
export interface CompiledNetwork {
  readonly description: NetworkDescription;
  readonly layout: UnknownLayout;
  readonly loops: MagneticLoops;
  readonly tubes: readonly CompiledTube[];
  /** Every element, compiled by its kind (same order as the description's `elements`). */
  readonly elements: readonly CompiledElement[];
  /**
   * Row-major n*n constant mass matrix, made from {@link CompiledNetwork.massEntries}
   * on first read (the sparse path never reads it).
   */
  readonly mass: Float64Array;
  /**
   * The mass matrix's stamps as recorded at compile time, entry k at
   * (rows[k], cols[k]) with value values[k] (entries at one position add
   * up): M by its non-zeros, as `DaeProblem.massEntries` takes it.
   */
  readonly massEntries: { readonly rows: Int32Array; readonly cols: Int32Array; readonly values: Float64Array };
  /** The same M in compressed rows (duplicates summed, zeros dropped). @internal */
  readonly sparseMass: SparseMass;
  /** Whether the n x n {@link CompiledNetwork.mass} has been made (for tests of the sparse path). @internal */
  denseMassMade(): boolean;
  /** f and df/dy as methods of one object (the solver's hot call sites). @internal */
  readonly equations: NetworkEquations;
  /** f(t, y) into out, with the inputs in force given explicitly. */
  evaluate(t: number, y: Float64Array, inputs: InputView, out: Float64Array): void;
  /** df/dy added into a stamp target (zero-filled by the caller), with the inputs given explicitly. */
  stampJacobian(t: number, y: Float64Array, inputs: InputView, J: StampTarget): void;
  /** f(t, y) into out, with the network's own inputs (`inputs`). */
  rhs(t: number, y: Float64Array, out: Float64Array): void;
  /** df/dy into out (row-major n*n, zero-filled by the caller), with the network's own inputs. */
  jacobian(t: number, y: Float64Array, out: Float64Array): void;
  /** Initial state before consistent initialisation of the algebraic unknowns. */
  readonly y0: Float64Array;
  /**
   * Every position df/dy may have a non-zero at, recorded from the elements'
   * stamps at compile time (the same for every state and input): the pattern
   * the sparse solver factors on. Undefined when an element's stamp threw at
   * the initial state (the run then reports that error itself, densely).
   */
  readonly jacobianPattern: { readonly rows: Int32Array; readonly cols: Int32Array } | undefined;
  /** Unknowns of index 2 (error scaled by h in the solver). */
  readonly index2: readonly number[];
  /** Source values and switch states, with embedding overrides. */
  readonly inputs: NetworkInputs;
  /** Event functions of devices that switch on their own (ideal diodes), in element order. */
  readonly events: readonly ElementEvent[];
  /** Flux of tube b in the state y, Wb. */
  tubeFlux(y: Float64Array, b: number): number;
  /** MMF drop F_b(phi) of tube b from its law (eddy term excluded) at state y, A. */
  tubeMmf(b: number, flux: number, y: Float64Array): number;
  /** Stored magnetic energy of tube b at flux phi and state y, J. */
  tubeEnergy(b: number, flux: number, y: Float64Array): number;
  /** What the elements and tubes declare about entering unknowns other than affinely (for the reduced formulation). */
  nonAffineUnknowns(): NonAffineUnknowns;
}

/**
 * Compile a network description: check its topology, find its magnetic
 * loops, lay out the unknowns, and build M, f, df/dy and y0.
 *
 * @example
 * ```ts
 * const compiled = compileNetwork(net.describe());
 * compiled.rhs(0, compiled.y0, new Float64Array(compiled.layout.size));
 * ```
 */
export function compileNetwork(description: NetworkDescription): CompiledNetwork {
  const d = description;
  const loops = fundamentalLoops(
    d.magneticNodes.length,
    d.tubes.map((t) => ({ from: t.from, to: t.to })),
  );
  checkTopology(d, loops);
  const layout = layoutUnknowns(d, loops);
  const n = layout.size;
  const inputs = new NetworkInputs(d);

  // Tube -> loop incidence, with loop indices already offset into y.
  const tubeLoops = loops.tubeLoops.map(
    (entries) =>
      new TubeLoopIncidence(
        Array.from(entries, (en) => layout.loopOffset + en.loop),
        packedDoublesFrom(entries, (en) => en.sign),
      ),
  );
  const tubes: CompiledTube[] = d.tubes.map((t, b) =>
    tubeKind(t.law).compile(t.law, t, { stateOffset: layout.tubeStates[b]!, loops: tubeLoops[b]! }),
  );
  const ctx: StampContext = {
    potential: (node) => layout.potential[node]!,
    branchCurrent: (element) => layout.branchCurrent[element]!,
    tubeLoops: (b) => tubeLoops[b]!,
    internalStates: (element) => layout.elementStates[element]!,
  };
  const groups = compileGroups(d, ctx, n);
  const elements: CompiledElement[] = new Array<CompiledElement>(d.elements.length);
  for (const g of groups) for (const e of g.elements) elements[e.index] = e;
  const tubeStates = tubes.flatMap((t) => (t.states ? [t.states] : []));

  // Tubes in series with one law share one evaluation of it per call (see seriesTerms).
  const equations = new NetworkEquations(tubes, tubeLoops, seriesTerms(d, tubes, tubeLoops), tubeStates, groups);
  const evaluate = (t: number, y: Float64Array, inp: InputView, out: Float64Array): void => equations.evaluate(t, y, inp, out);
  const stampJacobian = (t: number, y: Float64Array, inp: InputView, J: StampTarget): void => equations.stampJacobian(t, y, inp, J);

  const jacobianTarget = new DenseStampTarget(n);
  // M by its stamps, recorded entry by entry: no n x n array unless a dense reader asks for one.
  const massTarget = new EntryRecordingStampTarget();
  for (const g of groups) g.mass(massTarget);
  for (const s of tubeStates) s.mass(massTarget);
  // Eddy term R_e dphi/dt in the MMF drop of every loop through the tube.
  tubes.forEach((tube, b) => {
    if (tube.eddyResistance === 0) return;
    const { index, sign } = tubeLoops[b]!;
    for (let k1 = 0; k1 < index.length; k1++) {
      for (let k2 = 0; k2 < index.length; k2++) massTarget.add(index[k1]!, index[k2]!, sign[k1]! * sign[k2]! * tube.eddyResistance);
    }
  });
  const massEntries = { rows: Int32Array.from(massTarget.rows), cols: Int32Array.from(massTarget.cols), values: Float64Array.from(massTarget.values) };
  const sparseMass = sparseMassOfEntries(n, massEntries.rows, massEntries.cols, massEntries.values);
  let denseMass: Float64Array | undefined;
  const mass = (): Float64Array => (denseMass ??= denseOfSparseMass(sparseMass));

  const rhs = (t: number, y: Float64Array, out: Float64Array): void => evaluate(t, y, inputs, out);
  const jacobian = (t: number, y: Float64Array, out: Float64Array): void => stampJacobian(t, y, inputs, jacobianTarget.bind(out));

  const y0 = initialState(d, layout, loops, tubes);
  for (const g of groups) g.initial?.(y0);
  for (const s of tubeStates) s.initial(y0);
  // Stamps touch the same positions whatever the state and inputs: one recorded pass gives the pattern.
  const jacobianPattern = recordJacobianPattern(stampJacobian, y0, inputs);
  const index2 = confirmIndexTwo(findIndexTwoUnknowns(d, layout), sparseMass, n, (y, J) => jacobian(0, y, J), y0);
  checkFluxRatesDetermined(tubes, tubeLoops, mass, n, (y, J) => jacobian(0, y, J), y0);

  return {
    description: d,
    layout,
    loops,
    tubes,
    elements,
    get mass() {
      return mass();
    },
    massEntries,
    sparseMass,
    denseMassMade: () => denseMass !== undefined,
    equations,
    evaluate,
    stampJacobian,
    rhs,
    jacobian,
    y0,
    jacobianPattern,
    index2,
    inputs,
    events: groups.flatMap((g) => g.events ?? []).sort((a, b) => a.element - b.element),
    tubeFlux: (y, b) => equations.fluxOf(y, b),
    tubeMmf: (b, flux, y) => tubes[b]!.mmf(flux, y),
    tubeEnergy: (b, flux, y) => tubes[b]!.energy(flux, y),
    nonAffineUnknowns: () => nonAffineUnknowns(d, ctx, layout.tubeStates, tubeLoops),
  };
}

/**
 * One tube's loop incidence, read by f and J at every call. A class, not a
 * literal: V8 gives two-field literals that start with `index` one shared
 * map (the integrator's event records keep a number there, which threw away
 * the optimised code reading tube loops), and widens the field types of a
 * literal evaluated again at the next compile.
 */
class TubeLoopIncidence implements TubeLoops {
  constructor(
    readonly index: readonly number[],
    readonly sign: readonly number[],
  ) {}
}

/**
 * The structural rules mark inductive cut-sets, but magnetic coupling can
 * make such a cut-set index 1 (a transformer secondary in series with an
 * inductor: its current is not fixed by the flux alone). The DAE is index 1
 * when W0^T J V0 is nonsingular (W0, V0: left and right null spaces of M;
 * Hairer and Wanner II, sect. VII.1); then no unknown needs the index-2
 * treatment. Checked at the initial state.
 */
function confirmIndexTwo(
  structural: number[],
  mass: SparseMass,
  n: number,
  jacobian: (y: Float64Array, J: Float64Array) => void,
  y0: Float64Array,
): number[] {
  if (structural.length === 0) return structural;
  const spaces = massSpaces(mass, n);
  const k = spaces.k;
  if (k === 0) return structural;
  const J = new Float64Array(n * n);
  jacobian(y0, J);
  const jr = algebraicJacobian(spaces, J, new Float64Array(k * k));
  return createPatternAdaptiveLu(k).factor(jr) < 0 ? [] : structural;
}

/**
 * One entry per tube, in tube order. Material tubes that carry the same
 * loop fluxes (the same incidence: tubes in series), with the same area and
 * the same law, have the same flux density B = phi / A, so H(B) is
 * evaluated once for them all and each tube's drop is still its own
 * l H(B), added where it was: f and df/dy bit for bit as tube by tube,
 * with one law evaluation instead of one per tube (the two halves of the
 * core of the flux walk, bench/flux-walk.ts). A law is the same when it is
 * the same law object or the same pair of functions, or, for a spec, an
 * equal spec (a spec compiles to the same law every time). Tubes with
 * internal states, and tubes alone in their series, read their own mmf.
 */
function seriesTerms(
  d: NetworkDescription,
  tubes: readonly CompiledTube[],
  tubeLoops: readonly TubeLoops[],
): MmfTerm[] {
  const seriesOf = tubes.map(() => -1);
  const leads: number[] = [];
  for (let b = 0; b < tubes.length; b++) {
    if (!mergeable(d, tubes, b)) continue;
    const lead = leads.find((a) => sameSeries(d, tubes, tubeLoops, a, b));
    if (lead === undefined) leads.push(b);
    seriesOf[b] = lead ?? b;
  }
  // Only series of two or more tubes share; each series gets an index.
  const groupOf = new Map<number, number>();
  for (const a of leads) if (seriesOf.filter((x) => x === a).length > 1) groupOf.set(a, groupOf.size);
  return tubes.map((tube, b) => {
    const group = groupOf.get(seriesOf[b]!) ?? -1;
    return { group, first: group >= 0 && seriesOf[b] === b, law: tube.law, length: tube.length, area: tube.area };
  });
}

/** Whether tube b is a material tube without internal states (its MMF is l H(phi / A)). */
function mergeable(d: NetworkDescription, tubes: readonly CompiledTube[], b: number): boolean {
  const tube = tubes[b]!;
  return d.tubes[b]!.law.kind === 'material' && tube.law !== undefined && !tube.states && !tube.material;
}

/** Whether mergeable tubes a and b are in series (same incidence) with the same area and the same law. */
function sameSeries(
  d: NetworkDescription,
  tubes: readonly CompiledTube[],
  tubeLoops: readonly TubeLoops[],
  a: number,
  b: number,
): boolean {
  const ta = tubes[a]!;
  const tb = tubes[b]!;
  if (ta.area !== tb.area) return false;
  const la = tubeLoops[a]!;
  const lb = tubeLoops[b]!;
  if (la.index.length !== lb.index.length) return false;
  for (let k = 0; k < la.index.length; k++) if (la.index[k] !== lb.index[k] || la.sign[k] !== lb.sign[k]) return false;
  if (ta.law === tb.law || (ta.law!.fieldStrength === tb.law!.fieldStrength && ta.law!.fieldSlope === tb.law!.fieldSlope)) return true;
  const sa = (d.tubes[a]!.law as { material: unknown }).material;
  const sb = (d.tubes[b]!.law as { material: unknown }).material;
  return isSpec(sa) && isSpec(sb) && JSON.stringify(sa) === JSON.stringify(sb);
}

/** A material given as a spec (plain data with a kind), not as a law object of functions. */
function isSpec(m: unknown): boolean {
  return typeof m === 'object' && m !== null && !('fieldStrength' in m) && typeof (m as { kind?: unknown }).kind === 'string';
}

/** The positions the stamps touch, recorded in one pass at the initial state (values ignored). */
function recordJacobianPattern(
  stampJacobian: (t: number, y: Float64Array, inputs: InputView, J: StampTarget) => void,
  y0: Float64Array,
  inputs: InputView,
): { rows: Int32Array; cols: Int32Array } | undefined {
  const recorder = new PatternRecordingStampTarget();
  try {
    stampJacobian(0, y0, inputs, recorder);
  } catch {
    return undefined;
  }
  return { rows: Int32Array.from(recorder.rows), cols: Int32Array.from(recorder.cols) };
}

/** Compile the elements kind by kind: one group per kind present, in order of first appearance. */
function compileGroups(d: NetworkDescription, ctx: StampContext, size: number): ElementGroup[] {
  const byKind = new Map<ElementDescription['kind'], { d: ElementDescription; index: number }[]>();
  d.elements.forEach((e, index) => {
    const list = byKind.get(e.kind) ?? [];
    list.push({ d: e, index });
    byKind.set(e.kind, list);
  });
  return [...byKind.values()].map((list) => elementKind(list[0]!.d).compile(list, ctx, { description: d, size }));
}
