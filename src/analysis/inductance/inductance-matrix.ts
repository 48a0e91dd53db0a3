import { FluxstateError, InputError, TopologyError } from '../../errors.js';
import type { NetworkDescription, WindingDescription } from '../../network/description.js';
import type { Winding } from '../../network/handles.js';
import type { NetworkBuilder } from '../../network/network-builder.js';
import { validateDescription } from '../../network/validate-description.js';
import { createDenseLu } from '../../solver/dense-lu.js';
import {
  loopReluctance,
  magnetostaticModel,
  operatingPoint,
  tubeFluxes,
  windingLoopCoupling,
  type MagnetostaticModel,
} from './magnetostatic-model.js';

/**
 * Options of {@link inductanceMatrix}.
 *
 * @example
 * ```ts
 * inductanceMatrix(net, [primary, secondary], { bias: [1.5, 0] }); // 1.5 A DC in the primary
 * ```
 */
export interface InductanceMatrixOptions {
  /**
   * DC current of each winding listed, A, in the order of `windings`
   * (windings of the network not listed carry no current). Default: all 0,
   * the unbiased (initial) inductances.
   */
  readonly bias?: readonly number[];
}

/**
 * Flux of one tube at the operating point.
 *
 * @example
 * ```ts
 * const m = inductanceMatrix(net, [primary], { bias: [2] });
 * const leg = m.tubes.find((t) => t.name === 'wound leg')!; // leg.fluxDensity, T
 * ```
 */
export interface OperatingPointTube {
  readonly name: string;
  /** Flux, Wb. */
  readonly flux: number;
  /** Flux density, T (NaN for a reluctance given without an area). */
  readonly fluxDensity: number;
}

/**
 * Winding inductances at an operating point.
 *
 * @example
 * ```ts
 * const m = inductanceMatrix(net, [primary, secondary]);
 * const [l11, l12] = m.inductance[0]!; // H
 * const k = m.coupling[0]![1]!; // coupling factor
 * const leakage = m.shortCircuit[0]![1]!; // primary inductance with the secondary shorted, H
 * ```
 */
export interface InductanceMatrix {
  /** Names of the windings, in the order of the rows and columns. */
  readonly windings: readonly string[];
  /** Incremental inductance matrix L_ij = d lambda_i / d i_j at the bias, H (symmetric). */
  readonly inductance: readonly (readonly number[])[];
  /** Coupling factors k_ij = L_ij / sqrt(L_ii L_jj) (1 on the diagonal; signed, by the windings' orientations). */
  readonly coupling: readonly (readonly number[])[];
  /**
   * Short-circuit inductance seen at winding i with winding j shorted (the
   * others open): L_ii - L_ij^2 / L_jj, H; the leakage inductance of a
   * transformer referred to winding i. NaN on the diagonal.
   */
  readonly shortCircuit: readonly (readonly number[])[];
  /** The DC currents of the operating point, A. */
  readonly bias: readonly number[];
  /** Flux linkage of each winding at the bias, Wb-turns (N times its tube's flux, with its orientation). */
  readonly fluxLinkage: readonly number[];
  /** Every tube's flux at the bias. */
  readonly tubes: readonly OperatingPointTube[];
}

/** The description and the windings' descriptions, from handles or names. @internal */
export function resolveWindings(
  network: NetworkBuilder | NetworkDescription,
  windings: readonly (Winding | string)[],
  caller: string,
): { description: NetworkDescription; selected: WindingDescription[] } {
  if (network === null || typeof network !== 'object') {
    throw new InputError('bad-option', `${caller}: the first argument must be a network (builder or description), got ${String(network)}`, ['network']);
  }
  const description = 'describe' in network ? network.describe() : validateDescription(network);
  const networkId = 'describe' in network ? network.id : undefined;
  if (!Array.isArray(windings) || windings.length === 0) {
    throw new InputError('bad-option', `${caller}: give a non-empty list of windings (handles or names)`, ['windings']);
  }
  const all = description.elements.flatMap((e) => (e.kind === 'winding' ? [e] : []));
  const selected = windings.map((w): WindingDescription => {
    if (typeof w === 'string') {
      const found = all.find((e) => e.name === w);
      if (found === undefined) {
        throw new InputError(
          'unknown-winding',
          `${caller}: network "${description.name}" has no winding "${w}"; its windings are ${all.map((e) => `"${e.name}"`).join(', ') || '(none)'}`,
          [w],
        );
      }
      return found;
    }
    if (w === null || typeof w !== 'object' || w.kind !== 'winding') {
      const got = w === null || typeof w !== 'object' ? String(w) : `a ${String((w as { kind?: unknown }).kind)}`;
      throw new InputError('wrong-handle-kind', `${caller}: windings must be winding handles or winding names, got ${got}`, [String((w as { name?: unknown })?.name ?? w)]);
    }
    if (networkId !== undefined && w.network !== networkId) {
      throw new InputError('foreign-handle', `${caller}: winding "${w.name}" belongs to another network; use handles created by network "${description.name}"`, [w.name]);
    }
    const e = description.elements[w.index];
    if (e === undefined || e.kind !== 'winding' || e.name !== w.name) {
      throw new InputError('unknown-winding', `${caller}: network "${description.name}" has no winding "${w.name}"`, [w.name]);
    }
    return e;
  });
  const names = new Set<string>();
  for (const w of selected) {
    if (names.has(w.name)) throw new InputError('bad-option', `${caller}: winding "${w.name}" is listed twice; list each winding once`, [w.name]);
    names.add(w.name);
  }
  return { description, selected };
}

