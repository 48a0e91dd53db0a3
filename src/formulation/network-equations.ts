import type { ElementGroup, InputView } from '../elements/element-kind.js';
import type { StampTarget } from '../elements/stamp-target.js';
import type { CompiledTube, TubeLoops, TubeStateStamps } from '../elements/tube-kind.js';
import { loopFlux } from '../elements/loop-flux.js';
import type { MaterialLaw } from '../materials/material-law.js';
import { packedDoubles } from '../solver/packed-doubles.js';

/** How f reads one tube's MMF drop (see seriesTerms in compile-network.ts). */
export interface MmfTerm {
  /** Index of the tube's series (tubes sharing one law evaluation), or -1 for a tube read on its own. */
  readonly group: number;
  /** The first tube of its series in tube order: it evaluates the law for the others. */
  readonly first: boolean;
  readonly law: MaterialLaw | undefined;
  readonly length: number;
  readonly area: number;
}

/**
 * A compiled network's f and df/dy as methods of one class. The solver
 * calls them at every stage of every Newton iteration; as closures made per
 * compile they were a new call target for each network compiled, and the
 * next run in a process deoptimised the code specialised on the last.
 *
 * @internal
 * @example
 * ```ts
 * const equations = new NetworkEquations(tubes, tubeLoops, terms, tubeStates, groups);
 * equations.evaluate(t, y, inputs, out);
 * ```
 */
export class NetworkEquations {
  private readonly tubeCount: number;
  /** Per series, H and dH/dB of its last evaluation (plain arrays: see packedDoubles). */
  private readonly lawValues: number[];
  private readonly slopeValues: number[];

  constructor(
    private readonly tubes: readonly CompiledTube[],
    private readonly tubeLoops: readonly TubeLoops[],
    /** Tubes in series with one law share one evaluation of it per call (see seriesTerms). */
    private readonly terms: readonly MmfTerm[],
    private readonly tubeStates: readonly TubeStateStamps[],
    private readonly groups: readonly ElementGroup[],
  ) {
    this.tubeCount = tubes.length;
    const groupCount = terms.reduce((m, term) => Math.max(m, term.group + 1), 0);
    this.lawValues = packedDoubles(groupCount);
    this.slopeValues = packedDoubles(groupCount);
  }

  /** Flux of tube b in the state y, Wb. */
  fluxOf(y: Float64Array, b: number): number {
    return loopFlux(this.tubeLoops[b]!, y);
  }

  /** f(t, y) into out, with the inputs in force given explicitly. */
  evaluate(t: number, y: Float64Array, inp: InputView, out: Float64Array): void {
    const { terms, tubes, tubeLoops, lawValues, tubeStates, groups, tubeCount } = this;
    // A loop, not fill(): for a few unknowns the builtin's call costs more than the stores. The
    // length read once: read at each pass it cost a third of the loop (measured, 4 unknowns).
    const n = out.length;
    // Four stores a pass: each pass's back edge checks for interrupts and then reads out's map and
    // length again (about 20 instructions a pass, counted).
    let i = 0;
    for (; i + 3 < n; i += 4) {
      out[i] = 0;
      out[i + 1] = 0;
      out[i + 2] = 0;
      out[i + 3] = 0;
    }
    for (; i < n; i++) out[i] = 0;
    // Magnetic loops: -sum_b B_lb F_b(phi_b); windings add their MMFs.
    for (let b = 0; b < tubeCount; b++) {
      const term = terms[b]!;
      // The tube's loops read once, for its flux and for its MMF's scatter.
      const loops = tubeLoops[b]!;
      const { index, sign } = loops;
      const m = index.length;
      let F: number;
      // `=== true`: one comparison, where V8 tested the field's truth generically (string, number, bigint).
      if (term.group < 0 || term.first === true) {
        const flux = loopFlux(loops, y);
        if (term.group < 0) F = tubes[b]!.mmf(flux, y);
        // The material tube's own l H(phi / A), with H read once for its series.
        else F = term.length * (lawValues[term.group] = term.law!.fieldStrength(flux / term.area));
      } else F = term.length * lawValues[term.group]!;
      // A tube in one loop (every tube of a core with one window) without a loop's back edge.
      if (m === 1) out[index[0]!]! -= sign[0]! * F;
      else for (let k = 0; k < m; k++) out[index[k]!]! -= sign[k]! * F;
    }
    // Indexed loops: this runs at every stage of every Newton iteration.
    for (let k = 0; k < tubeStates.length; k++) tubeStates[k]!.residual(t, y, inp, out);
    for (let k = 0; k < groups.length; k++) groups[k]!.residual(t, y, inp, out);
  }

  /** df/dy added into a stamp target (zero-filled by the caller), with the inputs given explicitly. */
  stampJacobian(t: number, y: Float64Array, inp: InputView, J: StampTarget): void {
    const { terms, tubes, tubeLoops, slopeValues, tubeStates, groups, tubeCount } = this;
    for (let b = 0; b < tubeCount; b++) {
      const term = terms[b]!;
      // The tube's loops read once, for its flux and for its stamps (as in evaluate).
      const loops = tubeLoops[b]!;
      const { index, sign } = loops;
      const m = index.length;
      let dF: number;
      // `=== true`: one comparison, where V8 tested the field's truth generically (string, number, bigint).
      if (term.group < 0 || term.first === true) {
        const flux = loopFlux(loops, y);
        if (term.group < 0) dF = tubes[b]!.mmfSlope(flux, y);
        else dF = (term.length / term.area) * (slopeValues[term.group] = term.law!.fieldSlope(flux / term.area));
      } else dF = (term.length / term.area) * slopeValues[term.group]!;
      for (let k1 = 0; k1 < m; k1++) {
        for (let k2 = 0; k2 < m; k2++) J.add(index[k1]!, index[k2]!, -sign[k1]! * sign[k2]! * dF);
      }
    }
    for (let k = 0; k < tubeStates.length; k++) tubeStates[k]!.jacobian(t, y, inp, J);
    for (let k = 0; k < groups.length; k++) groups[k]!.jacobian(t, y, inp, J);
  }
}
