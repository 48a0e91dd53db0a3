import { expectTypeOf, test } from 'vitest';
import type { ElementKind } from '../../src/elements/element-kind.js';
import { ELEMENT_KINDS } from '../../src/elements/registry.js';
import type { ElementDescription } from '../../src/network/description.js';

test('the registry is an exhaustive record over the element kinds', () => {
  expectTypeOf<keyof typeof ELEMENT_KINDS>().toEqualTypeOf<ElementDescription['kind']>();
  type Registry = { readonly [K in ElementDescription['kind']]: ElementKind<Extract<ElementDescription, { kind: K }>> };
  // A registry missing a kind does not compile.
  // @ts-expect-error the 'winding' entry is missing
  const partial: Registry = { ...ELEMENT_KINDS, winding: undefined };
  void partial;
});
