import { InputError } from '../errors.js';
import type { SweepEdit } from './apply-sweep-edits.js';
import type { SweepAxis, SweepJob, SweepTarget, SweepValue } from './sweep-job.js';

/**
 * One case of a sweep: its position in the job's case list, the value of
 * every axis, and the edits that turn the base network into this case.
 *
 * @example
 * ```ts
 * const c = sweepCase(job, 3);
 * console.log(c.parameters); // { angle: 1.5708, remanence: 0 }
 * ```
 */
export interface SweepCase {
  readonly index: number;
  readonly parameters: Readonly<Record<string, SweepValue>>;
  readonly edits: readonly SweepEdit[];
}

/** The targets of an axis as a list. @internal */
export function axisTargets(axis: SweepAxis): readonly SweepTarget[] {
  return Array.isArray(axis.target) ? (axis.target as readonly SweepTarget[]) : [axis.target as SweepTarget];
}

/**
 * Number of cases in a job: the product of the grid's value counts, or the
 * length of the case list (a job with no axes and an empty grid has one
 * case, the base network). `range` is not applied.
 *
 * @example
 * ```ts
 * sweepCaseCount({ ...job, parameters: { axes, grid: { angle: [0, 1, 2], remanence: [-0.8, 0.8] } } }); // 6
 * ```
 */
export function sweepCaseCount(job: SweepJob): number {
  const p = job.parameters;
  if (p.cases !== undefined) return p.cases.length;
  return p.axes.reduce((n, a) => n * (p.grid?.[a.name]?.length ?? 0), 1);
}

/**
 * Case `index` of a job (0-based, in the job's order): for a grid the
 * cartesian product with the first axis varying slowest (like nested loops
 * in the order of `axes`), for a list its entry. Computed from the index
 * alone, so a worker or a shard never expands the whole grid.
 *
 * @example
 * ```ts
 * // axes angle (2 values) and remanence (3 values): case 4 is angle[1], remanence[1]
 * const c = sweepCase(job, 4);
 * ```
 */
export function sweepCase(job: SweepJob, index: number): SweepCase {
  const total = sweepCaseCount(job);
  if (!Number.isInteger(index) || index < 0 || index >= total) {
    throw new InputError('sweep-bad-option', `case index ${index} is outside the job's cases 0..${total - 1}`, ['index']);
  }
  const p = job.parameters;
  const parameters: Record<string, SweepValue> = {};
  if (p.cases !== undefined) {
    const row = p.cases[index]!;
    for (const a of p.axes) parameters[a.name] = row[a.name]!;
  } else {
    let rest = index;
    for (let k = p.axes.length - 1; k >= 0; k--) {
      const a = p.axes[k]!;
      const values = p.grid?.[a.name] ?? [];
      parameters[a.name] = values[rest % values.length]!;
      rest = Math.floor(rest / values.length);
    }
  }
  const edits: SweepEdit[] = [];
  for (const a of p.axes) for (const target of axisTargets(a)) edits.push({ target, value: parameters[a.name]! });
  // Axes in job order, so the parameters print in that order.
  const ordered: Record<string, SweepValue> = {};
  for (const a of p.axes) ordered[a.name] = parameters[a.name]!;
  return { index, parameters: ordered, edits };
}
