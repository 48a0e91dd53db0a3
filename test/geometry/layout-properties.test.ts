import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  coreConstants,
  eCoreLayout,
  fiveLimbLayout,
  threeLimbLayout,
  toroidLayout,
  uCoreLayout,
  type CoreLayout,
  type LegGap,
  type LegWindings,
} from '../../src/index.js';

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);
const len = (lo: number, hi: number) => fc.double({ min: lo, max: hi, noNaN: true });

// Random valid inputs (SI). Gaps stay below every limit (0.2 x min(leg width, depth, window height));
// windings take at most half a window per leg.
const common = fc.record({
  windowWidth: len(0.005, 0.2),
  windowHeight: len(0.01, 0.5),
  yokeHeight: len(0.003, 0.1),
  depth: len(0.003, 0.1),
  stackingFactor: len(0.5, 1),
  meanPath: fc.constantFrom('iec-60205' as const, 'centre-line' as const),
});
const gapFor = (legWidth: number, c: { depth: number; windowHeight: number }) =>
  fc.option(
    fc.record({
      length: len(0.01, 0.2).map((f) => f * Math.min(legWidth, c.depth, c.windowHeight)),
      fringing: fc.constantFrom<LegGap['fringing']>('none', 'mclyman', 'matsch', 1.1),
    }),
    { nil: undefined },
  );
const windingsFor = (c: { windowWidth: number; windowHeight: number }) =>
  fc.option(
    fc.record({
      innerBuild: len(0.01, 0.15).map((f) => f * c.windowWidth),
      outerBuild: len(0.01, 0.15).map((f) => f * c.windowWidth),
      spacing: len(0, 0.1).map((f) => f * c.windowWidth),
      clearance: len(0, 0.05).map((f) => f * c.windowWidth),
      height: len(0.5, 1).map((f) => f * c.windowHeight),
    }),
    { nil: undefined },
  );
const defined = <T>(entries: [string, T | undefined][]): Record<string, T> =>
  Object.fromEntries(entries.filter((e): e is [string, T] => e[1] !== undefined));

const layouts: fc.Arbitrary<CoreLayout> = fc.oneof(
  fc.record({ r1: len(0.002, 0.1), ratio: len(1.05, 4), h: len(0.002, 0.1), g: fc.option(len(0.01, 0.9), { nil: undefined }) }).map((t) =>
    toroidLayout({ innerRadius: t.r1, outerRadius: t.r1 * t.ratio, height: t.h, ...(t.g === undefined ? {} : { gap: { length: t.g * t.r1 } }) }),
  ),
  common.chain((c) =>
    len(0.003, 0.1).chain((a) =>
      fc.tuple(gapFor(a, c), gapFor(a, c), windingsFor(c), windingsFor(c)).map(([g1, g2, w1, w2]) =>
        uCoreLayout({ ...c, legWidth: a, gaps: defined([['left', g1], ['right', g2]]), windings: defined<LegWindings>([['left', w1], ['right', w2]]) }),
      ),
    ),
  ),
  common.chain((c) =>
    fc.tuple(len(0.003, 0.1), len(0.003, 0.1)).chain(([a, cw]) =>
      fc.tuple(gapFor(a, c), gapFor(cw, c), windingsFor(c)).map(([g1, g2, w]) =>
        eCoreLayout({ ...c, outerLegWidth: a, centreLegWidth: cw, gaps: defined([['left', g1], ['centre', g2]]), windings: defined([['centre', w]]) }),
      ),
    ),
  ),
  common.chain((c) =>
    len(0.003, 0.1).chain((a) =>
      fc.tuple(gapFor(a, c), windingsFor(c), windingsFor(c), windingsFor(c)).map(([g, wa, wb, wc]) =>
        threeLimbLayout({ ...c, limbWidth: a, gaps: defined([['b', g]]), windings: defined([['a', wa], ['b', wb], ['c', wc]]) }),
      ),
    ),
  ),
  common.chain((c) =>
    // outer windows at least half the phase windows, so windings sized on windowWidth fit them
    fc.tuple(len(0.003, 0.1), len(0.003, 0.1), len(0.5, 1.5)).chain(([a, r, rw]) =>
      fc.tuple(windingsFor(c), gapFor(r, c)).map(([w, g]) =>
        fiveLimbLayout({ ...c, limbWidth: a, returnLimbWidth: r, returnWindowWidth: rw * c.windowWidth, windings: defined([['a', w]]), gaps: defined([['return-right', g]]) }),
      ),
    ),
  ),
);

function deepFrozen(x: unknown): boolean {
  if (x === null || typeof x !== 'object') return true;
  return Object.isFrozen(x) && Object.values(x).every(deepFrozen);
}

