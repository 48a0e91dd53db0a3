/**
 * Convert a length in millimetres to metres. The geometry functions take SI
 * units only and never guess; convert at the call site.
 *
 * @example
 * ```ts
 * toroidConstants({ innerRadius: mm(10), outerRadius: mm(20), height: mm(10) });
 * ```
 */
export function mm(millimetres: number): number {
  return millimetres * 1e-3;
}

/**
 * Convert an area in square millimetres to square metres.
 *
 * @example
 * ```ts
 * gapReluctance({ length: mm(0.5), area: mm2(100) });
 * ```
 */
export function mm2(squareMillimetres: number): number {
  return squareMillimetres * 1e-6;
}
