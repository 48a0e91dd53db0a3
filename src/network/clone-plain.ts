/**
 * Deep copy of plain data (arrays, typed arrays, plain objects). Functions
 * and live objects that carry behaviour (a material law, recognised by its
 * `fieldStrength` method) are kept by reference. Used so that the network
 * never shares, mutates or freezes the caller's objects.
 */
export function clonePlain<T>(value: T): T {
  if (value === null || typeof value !== 'object') return value;
  if (ArrayBuffer.isView(value)) return (value as unknown as { slice(): unknown }).slice() as T;
  if (Array.isArray(value)) return value.map((v) => clonePlain(v)) as T;
  const proto = Object.getPrototypeOf(value);
  if ((proto !== Object.prototype && proto !== null) || 'fieldStrength' in (value as object)) return value;
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(value as Record<string, unknown>)) out[k] = clonePlain(v);
  return out as T;
}

/** Freeze plain data recursively (our own copies only); live objects are left alone. */
export function freezePlain<T>(value: T): T {
  if (value === null || typeof value !== 'object' || Object.isFrozen(value) || ArrayBuffer.isView(value)) return value;
  const proto = Object.getPrototypeOf(value);
  if (!Array.isArray(value) && ((proto !== Object.prototype && proto !== null) || 'fieldStrength' in (value as object))) return value;
  Object.freeze(value);
  for (const v of Object.values(value as object)) freezePlain(v);
  return value;
}
