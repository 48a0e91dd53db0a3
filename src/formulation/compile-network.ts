import { MU0 } from '../constants.js';
import { compileMaterial } from '../materials/material-spec.js';
import type { MaterialLaw } from '../materials/material-law.js';
import type { NetworkDescription, TubeDescription } from '../network/description.js';
import { fundamentalLoops, type MagneticLoops } from './magnetic-graph.js';
import { NetworkInputs } from './network-inputs.js';
import { layoutUnknowns, type UnknownLayout } from './unknown-layout.js';
import { checkTopology } from './topology-checks.js';
import { findIndexTwoUnknowns } from './index-analysis.js';
import { initialState } from './initial-state.js';
import { algebraicJacobian, massSpaces } from '../solver/consistent-initialization.js';
import { createDenseLu } from '../solver/dense-lu.js';

/** A flux tube ready for evaluation. */
export interface CompiledTube {
  readonly name: string;
  /** Material law, or undefined for a linear reluctance. */
  readonly law: MaterialLaw | undefined;
  /** Length l (material tubes) for F = l H(phi/A). */
  readonly length: number;
  /** Area A, m^2; NaN when unknown (a reluctance without area). */
  readonly area: number;
  /** Linear reluctance for gaps and reluctances, A/Wb; NaN for material tubes. */
  readonly reluctance: number;
  /** Eddy resistance R_e, ohm; 0 for none. */
  readonly eddyResistance: number;
  /** Magnetic volume l*A, m^3 (NaN if unknown). */
  readonly volume: number;
}

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
  /** Row-major n*n constant mass matrix. */
  readonly mass: Float64Array;
  /** f(t, y) into out. */
  rhs(t: number, y: Float64Array, out: Float64Array): void;
  /** df/dy into out (zero-filled by the caller). */
  jacobian(t: number, y: Float64Array, out: Float64Array): void;
  /** Initial state before consistent initialisation of the algebraic unknowns. */
  readonly y0: Float64Array;
  /** Unknowns of index 2 (error scaled by h in the solver). */
  readonly index2: readonly number[];
  /** Source values and switch states, with embedding overrides. */
  readonly inputs: NetworkInputs;
  /** Flux of tube b in the state y, Wb. */
  tubeFlux(y: Float64Array, b: number): number;
  /** MMF drop F_b(phi) of tube b from its law (eddy term excluded), A. */
  tubeMmf(b: number, flux: number): number;
  /** Stored magnetic energy of tube b at flux phi, J. */
  tubeEnergy(b: number, flux: number): number;
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
  const tubes = d.tubes.map(compileTube);
  const inputs = new NetworkInputs(d);

  // Tube -> loop incidence in CSR form, with loop indices already offset into y.
  const tlStart = new Int32Array(d.tubes.length + 1);
  const tlIndex: number[] = [];
  const tlSign: number[] = [];
  loops.tubeLoops.forEach((entries, b) => {
    for (const en of entries) {
      tlIndex.push(layout.loopOffset + en.loop);
      tlSign.push(en.sign);
    }
    tlStart[b + 1] = tlIndex.length;
  });
  const tlIdx = Int32Array.from(tlIndex);
  const tlSgn = Float64Array.from(tlSign);

  const pot = (node: number): number => layout.potential[node]!;
  const groups = groupElements(d, layout, pot);
  const tubeCount = tubes.length;
  const phi = new Float64Array(tubeCount);

  const fluxOf = (y: Float64Array, b: number): number => {
    let s = 0;
    for (let k = tlStart[b]!; k < tlStart[b + 1]!; k++) s += tlSgn[k]! * y[tlIdx[k]!]!;
    return s;
  };
  const mmfOf = (b: number, flux: number): number => {
    const tube = tubes[b]!;
    return tube.law ? tube.length * tube.law.fieldStrength(flux / tube.area) : tube.reluctance * flux;
  };
  const mmfSlope = (b: number, flux: number): number => {
    const tube = tubes[b]!;
    return tube.law ? (tube.length / tube.area) * tube.law.fieldSlope(flux / tube.area) : tube.reluctance;
  };
  const v = (y: Float64Array, i: number): number => (i < 0 ? 0 : y[i]!);

  function rhs(t: number, y: Float64Array, out: Float64Array): void {
    out.fill(0);
    // Magnetic loops: -sum_b B_lb F_b(phi_b) (+ winding MMFs below).
    for (let b = 0; b < tubeCount; b++) {
      const f = fluxOf(y, b);
      phi[b] = f;
      const F = mmfOf(b, f);
      for (let k = tlStart[b]!; k < tlStart[b + 1]!; k++) out[tlIdx[k]!]! -= tlSgn[k]! * F;
    }
    for (const w of groups.windings) {
      const i = y[w.branch]!;
      out[w.branch] = v(y, w.p) - v(y, w.n) - w.resistance * i;
      if (w.p >= 0) out[w.p]! -= i;
      if (w.n >= 0) out[w.n]! += i;
      const mmf = w.orientation * w.turns * i;
      for (let k = tlStart[w.tube]!; k < tlStart[w.tube + 1]!; k++) out[tlIdx[k]!]! += tlSgn[k]! * mmf;
    }
    for (const r of groups.resistors) {
      const cur = (v(y, r.p) - v(y, r.n)) * r.conductance;
      if (r.p >= 0) out[r.p]! -= cur;
      if (r.n >= 0) out[r.n]! += cur;
    }
    for (const s of groups.switches) {
      const g = inputs.switchClosed(s.element, t) ? s.onConductance : s.offConductance;
      const cur = (v(y, s.p) - v(y, s.n)) * g;
      if (s.p >= 0) out[s.p]! -= cur;
      if (s.n >= 0) out[s.n]! += cur;
    }
    for (const c of groups.currentSources) {
      const cur = inputs.sourceValue(c.element, t);
      if (c.p >= 0) out[c.p]! += cur;
      if (c.n >= 0) out[c.n]! -= cur;
    }
    for (const s of groups.voltageSources) {
      const i = y[s.branch]!;
      if (s.p >= 0) out[s.p]! += i;
      if (s.n >= 0) out[s.n]! -= i;
      out[s.branch] = v(y, s.p) - v(y, s.n) - inputs.sourceValue(s.element, t);
    }
    for (const l of groups.inductors) {
      const i = y[l.branch]!;
      if (l.p >= 0) out[l.p]! -= i;
      if (l.n >= 0) out[l.n]! += i;
      out[l.branch] = v(y, l.p) - v(y, l.n);
    }
  }

  function jacobian(t: number, y: Float64Array, J: Float64Array): void {
    const add = (r: number, c: number, x: number): void => {
      if (r >= 0 && c >= 0) J[r * n + c]! += x;
    };
    for (let b = 0; b < tubeCount; b++) {
      const dF = mmfSlope(b, fluxOf(y, b));
      for (let k1 = tlStart[b]!; k1 < tlStart[b + 1]!; k1++) {
        for (let k2 = tlStart[b]!; k2 < tlStart[b + 1]!; k2++) {
          J[tlIdx[k1]! * n + tlIdx[k2]!]! -= tlSgn[k1]! * tlSgn[k2]! * dF;
        }
      }
    }
    for (const w of groups.windings) {
      add(w.branch, w.branch, -w.resistance);
      add(w.branch, w.p, 1);
      add(w.branch, w.n, -1);
      add(w.p, w.branch, -1);
      add(w.n, w.branch, 1);
      const g = w.orientation * w.turns;
      for (let k = tlStart[w.tube]!; k < tlStart[w.tube + 1]!; k++) J[tlIdx[k]! * n + w.branch]! += tlSgn[k]! * g;
    }
    const conductance = (p: number, q: number, g: number): void => {
      add(p, p, -g);
      add(p, q, g);
      add(q, p, g);
      add(q, q, -g);
    };
    for (const r of groups.resistors) conductance(r.p, r.n, r.conductance);
    for (const s of groups.switches) {
      conductance(s.p, s.n, inputs.switchClosed(s.element, t) ? s.onConductance : s.offConductance);
    }
    for (const s of groups.voltageSources) {
      add(s.p, s.branch, 1);
      add(s.n, s.branch, -1);
      add(s.branch, s.p, 1);
      add(s.branch, s.n, -1);
    }
    for (const l of groups.inductors) {
      add(l.p, l.branch, -1);
      add(l.n, l.branch, 1);
      add(l.branch, l.p, 1);
      add(l.branch, l.n, -1);
    }
  }

  const mass = new Float64Array(n * n);
  const addM = (r: number, c: number, x: number): void => {
    if (r >= 0 && c >= 0) mass[r * n + c]! += x;
  };
  for (const c of groups.capacitors) {
    addM(c.p, c.p, c.capacitance);
    addM(c.p, c.n, -c.capacitance);
    addM(c.n, c.p, -c.capacitance);
    addM(c.n, c.n, c.capacitance);
  }
  for (const l of groups.inductors) addM(l.branch, l.branch, l.inductance);
  for (const w of groups.windings) {
    const g = w.orientation * w.turns;
    for (let k = tlStart[w.tube]!; k < tlStart[w.tube + 1]!; k++) addM(w.branch, tlIdx[k]!, tlSgn[k]! * g);
  }
  tubes.forEach((tube, b) => {
    if (tube.eddyResistance === 0) return;
    for (let k1 = tlStart[b]!; k1 < tlStart[b + 1]!; k1++) {
      for (let k2 = tlStart[b]!; k2 < tlStart[b + 1]!; k2++) {
        addM(tlIdx[k1]!, tlIdx[k2]!, tlSgn[k1]! * tlSgn[k2]! * tube.eddyResistance);
      }
    }
  });

  const y0 = initialState(d, layout, loops, tubes);
  const index2 = confirmIndexTwo(findIndexTwoUnknowns(d, layout), mass, n, (y, J) => jacobian(0, y, J), y0);

  return {
    description: d,
    layout,
    loops,
    tubes,
    mass,
    rhs,
    jacobian,
    y0,
    index2,
    inputs,
    tubeFlux: fluxOf,
    tubeMmf: mmfOf,
    tubeEnergy: (b, flux) => {
      const tube = tubes[b]!;
      return tube.law ? tube.volume * tube.law.energyDensity(flux / tube.area) : 0.5 * tube.reluctance * flux * flux;
    },
  };
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
  mass: Float64Array,
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
  return createDenseLu(k).factor(jr) < 0 ? [] : structural;
}

