/** Median wall time of `repeats` runs of fn (ms), after `warmup` untimed runs (JIT), and the last result. */
export function timeMedian<T>(fn: () => T, repeats: number, warmup = repeats > 1 ? 1 : 0): { ms: number; result: T } {
  const times: number[] = [];
  let result: T | undefined;
  for (let w = 0; w < warmup; w++) fn();
  for (let r = 0; r < repeats; r++) {
    const t0 = performance.now();
    result = fn();
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  return { ms: times[Math.floor(times.length / 2)]!, result: result as T };
}

/** CPU time (user + system, ms) of one call of fn: the machines are shared, so CPU time, not wall time. */
export function cpuMs(fn: () => unknown): number {
  const c0 = process.cpuUsage();
  fn();
  const c = process.cpuUsage(c0);
  return (c.user + c.system) / 1000;
}

/** The middle value of `a` (the upper one of the two for an even count), NaN for an empty list. */
export function median(a: readonly number[]): number {
  return [...a].sort((x, y) => x - y)[a.length >> 1] ?? NaN;
}

/**
 * CPU ms of `rounds` calls of each of two runs, alternating which goes first
 * from round to round, so that neither always follows the other's garbage.
 */
export function alternateCpuMs(rounds: number, here: () => unknown, there: () => unknown): { here: number[]; there: number[] } {
  return alternate(rounds, () => cpuMs(here), () => cpuMs(there));
}

/** `rounds` results of each of two measurements, alternating which goes first from round to round. */
export function alternate<T>(rounds: number, here: () => T, there: () => T): { here: T[]; there: T[] } {
  const out = { here: [] as T[], there: [] as T[] };
  for (let k = 0; k < rounds; k++) {
    if (k % 2 === 0) {
      out.here.push(here());
      out.there.push(there());
    } else {
      out.there.push(there());
      out.here.push(here());
    }
  }
  return out;
}

/** Fixed-width table printing. */
export function printTable(head: string[], rows: (string | number)[][]): void {
  const cells = [head, ...rows.map((r) => r.map((c) => (typeof c === 'number' ? fmt(c) : c)))];
  const widths = head.map((_, j) => Math.max(...cells.map((r) => (r[j] ?? '').length)));
  for (const r of cells) console.log(r.map((c, j) => (j === 0 ? c.padEnd(widths[j]!) : c.padStart(widths[j]!))).join('  '));
}

export function fmt(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e6 || a < 1e-2) return x.toExponential(2);
  if (Number.isInteger(x)) return String(x);
  return x.toFixed(a >= 100 ? 0 : a >= 10 ? 1 : 2);
}
