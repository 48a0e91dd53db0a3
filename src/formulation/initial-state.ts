import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { TopologyError } from '../errors.js';
import { elementKind } from '../elements/registry.js';
import type { NetworkDescription } from '../network/description.js';
import type { CompiledTube } from './compile-network.js';
import type { MagneticLoops } from './magnetic-graph.js';
import type { UnknownLayout } from './unknown-layout.js';

/**
 * Initial state from the user's initial conditions, before the solver makes
 * the algebraic unknowns consistent:
 * - node potentials: the smallest vector meeting every capacitor's initial
 *   voltage (min-norm least squares; capacitor voltages that do not add up
 *   around a loop are an error);
 * - the states of elements (an inductor's current) are set by their kind
 *   after this (`ElementGroup.initial`);
 * - loop fluxes: tubes with an initial flux (or flux density) get it exactly
 *   and the other tubes carry the flux that conserves flux at every node with
 *   the least magnetic energy, sum of R_b phi_b^2 with R_b the tube's
 *   reluctance at zero flux (so remanent flux stays in the iron rather than
 *   in air gaps or leakage paths); values that break conservation are an
 *   error.
 * The solver then keeps the differential part of this state and solves the
 * algebraic part (winding and source currents, node potentials without
 * capacitors, fluxes of loops without windings).
 *
 * @example
 * ```ts
 * const y0 = initialState(desc, layout, loops, tubes);
 * ```
 */
export function initialState(d: NetworkDescription, layout: UnknownLayout, loops: MagneticLoops, tubes: readonly CompiledTube[]): Float64Array {
  const y0 = new Float64Array(layout.size);
  setCapacitorVoltages(d, layout, y0);
  setLoopFluxes(d, layout, loops, tubes, y0);
  return y0;
}

const TOL = 1e-9;

function setCapacitorVoltages(d: NetworkDescription, layout: UnknownLayout, y0: Float64Array): void {
  const allCaps = d.elements.flatMap((e) => {
    const voltage = elementKind(e).initialVoltage?.(e);
    return voltage === undefined ? [] : [{ name: e.name, plus: e.plus, minus: e.minus, initialVoltage: voltage }];
  });
  if (!allCaps.some((c) => c.initialVoltage !== 0)) return;
  const ne = d.electricNodes.length - 1;
  const D = Matrix.zeros(allCaps.length, ne);
  allCaps.forEach((c, r) => {
    if (c.plus > 0) D.set(r, c.plus - 1, 1);
    if (c.minus > 0) D.set(r, c.minus - 1, -1);
  });
  const target = Matrix.columnVector(allCaps.map((c) => c.initialVoltage));
  const v = minNormSolve(D, target);
  const residual = D.mmul(v).sub(target);
  const scale = Math.max(...allCaps.map((c) => Math.abs(c.initialVoltage)));
  if (residual.max() > TOL * scale || -residual.min() > TOL * scale) {
    const names = allCaps.filter((_, r) => Math.abs(residual.get(r, 0)) > TOL * scale).map((c) => c.name);
    throw new TopologyError(
      'inconsistent-capacitor-voltages',
      `initial voltages of capacitors ${names.map((n) => `"${n}"`).join(', ')} do not add up around the loop they form; ` +
        `make the initial voltages around every capacitor loop sum to zero`,
      names,
    );
  }
  for (let k = 1; k <= ne; k++) y0[layout.potential[k]!] = v.get(k - 1, 0);
}

function setLoopFluxes(d: NetworkDescription, layout: UnknownLayout, loops: MagneticLoops, tubes: readonly CompiledTube[], y0: Float64Array): void {
  const specified: { tube: number; flux: number }[] = [];
  d.tubes.forEach((t, b) => {
    if (t.initialFlux !== undefined && t.initialFlux !== 0) specified.push({ tube: b, flux: t.initialFlux });
    else if (t.initialFluxDensity !== undefined && t.initialFluxDensity !== 0) specified.push({ tube: b, flux: t.initialFluxDensity * tubes[b]!.area });
    else if (t.initialFlux !== undefined || t.initialFluxDensity !== undefined) specified.push({ tube: b, flux: 0 });
  });
  if (!specified.some((s) => s.flux !== 0) || loops.loopCount === 0) return;
  const nl = loops.loopCount;
  const incidence = (b: number): number[] => {
    const row = new Array<number>(nl).fill(0);
    for (const en of loops.tubeLoops[b]!) row[en.loop] = en.sign;
    return row;
  };
  const Bs = new Matrix(specified.map((s) => incidence(s.tube)));
  const target = Matrix.columnVector(specified.map((s) => s.flux));
  const particular = minNormSolve(Bs, target);
  const residual = Bs.mmul(particular).sub(target);
  const scale = Math.max(...specified.map((s) => Math.abs(s.flux)));
  const bad = specified.filter((_, r) => Math.abs(residual.get(r, 0)) > TOL * scale);
  if (bad.length > 0) {
    const names = bad.map((s) => d.tubes[s.tube]!.name);
    throw new TopologyError(
      'inconsistent-initial-flux',
      `initial fluxes of tubes ${names.map((n) => `"${n}"`).join(', ')} break flux conservation (flux into a magnetic node must equal flux out), ` +
        `or give a flux to a tube that lies on no closed path; change them so that they balance at every node`,
      names,
    );
  }
  // Remaining freedom: z in the null space of Bs; minimise sum R_b phi_b^2 over the unspecified tubes.
  const isSpecified = new Set(specified.map((s) => s.tube));
  const unspecified = d.tubes.map((_, b) => b).filter((b) => !isSpecified.has(b) && loops.tubeLoops[b]!.length > 0);
  let psi = particular;
  if (unspecified.length > 0) {
    const Z = nullSpace(Bs, nl);
    if (Z.columns > 0) {
      const Bu = new Matrix(unspecified.map((b) => incidence(b).map((x) => x * Math.sqrt(tubes[b]!.zeroFluxReluctance))));
      const z = minNormSolve(Bu.mmul(Z), Bu.mmul(particular).neg());
      psi = particular.add(Z.mmul(z));
    }
  }
  for (let l = 0; l < nl; l++) y0[layout.loopOffset + l] = psi.get(l, 0);
}


/** Minimum-norm least-squares solution of A x = b by the SVD. */
function minNormSolve(A: Matrix, b: Matrix): Matrix {
  if (A.rows === 0 || A.columns === 0) return Matrix.zeros(A.columns, 1);
  const svd = new SingularValueDecomposition(A, { autoTranspose: true });
  return svd.solve(b);
}

/** Orthonormal basis (columns) of the null space of A (cols = n). */
function nullSpace(A: Matrix, n: number): Matrix {
  const padded = A.rows >= n ? A : Matrix.zeros(n, n).setSubMatrix(A, 0, 0);
  const svd = new SingularValueDecomposition(padded, { computeLeftSingularVectors: false });
  const s = svd.diagonal;
  const tol = 1e-10 * Math.max(1, s[0] ?? 0);
  const V = svd.rightSingularVectors;
  const cols: number[] = [];
  for (let k = 0; k < n; k++) if ((s[k] ?? 0) <= tol) cols.push(k);
  return cols.length === 0 ? Matrix.zeros(n, 0) : V.subMatrixColumn(cols);
}
