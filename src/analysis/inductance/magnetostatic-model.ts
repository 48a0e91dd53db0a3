import { tubeKind } from '../../elements/registry.js';
import { FluxstateError, InputError } from '../../errors.js';
import { fundamentalLoops, type MagneticLoops } from '../../formulation/magnetic-graph.js';
import type { NetworkDescription, TubeDescription, WindingDescription } from '../../network/description.js';
import { packedDoubles } from '../../solver/packed-doubles.js';
import { createDenseLu } from '../../solver/dense-lu.js';

/**
 * The magnetic half of a network at rest (no eddy currents, no time): per
 * tube its MMF drop F(phi), slope dF/dphi and co-energy-free stored energy
 * W(phi) = integral of F dphi, the fundamental loops, and the windings'
 * coupling to the loops. Built from the plain description only, so that it
 * follows the description's meaning and nothing else (the time-domain
 * formulation has its own compiled form).
 *
 * @internal
 */
export interface MagnetostaticModel {
  readonly loops: MagneticLoops;
  readonly tubes: readonly TubeDescription[];
  /** MMF drop of tube k at flux phi, A. */
  mmf(k: number, phi: number): number;
  /** dF/dphi of tube k at flux phi, A/Wb (> 0). */
  slope(k: number, phi: number): number;
  /** Stored energy of tube k at flux phi, J. */
  energy(k: number, phi: number): number;
}

/** @internal */
export function magnetostaticModel(description: NetworkDescription): MagnetostaticModel {
  const tubes = description.tubes;
  const loops = fundamentalLoops(description.magneticNodes.length, tubes);
  const noState = new Float64Array(0);
  const laws = tubes.map((t) => {
    const kind = tubeKind(t.law);
    if ((kind.internalStates?.(t.law, t) ?? []).length > 0) {
      // A material with memory has no single flux-MMF curve: its inductance depends on the path taken.
      throw new InputError(
        'tube-with-memory',
        `tube "${t.name}" is of a material with memory (${t.law.kind}), which has no single B-H curve to linearise; ` +
          `give the tube a single-valued law (for example the material's anhysteretic or initial curve) for this study`,
        [t.name],
      );
    }
    const c = kind.compile(t.law, t, { stateOffset: -1, loops: { index: [], sign: packedDoubles(0) } });
    return {
      mmf: (phi: number) => c.mmf(phi, noState),
      slope: (phi: number) => c.mmfSlope(phi, noState),
      energy: (phi: number) => c.energy(phi, noState),
    };
  });
  return {
    loops,
    tubes,
    mmf: (k, phi) => laws[k]!.mmf(phi),
    slope: (k, phi) => laws[k]!.slope(phi),
    energy: (k, phi) => laws[k]!.energy(phi),
  };
}

/** Tube fluxes phi = B^T psi from loop fluxes. @internal */
export function tubeFluxes(model: MagnetostaticModel, psi: Float64Array): Float64Array {
  const phi = new Float64Array(model.tubes.length);
  model.tubes.forEach((_, k) => {
    let s = 0;
    for (const e of model.loops.tubeLoops[k]!) s += e.sign * psi[e.loop]!;
    phi[k] = s;
  });
  return phi;
}

/**
 * Loop reluctance matrix K = B diag(dF/dphi) B^T at tube fluxes phi
 * (row-major, loops x loops): the Jacobian of the loop MMF balance.
 *
 * @internal
 */
export function loopReluctance(model: MagnetostaticModel, phi: Float64Array): Float64Array {
  const n = model.loops.loopCount;
  const k = new Float64Array(n * n);
  model.tubes.forEach((_, t) => {
    const r = model.slope(t, phi[t]!);
    const entries = model.loops.tubeLoops[t]!;
    for (const a of entries) for (const b of entries) k[a.loop * n + b.loop]! += a.sign * b.sign * r;
  });
  return k;
}

/**
 * Loop MMF of each winding per ampere: column w of C^T, where winding w on
 * tube t with orientation o and N turns drives N o sign(l, t) in loop l.
 *
 * @internal
 */
