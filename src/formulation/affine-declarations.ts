import type { StampContext } from '../elements/element-kind.js';
import { elementKind, tubeKind } from '../elements/registry.js';
import type { TubeLoops } from '../elements/tube-kind.js';
import type { NetworkDescription } from '../network/description.js';

/**
 * What the elements and tubes of a network declare about how f depends on
 * the unknowns (`ElementKind.nonAffineUnknowns`, `TubeKind.nonAffineUnknowns`):
 * the reduced formulation may eliminate an algebraic unknown inside f only
 * when no element enters it other than affinely.
 *
 * @example
 * ```ts
 * const { byUnknown, undeclared } = compiled.nonAffineUnknowns();
 * for (const [i, owner] of byUnknown) console.log(compiled.layout.labels[i], owner.label);
 * ```
 */
export interface NonAffineUnknowns {
  /** Each unknown some element or tube enters other than affinely, with the first that does. */
  readonly byUnknown: ReadonlyMap<number, DeclaringOwner>;
  /** Elements and tubes whose kind declares nothing: the reduction refuses them. */
  readonly undeclared: readonly DeclaringOwner[];
}

/**
 * An element or tube as the reduction's messages name it: `label` for the
 * text (`flux tube "leg"`), `name` for the error's list of elements.
 *
 * @example
 * ```ts
 * const owner: DeclaringOwner = { label: 'flux tube "leg"', name: 'leg' };
 * ```
 */
export interface DeclaringOwner {
  readonly label: string;
  readonly name: string;
}

/**
 * Collect the declarations of every element and tube of a compiled network.
 *
 * @internal
 * @example
 * ```ts
 * const declared = nonAffineUnknowns(description, ctx, layout.tubeStates, tubeLoops);
 * ```
 */
export function nonAffineUnknowns(
  d: NetworkDescription,
  ctx: StampContext,
  tubeStates: ArrayLike<number>,
  tubeLoops: readonly TubeLoops[],
): NonAffineUnknowns {
  const byUnknown = new Map<number, DeclaringOwner>();
  const undeclared: DeclaringOwner[] = [];
  const note = (unknowns: readonly number[], owner: DeclaringOwner): void => {
    for (const i of unknowns) if (i >= 0 && !byUnknown.has(i)) byUnknown.set(i, owner);
  };
  for (const e of d.elements) {
    const kind = elementKind(e);
    const owner = { label: `${kind.noun} "${e.name}"`, name: e.name };
    if (kind.nonAffineUnknowns) note(kind.nonAffineUnknowns(e, ctx), owner);
    else undeclared.push(owner);
  }
  d.tubes.forEach((t, b) => {
    const kind = tubeKind(t.law);
    const owner = { label: `${kind.noun} "${t.name}"`, name: t.name };
    if (kind.nonAffineUnknowns) note(kind.nonAffineUnknowns(t.law, t, { stateOffset: tubeStates[b]!, loops: tubeLoops[b]! }), owner);
    else undeclared.push(owner);
  });
  return { byUnknown, undeclared };
}