/** L = C K^-1 C^T at loop fluxes psi, for the coupling columns c (one per winding). @internal */
export function inductanceAt(model: MagnetostaticModel, psi: Float64Array, c: readonly Float64Array[]): number[][] {
  const n = model.loops.loopCount;
  const lu = createDenseLu(n);
  const k = loopReluctance(model, tubeFluxes(model, psi));
  if (lu.factor(k) !== -1) {
    throw new FluxstateError('no-operating-point', 'the loop reluctance matrix is singular at the operating point; check the tubes for zero reluctance', model.tubes.map((t) => t.name));
  }
  const solved = c.map((col) => {
    const x = Float64Array.from(col);
    lu.solve(x);
    return x;
  });
  return c.map((ci, i) =>
    c.map((_, j) => {
      let s = 0;
      for (let l = 0; l < n; l++) s += ci[l]! * solved[j]![l]!;
      return s;
    }),
  );
}

/**
 * The inductance matrix of a set of windings at an operating point, from
 * the magnetic network alone: the tubes' laws are linearised at the fluxes
 * the DC `bias` currents set up (all zero by default), and
 * `L = C K^-1 C^T`, with K = B diag(dF/dphi) B^T the loop reluctance matrix
 * (the Jacobian of the loop MMF balance; B the loop-tube incidence) and C
 * the windings' turns on the loops. That is the Jacobian of the flux
 * linkages against the winding currents: the incremental inductances a
 * circuit model needs for small signals about the bias. Also the coupling
 * factors and the short-circuit (leakage) inductances between pairs.
 *
 * What it leaves out: eddy resistances (no currents at rest), the electric
 * elements (inductors, capacitors: add them in the circuit model), windings
 * not listed (taken as open, carrying the bias current 0).
 *
 * Caution: the figures are as good as the material curves and geometry
 * given; check them against measurements before relying on them.
 *
 * @example
 * ```ts
 * const m = inductanceMatrix(net, [primary, secondary]);
 * console.log(`L11 ${m.inductance[0]![0]} H, k ${m.coupling[0]![1]}, short-circuit ${m.shortCircuit[0]![1]} H`);
 * const biased = inductanceMatrix(net, ['primary'], { bias: [2] }); // incremental L at 2 A DC
 * ```
 */
export function inductanceMatrix(
  network: NetworkBuilder | NetworkDescription,
  windings: readonly (Winding | string)[],
  options: InductanceMatrixOptions = {},
): InductanceMatrix {
  const { description, selected } = resolveWindings(network, windings, 'inductanceMatrix');
  const bias = options.bias ?? selected.map(() => 0);
  if (!Array.isArray(bias) || bias.length !== selected.length || bias.some((b) => typeof b !== 'number' || !Number.isFinite(b))) {
    throw new InputError(
      'bad-option',
      `inductanceMatrix: bias must list one finite current (A) per winding (${selected.length}), got ${JSON.stringify(bias)}`,
      ['bias'],
    );
  }
  const model = magnetostaticModel(description);
  const c = selected.map((w) => {
    const col = windingLoopCoupling(model, w);
    if (col.every((v) => v === 0)) {
      const tube = description.tubes[w.tube]?.name ?? String(w.tube);
      throw new TopologyError(
        'winding-on-open-path',
        `inductanceMatrix: winding "${w.name}" sits on tube "${tube}", which is not part of any closed magnetic path, so its inductance is zero; close the magnetic circuit through tube "${tube}"`,
        [w.name, tube],
      );
    }
    return col;
  });
  const drive = new Float64Array(model.loops.loopCount);
  c.forEach((col, w) => col.forEach((v, l) => (drive[l]! += v * bias[w]!)));
  const psi = operatingPoint(model, drive);
  const phi = tubeFluxes(model, psi);
  const inductance = inductanceAt(model, psi, c);
  // Symmetrise: K is symmetric, so L is; remove the rounding of the two triangular solves.
  for (let i = 0; i < inductance.length; i++) {
    for (let j = 0; j < i; j++) {
      const m = 0.5 * (inductance[i]![j]! + inductance[j]![i]!);
      inductance[i]![j] = m;
      inductance[j]![i] = m;
    }
  }
  const coupling = inductance.map((row, i) => row.map((lij, j) => (i === j ? 1 : lij / Math.sqrt(inductance[i]![i]! * inductance[j]![j]!))));
  const shortCircuit = inductance.map((row, i) => row.map((lij, j) => (i === j ? Number.NaN : inductance[i]![i]! - (lij * lij) / inductance[j]![j]!)));
  const fluxLinkage = selected.map((w) => w.turns * w.orientation * phi[w.tube]!);
  const tubes = description.tubes.map((t, k) => {
    const area = t.law.area;
    return { name: t.name, flux: phi[k]!, fluxDensity: area !== undefined && area > 0 ? phi[k]! / area : Number.NaN };
  });
  return { windings: selected.map((w) => w.name), inductance, coupling, shortCircuit, bias: [...bias], fluxLinkage, tubes };
}