describe('core layouts (all shapes, random valid dimensions)', () => {
  it('form a connected graph of unique names in which every node has at least two paths', () => {
    fc.assert(
      fc.property(layouts, (l) => {
        expect(new Set(l.nodes).size).toBe(l.nodes.length);
        expect(new Set(l.paths.map((p) => p.name)).size).toBe(l.paths.length);
        const adjacent = new Map(l.nodes.map((n) => [n, new Set<string>()]));
        for (const p of l.paths) {
          expect(adjacent.has(p.from) && adjacent.has(p.to)).toBe(true);
          expect(p.from).not.toBe(p.to);
          adjacent.get(p.from)?.add(p.name);
          adjacent.get(p.to)?.add(p.name);
        }
        for (const [, paths] of adjacent) expect(paths.size).toBeGreaterThanOrEqual(2);
        // connectivity by breadth-first search over paths
        const seen = new Set([l.nodes[0]]);
        const queue = [l.nodes[0]];
        while (queue.length > 0) {
          const n = queue.shift();
          for (const p of l.paths) {
            const other = p.from === n ? p.to : p.to === n ? p.from : undefined;
            if (other !== undefined && !seen.has(other)) {
              seen.add(other);
              queue.push(other);
            }
          }
        }
        expect(seen.size).toBe(l.nodes.length);
        // independent loops (paths - nodes + 1): one per window, plus one per leakage path
        const leakage = l.paths.filter((p) => p.kind === 'leakage').length;
        const windows = l.shape === 'toroid' ? 1 : l.windows.length;
        expect(l.paths.length - l.nodes.length + 1).toBe(windows + leakage);
      }),
      { numRuns: 150 },
    );
  });

  it('are deeply frozen plain data that survive a JSON round trip', () => {
    fc.assert(
      fc.property(layouts, (l) => {
        expect(deepFrozen(l)).toBe(true);
        expect(JSON.parse(JSON.stringify(l))).toEqual(l);
      }),
      { numRuns: 60 },
    );
  });

  it("give every core path the C1 and C2 of its sections (its linear reluctance and the IEC Ve)", () => {
    fc.assert(
      fc.property(layouts, (l) => {
        for (const p of l.paths) {
          if (p.kind === 'core') {
            const k = coreConstants(p.sections);
            expect(rel(p.length / p.area, k.c1)).toBeLessThan(1e-12);
            expect(rel(p.length / p.area ** 2, k.c2)).toBeLessThan(1e-12);
          } else if (p.kind === 'gap') {
            expect(p.fringingFactor).toBeGreaterThanOrEqual(1);
            expect(rel(p.area, p.faceArea * p.fringingFactor)).toBeLessThan(1e-14);
          } else {
            expect(p.reluctance).toBeGreaterThan(0);
          }
        }
      }),
      { numRuns: 150 },
    );
  });

  it('list legs whose paths exist and belong to them, windings on core paths, winding legs among the legs', () => {
    fc.assert(
      fc.property(layouts, (l) => {
        const byName = new Map(l.paths.map((p) => [p.name, p]));
        for (const leg of l.legs) {
          for (const name of leg.paths) expect(byName.get(name)?.member.name).toBe(leg.name);
          expect(byName.get(leg.windingPath)?.kind).toBe('core');
          expect(byName.get(leg.outerWindingPath)?.kind).toBe('core');
        }
        const legNames = l.legs.map((x) => x.name);
        for (const w of l.windingLegs) expect(legNames).toContain(w);
        // every path belongs to a leg's list or is a yoke
        const listed = new Set(l.legs.flatMap((x) => x.paths));
        for (const p of l.paths) expect(listed.has(p.name) || p.member.kind === 'yoke').toBe(true);
      }),
      { numRuns: 100 },
    );
  });

  it('keep each leg and yoke length (iron + gap, leakage aside) whatever gaps and windings are added', () => {
    // Conservation of the mean path (DERIVED): a gap replaces iron, windings only split the leg.
    const total = (l: CoreLayout, member: string): number =>
      l.paths
        .filter((p) => p.member.name === member && p.kind !== 'leakage')
        .reduce((s, p) => s + (p.kind === 'core' ? p.sections.reduce((t, x) => t + x.length, 0) : p.kind === 'gap' ? p.length : 0), 0);
    fc.assert(
      fc.property(
        common.chain((c) =>
          fc.tuple(fc.constant(c), len(0.003, 0.1), len(0.003, 0.1)).chain(([c2, a, cw]) =>
            fc.tuple(fc.constant(c2), fc.constant(a), fc.constant(cw), gapFor(a, c2), gapFor(cw, c2), windingsFor(c2)),
          ),
        ),
        ([c, a, cw, g1, g2, w]) => {
          const plain = eCoreLayout({ ...c, outerLegWidth: a, centreLegWidth: cw });
          const full = eCoreLayout({ ...c, outerLegWidth: a, centreLegWidth: cw, gaps: defined([['left', g1], ['centre', g2]]), windings: defined([['centre', w]]) });
          for (const m of ['left', 'centre', 'right', 'top', 'bottom']) expect(rel(total(full, m), total(plain, m))).toBeLessThan(1e-12);
          // the ungapped core constants do not change either
          expect(full.constants).toEqual(plain.constants);
        },
      ),
      { numRuns: 100 },
    );
  });
});