function compileTube(t: TubeDescription): CompiledTube {
  const eddyResistance = t.eddyResistance ?? 0;
  switch (t.law.kind) {
    case 'material': {
      const law = compileMaterial(t.law.material);
      return { name: t.name, law, length: t.law.length, area: t.law.area, reluctance: NaN, eddyResistance, volume: t.law.length * t.law.area };
    }
    case 'air-gap': {
      const reluctance = t.law.length / (MU0 * t.law.fringingFactor * t.law.area);
      return { name: t.name, law: undefined, length: t.law.length, area: t.law.area, reluctance, eddyResistance, volume: t.law.length * t.law.area };
    }
    case 'reluctance':
      return { name: t.name, law: undefined, length: NaN, area: t.law.area ?? NaN, reluctance: t.law.reluctance, eddyResistance, volume: NaN };
  }
}

interface Terminals {
  readonly element: number;
  readonly p: number;
  readonly n: number;
}

/** Elements sorted by kind, with their unknown indices resolved. */
interface ElementGroups {
  readonly windings: (Terminals & { branch: number; tube: number; turns: number; resistance: number; orientation: number })[];
  readonly resistors: (Terminals & { conductance: number })[];
  readonly switches: (Terminals & { onConductance: number; offConductance: number })[];
  readonly capacitors: (Terminals & { capacitance: number })[];
  readonly inductors: (Terminals & { branch: number; inductance: number })[];
  readonly voltageSources: (Terminals & { branch: number })[];
  readonly currentSources: Terminals[];
}

function groupElements(d: NetworkDescription, layout: UnknownLayout, pot: (node: number) => number): ElementGroups {
  const g: ElementGroups = {
    windings: [], resistors: [], switches: [], capacitors: [], inductors: [], voltageSources: [], currentSources: [],
  };
  d.elements.forEach((e, element) => {
    const base = { element, p: pot(e.plus), n: pot(e.minus) };
    const branch = layout.branchCurrent[element]!;
    switch (e.kind) {
      case 'winding':
        g.windings.push({ ...base, branch, tube: e.tube, turns: e.turns, resistance: e.resistance, orientation: e.orientation });
        break;
      case 'resistor':
        g.resistors.push({ ...base, conductance: 1 / e.resistance });
        break;
      case 'switch':
        g.switches.push({ ...base, onConductance: 1 / e.onResistance, offConductance: 1 / e.offResistance });
        break;
      case 'capacitor':
        g.capacitors.push({ ...base, capacitance: e.capacitance });
        break;
      case 'inductor':
        g.inductors.push({ ...base, branch, inductance: e.inductance });
        break;
      case 'voltage-source':
        g.voltageSources.push({ ...base, branch });
        break;
      case 'current-source':
        g.currentSources.push(base);
        break;
    }
  });
  return g;
}
