import type { HystereticMaterial } from '../materials/hysteresis/inverse-jiles-atherton.js';
import type { MaterialLaw } from '../materials/material-law.js';
import type { TubeDescription, TubeLaw } from '../network/description.js';
import type { InputView, ListingParameter } from './element-kind.js';
import type { StampTarget } from './stamp-target.js';

/**
 * A flux tube's law compiled for evaluation: the MMF drop F(phi) (eddy term
 * excluded), its slope, its stored energy and its geometry.
 *
 * @example
 * ```ts
 * const F = tube.mmf(phi, y); // A
 * ```
 */
export interface CompiledTube {
  readonly name: string;
  /** Material law, or undefined for a linear reluctance. */
  readonly law: MaterialLaw | undefined;
  /** Length l, m (NaN when the kind has none: a bare reluctance). */
  readonly length: number;
  /** Area A, m^2 (NaN when unknown: a reluctance without area). */
  readonly area: number;
  /** Linear reluctance, A/Wb (NaN for material tubes). */
  readonly reluctance: number;
  /** Eddy resistance R_e, ohm; 0 for none. */
  readonly eddyResistance: number;
  /** Magnetic volume l A, m^3 (NaN if unknown). */
  readonly volume: number;
  /** Reluctance at zero flux, A/Wb: weights the least-energy initial flux division. */
  readonly zeroFluxReluctance: number;
  /** MMF drop F(phi), A (y: the state, for tubes with internal states). */
  mmf(flux: number, y: Float64Array): number;
  /** dF/dphi, A/Wb. */
  mmfSlope(flux: number, y: Float64Array): number;
  /** Stored magnetic energy at flux phi, J. */
  energy(flux: number, y: Float64Array): number;
  /** Power dissipated inside the material (hysteresis), W; absent for lossless laws. */
  lossPower?(flux: number, y: Float64Array): number;
  /** The hysteretic material of a tube with memory (results read its state through it). */
  readonly material?: HystereticMaterial;
  /**
   * Present on a tube whose internal states follow dphi/dt but which has no
   * eddy resistance of its own: the network must fix its flux derivative
   * (index 1). The compiler checks that and throws the error this returns,
   * with the reason and every tube concerned, when it does not.
   */
  missingFluxRateError?(reason: string, names: readonly string[]): Error;
  /** Magnetisation m (A/m) of a tube with memory at flux phi and state y (hysteretic tubes: b/mu0 - H). */
  magnetisation?(flux: number, y: Float64Array): number;
  /** Index in y of the tube's first internal state (hysteretic tubes: H, then u = db/dt). */
  readonly stateOffset?: number;
  /** Absolute tolerance of each internal state per tesla of flux-density tolerance. */
  readonly stateScales?: readonly number[];
  /**
   * Stamps of the tube's internal states (a material with memory), and
   * their coupling into the loop rows; absent for single-valued laws.
   */
  readonly states?: TubeStateStamps;
}

/**
 * Rows of a tube's internal states. A tube kind that declares internal
 * states gets their positions in y at compile time and stamps here.
 *
 * @example
 * ```ts
 * const states: TubeStateStamps = { residual() {}, jacobian() {}, mass() {}, initial() {} };
 * ```
 */
export interface TubeStateStamps {
  residual(t: number, y: Float64Array, inputs: InputView, f: Float64Array): void;
  jacobian(t: number, y: Float64Array, inputs: InputView, J: StampTarget): void;
  mass(M: StampTarget): void;
  initial(y0: Float64Array): void;
}

/**
 * Loop fluxes through one tube: positions in y and signs (flux of the tube
 * = sum sign[k] y[index[k]]). Plain arrays, not typed ones: they are read in
 * every f and Jacobian call, and a typed array's element access carries a
 * detach check in a process where any buffer was ever detached (see
 * packedDoubles); `index` holds small integers, `sign` packed doubles.
 *
 * @example
 * ```ts
 * const loops: TubeLoops = { index: [4], sign: packedDoublesFrom([1]) };
 * ```
 */
export interface TubeLoops {
  readonly index: readonly number[];
  readonly sign: readonly number[];
}

/**
 * What a tube kind gets when it compiles one tube.
 *
 * @example
 * ```ts
 * const ctx: TubeCompileContext = { stateOffset: -1, loops: { index: [4], sign: packedDoublesFrom([1]) } };
 * ```
 */
export interface TubeCompileContext {
  /** Index in y of the tube's first internal state; -1 when it has none. */
  readonly stateOffset: number;
  /** Loop fluxes through the tube: positions in y and signs. */
  readonly loops: TubeLoops;
}

/**
 * Everything about one kind of flux tube (a body of material, an air gap, a
 * constant reluctance) behind one interface. Held by {@link TUBE_KINDS}.
 *
 * @example
 * ```ts
 * const kind = TUBE_KINDS[tube.law.kind] as TubeKind<typeof tube.law>;
 * kind.noun; // 'air gap'
 * ```
 */
export interface TubeKind<L extends TubeLaw = TubeLaw> {
  readonly kind: L['kind'];
  /** The kind in messages and listings: 'flux tube', 'air gap', 'reluctance'. */
  readonly noun: string;
  /** Whether the tube may carry an eddy resistance. */
  readonly allowsEddy: boolean;
  /** Check the law's data and return the clean law; throws `InputError` naming the tube. */
  check(law: L, owner: string, name: string): L;
  /** Whether the tube has an area (so an initial flux density can be given). */
  hasArea(law: L): boolean;
  /** Labels of internal state unknowns (a material with memory); absent: none. */
  internalStates?(law: L, tube: TubeDescription): readonly string[];
  compile(law: L, tube: TubeDescription, ctx: TubeCompileContext): CompiledTube;
  listing(law: L): ListingParameter[];
  /**
   * The unknowns the tube's MMF drop (and its own states' equations) enter
   * other than affinely, as `ElementKind.nonAffineUnknowns` says for
   * elements: a saturating law, the loop fluxes through the tube. An empty
   * list declares the tube linear; a kind without this method makes the
   * reduced formulation refuse the network.
   */
  nonAffineUnknowns?(law: L, tube: TubeDescription, ctx: TubeCompileContext): readonly number[];
}