export function windingLoopCoupling(model: MagnetostaticModel, winding: WindingDescription): Float64Array {
  const c = new Float64Array(model.loops.loopCount);
  for (const e of model.loops.tubeLoops[winding.tube]!) c[e.loop]! += e.sign * winding.orientation * winding.turns;
  return c;
}

/**
 * Loop fluxes at rest under the loop MMFs `drive` (A): the minimum of the
 * stored energy minus drive . psi, which is strictly convex for increasing
 * H(B) laws, by Newton's method with backtracking on that energy (so it
 * converges from psi = 0 whatever the saturation). Its gradient is the loop
 * MMF balance B F(B^T psi) - drive.
 *
 * @internal
 */
export function operatingPoint(model: MagnetostaticModel, drive: Float64Array): Float64Array {
  const n = model.loops.loopCount;
  const psi = new Float64Array(n);
  if (n === 0) return psi;
  const lu = createDenseLu(n);
  // The energy and the size of its terms (the rounding of a comparison of two energies).
  let magnitude = 0;
  const objective = (p: Float64Array): number => {
    const phi = tubeFluxes(model, p);
    let e = 0;
    let size = 0;
    phi.forEach((f, k) => {
      const w = model.energy(k, f);
      e += w;
      size += Math.abs(w);
    });
    for (let l = 0; l < n; l++) {
      e -= drive[l]! * p[l]!;
      size += Math.abs(drive[l]! * p[l]!);
    }
    magnitude = size;
    return e;
  };
  const gradient = (phi: Float64Array): Float64Array => {
    const g = new Float64Array(n);
    model.tubes.forEach((_, t) => {
      const f = model.mmf(t, phi[t]!);
      for (const e of model.loops.tubeLoops[t]!) g[e.loop]! += e.sign * f;
    });
    for (let l = 0; l < n; l++) g[l]! -= drive[l]!;
    return g;
  };
  let value = objective(psi);
  for (let iteration = 0; iteration < 200; iteration++) {
    const phi = tubeFluxes(model, psi);
    const g = gradient(phi);
    // Converged when the MMF imbalance is a few rounding units of the MMFs involved.
    let scale = 0;
    for (let l = 0; l < n; l++) scale = Math.max(scale, Math.abs(drive[l]!));
    phi.forEach((f, t) => (scale = Math.max(scale, Math.abs(model.mmf(t, f)))));
    let gMax = 0;
    for (let l = 0; l < n; l++) gMax = Math.max(gMax, Math.abs(g[l]!));
    if (gMax <= 64 * Number.EPSILON * Math.max(scale, 1e-300)) return psi;
    const k = loopReluctance(model, phi);
    if (lu.factor(k) !== -1) break;
    const step = Float64Array.from(g, (v) => -v);
    lu.solve(step);
    // Converged when the Newton correction is below the rounding of psi (the MMF evaluation's own
    // rounding can keep the imbalance above the test above).
    let stepMax = 0;
    let psiMax = 0;
    for (let l = 0; l < n; l++) {
      stepMax = Math.max(stepMax, Math.abs(step[l]!));
      psiMax = Math.max(psiMax, Math.abs(psi[l]!));
    }
    if (stepMax <= 1e-13 * psiMax) {
      for (let l = 0; l < n; l++) psi[l]! += step[l]!;
      return psi;
    }
    let alpha = 1;
    let improved = false;
    for (let halving = 0; halving < 60; halving++) {
      const trial = Float64Array.from(psi, (p, l) => p + alpha * step[l]!);
      const v = objective(trial);
      // Near the minimum the decrease is below the rounding of the energy: accept within that rounding.
      if (v <= value + 1e3 * Number.EPSILON * magnitude) {
        psi.set(trial);
        value = v;
        improved = true;
        break;
      }
      alpha /= 2;
    }
    if (!improved) {
      // No decrease at all: the energy is flat to rounding here; accept if the Newton step is small.
      if (stepMax <= 1e-10 * psiMax) return psi;
      break;
    }
  }
  throw new FluxstateError(
    'no-operating-point',
    `the magnetic operating point did not converge (Newton on the loop MMF balance, largest loop MMF ${Math.max(...Array.from(drive, Math.abs))} A); check the material laws and the bias currents`,
    model.tubes.map((t) => t.name),
  );
}
