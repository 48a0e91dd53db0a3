import { InputError } from '../errors.js';
import { deepFreeze } from './checks.js';
import type { CoreLayout, LayoutTankPath } from './core-layout.js';

/**
 * Zero-sequence (tank) return path option of the three-phase layouts.
 *
 * @example
 * ```ts
 * const zeroSequence: ZeroSequencePath = { reluctance: 2e6 }; // A/Wb, total over the three limbs
 * threeLimbLayout({ ...dimensions, zeroSequence });
 * ```
 */
export interface ZeroSequencePath {
  /**
   * Total reluctance of the return path from the top yoke to the bottom yoke
   * outside the core (oil gaps, tank wall, clamps), A/Wb. Split into one path
   * per phase limb of three times this value, in parallel. See
   * {@link zeroSequenceReluctance} and docs/geometry.md for its value.
   */
  readonly reluctance: number;
}

/**
 * The reluctance of a zero-sequence return path from a measured or assumed
 * zero-sequence magnetising reactance: with all three phases driven in
 * phase, each phase winding of N turns sees X0 = omega N^2 / (3 R0) per
 * phase when the three limb fluxes add up in the one return path of
 * reluctance R0 (derived from the magnetic circuit, the iron's own
 * reluctance neglected), so R0 = omega N^2 / (3 X0).
 *
 * Typical values (common practice, from memory; check the maker's data):
 * for three-limb core-type transformers the zero-sequence magnetising
 * reactance is low, of the order of 0.3 to 1 per unit of the rated
 * impedance, against hundreds of per unit for the positive sequence; five-limb
 * cores and shell types have iron return paths and much higher values until
 * the return limbs saturate.
 *
 * @example
 * ```ts
 * // 11 kV / 400 V, 630 kVA, LV 28 turns; X0 = 0.5 pu of 400^2 / 630e3 = 0.127 ohm, at 50 Hz
 * const r0 = zeroSequenceReluctance({ turns: 28, frequency: 50, reactance: 0.127 }); // about 6.5e3 A/Wb
 * ```
 */
export function zeroSequenceReluctance(input: { readonly turns: number; readonly frequency: number; readonly reactance: number }): number {
  for (const [name, unit] of [['turns', ''], ['frequency', 'Hz'], ['reactance', 'ohm']] as const) {
    const v = input[name];
    if (typeof v !== 'number' || !Number.isFinite(v) || v <= 0) {
      throw new InputError('invalid-dimension', `zeroSequenceReluctance: ${name} = ${String(v)} ${unit} is not a positive finite number`, [name]);
    }
  }
  return (2 * Math.PI * input.frequency * input.turns * input.turns) / (3 * input.reactance);
}

/**
 * The layout with a tank path beside each of `limbs`, between the limb's
 * bottom and top nodes: equal shares of `limbs.length` times R0, which in
 * parallel make R0.
 *
 * @internal
 */
export function withTankPaths(layout: CoreLayout, limbs: readonly string[], option: ZeroSequencePath | undefined, owner: string): CoreLayout {
  if (option === undefined) return layout;
  const r = option?.reluctance;
  if (typeof r !== 'number' || !Number.isFinite(r) || r <= 0) {
    throw new InputError(
      'invalid-dimension',
      `${owner}: zeroSequence.reluctance = ${String(r)} A/Wb is not a positive finite number; give the tank path's reluctance (see zeroSequenceReluctance)`,
      ['zeroSequence.reluctance'],
    );
  }
  const tank: LayoutTankPath[] = limbs.map((limb) => ({
    kind: 'tank',
    name: `tank-${limb}`,
    from: `bottom-${limb}`,
    to: `top-${limb}`,
    member: { kind: 'leg', name: limb },
    reluctance: r * limbs.length,
  }));
  return deepFreeze({ ...layout, paths: [...layout.paths, ...tank] });
}
