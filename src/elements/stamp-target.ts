/**
 * Where element stamps add their entries of the Jacobian or the mass
 * matrix. Elements never index the storage themselves, so the storage can
 * change (dense today, a fixed sparse pattern for large networks) without
 * touching an element. A row or column of -1 (ground) is ignored.
 *
 * @example
 * ```ts
 * J.add(p, p, -g); J.add(p, q, g); // a conductance between nodes p and q
 * ```
 */
export interface StampTarget {
  add(row: number, col: number, value: number): void;
}

/**
 * A stamp target over a dense row-major n x n array.
 *
 * @example
 * ```ts
 * const target = new DenseStampTarget(n);
 * target.bind(J); // stamps now add into J
 * target.add(0, 1, 2.5);
 * ```
 */
export class DenseStampTarget implements StampTarget {
  /** Made on first use when nothing is bound: a target only ever bound holds no n x n array of its own. */
  private data: Float64Array | undefined;

  constructor(private readonly n: number) {}

  /** Make stamps add into `data` (row-major n x n). */
  bind(data: Float64Array): this {
    this.data = data;
    return this;
  }

  /** The array stamps add into. */
  get values(): Float64Array {
    return (this.data ??= new Float64Array(this.n * this.n));
  }

  add(row: number, col: number, value: number): void {
    if (row >= 0 && col >= 0) {
      const data = (this.data ??= new Float64Array(this.n * this.n));
      data[row * this.n + col]! += value;
    }
  }
}

/**
 * Stamp a conductance g between the unknowns of two node potentials p and q
 * (either may be -1 for ground) into df/dy, with f the KCL residual
 * (current into the node): the usual MNA pattern.
 *
 * @example
 * ```ts
 * stampConductance(J, p, q, 1 / 12);
 * ```
 */
export function stampConductance(J: StampTarget, p: number, q: number, g: number): void {
  J.add(p, p, -g);
  J.add(p, q, g);
  J.add(q, p, g);
  J.add(q, q, -g);
}

/**
 * Stamp a branch current unknown b flowing from node p to node q through
 * the element into the KCL rows (leaving p, entering q) and the branch row's
 * dependence on v_p - v_q (coefficient `voltageSign`).
 *
 * @example
 * ```ts
 * stampBranch(J, p, q, b, 1); // v_p - v_q appears with +1 in row b
 * ```
 */
export function stampBranch(J: StampTarget, p: number, q: number, b: number, voltageSign: number): void {
  J.add(p, b, -1);
  J.add(q, b, 1);
  J.add(b, p, voltageSign);
  J.add(b, q, -voltageSign);
}

/**
 * A stamp target that records where stamps go, not what they add: run an
 * element's stamps through it once and the positions it may ever touch are
 * known (every element stamps the same positions whatever the values, a
 * zero included). Ground (-1) is ignored as in every target. The positions
 * are the Jacobian pattern handed to the sparse solver at compile time.
 *
 * @example
 * ```ts
 * const recorder = new PatternRecordingStampTarget();
 * stampConductance(recorder, 0, 1, 0); // records (0,0), (0,1), (1,0), (1,1)
 * recorder.rows; // [0, 0, 1, 1]
 * ```
 */
export class PatternRecordingStampTarget implements StampTarget {
  /** Row of each recorded position (duplicates kept). */
  readonly rows: number[] = [];
  /** Column of each recorded position. */
  readonly cols: number[] = [];

  add(row: number, col: number, _value: number): void {
    if (row >= 0 && col >= 0) {
      this.rows.push(row);
      this.cols.push(col);
    }
  }
}

/**
 * A stamp target that records every entry, position and value, in the
 * order stamped (duplicates kept; ground ignored): a constant matrix such as
 * the mass matrix given by its non-zeros instead of an n x n array.
 *
 * @example
 * ```ts
 * const recorder = new EntryRecordingStampTarget();
 * recorder.add(0, 1, 2.5);
 * recorder.values; // [2.5]
 * ```
 */
export class EntryRecordingStampTarget implements StampTarget {
  /** Row of each recorded entry. */
  readonly rows: number[] = [];
  /** Column of each recorded entry. */
  readonly cols: number[] = [];
  /** Value of each recorded entry. */
  readonly values: number[] = [];

  add(row: number, col: number, value: number): void {
    if (row >= 0 && col >= 0) {
      this.rows.push(row);
      this.cols.push(col);
      this.values.push(value);
    }
  }
}
