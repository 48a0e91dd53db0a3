/**
 * Property tests on random INVALID networks: a random valid network
 * (random-network.ts) broken in one random way (a dangling magnetic node, an
 * open winding, a loop of voltage sources, a cut-set of current sources, a
 * floating circuit, cancelling or over-constraining ideal windings, a winding
 * on a bridge tube, a bad number, waveform or material, a corrupted plain-data
 * description). The contract (docs/errors.md): always a typed FluxstateError
 * with the documented code and the element named, thrown quickly; never
 * another exception, never a hang. Integration budgets (maxSteps,
 * maxWallTimeMs) bound any run that a check would let through, and every
 * case is timed.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  constant,
  FluxstateError,
  InputError,
  pulse,
  simulate,
  sine,
  TopologyError,
  validateDescription,
  type MaterialSpec,
  type NetworkDescription,
  type WaveformSpec,
} from '../../src/index.js';
import { buildNetwork, networkPlanArb, runs, type BuiltNetwork } from './random-network.js';

const material = { kind: 'linear', relativePermeability: 1000 } as const;
/** A corrupted description that still simulates is stopped by this budget, well inside the time limit. */
const BUDGET = { maxSteps: 5_000, maxWallTimeMs: 1_000 } as const;
/** Longest a case may take, ms: never a hang (rejections take a few ms; a run stops at its wall-time budget). */
const TIME_LIMIT_MS = 2_000;

interface Breakage {
  readonly name: string;
  readonly errorClass: typeof InputError | typeof TopologyError;
  readonly code: string;
  /** Applies the breakage (a builder call may throw here: that is the error under test). */
  readonly apply: (b: BuiltNetwork) => string;
}

/** Structural breakages: each returns the name the error must carry in `elements`. */
const TOPOLOGY: readonly Breakage[] = [
  { name: 'magnetic node without tubes', errorClass: TopologyError, code: 'unused-magnetic-node', apply: (b) => (b.net.magneticNode('orphan'), 'orphan') },
  {
    name: 'magnetic node with one tube', errorClass: TopologyError, code: 'dangling-magnetic-node',
    apply: (b) => {
      const end = b.net.magneticNode('stub end');
      b.net.fluxTube('stub', { from: b.magneticNodes[0]!, to: end, length: 0.01, area: 1e-4, material });
      return 'stub end';
    },
  },
  {
    name: 'winding with an open terminal', errorClass: TopologyError, code: 'open-winding',
    apply: (b) => {
      const x = b.net.node('open end');
      b.net.winding('open coil', { tube: b.tubesWithArea[0]!, turns: 10, resistance: 1, plus: x, minus: b.net.ground });
      return 'open coil';
    },
  },
  {
    name: 'inductor with an open terminal', errorClass: TopologyError, code: 'open-terminal',
    apply: (b) => (b.net.inductor('open choke', b.net.node('choke end'), b.net.ground, 1e-3), 'open choke'),
  },
  {
    name: 'circuit with no ground', errorClass: TopologyError, code: 'floating-node',
    apply: (b) => {
      const [p, q] = [b.net.node('float p'), b.net.node('float q')];
      b.net.winding('floating coil', { tube: b.tubesWithArea[0]!, turns: 10, resistance: 1, plus: p, minus: q });
      b.net.resistor('floating load', p, q, 10);
      return 'float p';
    },
  },
  {
    name: 'two voltage sources in parallel', errorClass: TopologyError, code: 'voltage-source-loop',
    apply: (b) => {
      const x = b.net.node('bus');
      b.net.voltageSource('bus a', x, b.net.ground, constant(1));
      b.net.voltageSource('bus b', x, b.net.ground, sine({ amplitude: 1, frequency: 50 }));
      return 'bus b';
    },
  },
  {
    name: 'node fed only by current sources', errorClass: TopologyError, code: 'current-source-cutset',
    apply: (b) => {
      const x = b.net.node('island');
      b.net.currentSource('feed a', x, b.net.ground, constant(1));
      b.net.currentSource('feed b', x, b.net.ground, constant(2));
      return 'island';
    },
  },
  {
    name: 'winding on a bridge between two cores', errorClass: TopologyError, code: 'winding-on-open-path',
    apply: (b) => {
      const [r1, r2] = [b.net.magneticNode('ring 1'), b.net.magneticNode('ring 2')];
      b.net.fluxTube('ring a', { from: r1, to: r2, length: 0.1, area: 1e-4, material });
      b.net.fluxTube('ring b', { from: r2, to: r1, length: 0.1, area: 1e-4, material });
      const bridge = b.net.fluxTube('bridge', { from: b.magneticNodes[0]!, to: r1, length: 0.1, area: 1e-4, material });
      const x = b.net.node('bridge coil end');
      b.net.winding('bridge coil', { tube: bridge, turns: 10, resistance: 1, plus: x, minus: b.net.ground });
      b.net.resistor('bridge load', x, b.net.ground, 10);
      return 'bridge coil';
    },
  },
  {
    name: 'ideal windings in parallel whose voltages cancel', errorClass: TopologyError, code: 'cancelling-winding-loop',
    apply: (b) => {
      const x = b.net.node('twin');
      b.net.winding('twin a', { tube: b.tubesWithArea[0]!, turns: 10, plus: x, minus: b.net.ground });
      b.net.winding('twin b', { tube: b.tubesWithArea[0]!, turns: 10, plus: x, minus: b.net.ground });
      return 'twin a';
    },
  },
  {
    name: 'two voltage-driven ideal windings on one tube', errorClass: TopologyError, code: 'over-constrained-flux',
    apply: (b) => {
      const [x, y] = [b.net.node('drive x'), b.net.node('drive y')];
      b.net.voltageSource('vx', x, b.net.ground, sine({ amplitude: 1, frequency: 50 }));
      b.net.voltageSource('vy', y, b.net.ground, sine({ amplitude: 2, frequency: 50 }));
      b.net.winding('ideal x', { tube: b.tubesWithArea[0]!, turns: 10, plus: x, minus: b.net.ground });
      b.net.winding('ideal y', { tube: b.tubesWithArea[0]!, turns: 20, plus: y, minus: b.net.ground });
      return 'ideal x';
    },
  },
];

const badNumber = fc.constantFrom(Number.NaN, Infinity, -Infinity, -1, 0, -1e-9, '3' as unknown as number, undefined as unknown as number);

/** Builder calls with one bad number (element "bad"): the InputError names the element. */
function badCall(b: BuiltNetwork, which: number, v: number): void {
  const x = b.net.node('bad x');
  const tube = b.tubesWithArea[0]!;
  const [m0, m1] = [b.magneticNodes[0]!, b.magneticNodes[1]!];
  // Optional options take undefined as "absent" (their default), and 0 is a valid winding resistance.
  const optional = v === undefined ? Number.NaN : v;
  const calls: (() => void)[] = [
    () => b.net.resistor('bad', x, b.net.ground, v),
    () => b.net.capacitor('bad', x, b.net.ground, v),
    () => b.net.inductor('bad', x, b.net.ground, v),
    () => b.net.capacitor('bad', x, b.net.ground, 1e-6, { initialVoltage: Number.isFinite(optional) ? Number.NaN : optional }),
    () => b.net.winding('bad', { tube, turns: v, plus: x, minus: b.net.ground }),
    () => b.net.winding('bad', { tube, turns: 10, resistance: optional === 0 ? -1 : optional, plus: x, minus: b.net.ground }),
    () => b.net.fluxTube('bad', { from: m0, to: m1, length: v, area: 1e-4, material }),
    () => b.net.fluxTube('bad', { from: m0, to: m1, length: 0.1, area: v, material }),
    () => b.net.airGap('bad', { from: m0, to: m1, length: v, area: 1e-4 }),
    () => b.net.reluctance('bad', { from: m0, to: m1, reluctance: v }),
    () => b.net.switch('bad', x, b.net.ground, { onResistance: optional }),
    () => b.net.fluxTube('bad', { from: m0, to: m1, length: 0.1, area: 1e-4, material, eddyResistance: optional }),
  ];
  calls[Math.floor(which / 4) % calls.length]!();
}

/** Bad waveform and material specs. */
const badWaveforms: readonly WaveformSpec[] = [
  sine({ amplitude: Number.NaN, frequency: 50 }),
  sine({ amplitude: 1, frequency: 0 }),
  pulse({ high: 1, period: 0, duty: 0.5 }),
  pulse({ high: 1, period: 1e-3, duty: 1.2 }),
  pulse({ high: 1, period: 1e-3, duty: 0.5, rise: -1e-6 }),
  { kind: 'piecewise-linear', times: [0, 2, 1], values: [0, 1, 2] },
  { kind: 'piecewise-linear', times: [], values: [] },
  { kind: 'function' },
  { kind: 'bipolar-square', amplitude: 1, period: 1e-3, deadTime: 1e-3 },
  { kind: 'triangle' } as unknown as WaveformSpec,
  constant(Infinity),
];
const badMaterials: readonly MaterialSpec[] = [
  { kind: 'linear', relativePermeability: -5 },
  { kind: 'frohlich-kennelly', initialRelativePermeability: 0.5, saturationPolarisation: 1 },
  { kind: 'brauer', k1: 1, k2: 1, k3: 1e7 },
  { kind: 'table', fluxDensity: [0.1, 0.2], fieldStrength: [1, 2] },
  { kind: 'table', fluxDensity: [0.3, 0.2, 0.5], fieldStrength: [1, 2, 3] },
  { kind: 'table', fluxDensity: [0.1, 0.2, Number.NaN], fieldStrength: [1, 2, 3] },
  { kind: 'ferrite' } as unknown as MaterialSpec,
];

/** Run `fn`, return the error it throws (undefined if none) and how long it took. */
function timed(fn: () => unknown): { error: unknown; ms: number; threw: boolean } {
  const start = performance.now();
  try {
    fn();
    return { error: undefined, ms: performance.now() - start, threw: false };
  } catch (error) {
    return { error, ms: performance.now() - start, threw: true };
  }
}

describe('random invalid networks (property tests): always a typed error, quickly', () => {
  it('a structural fault gives its TopologyError, naming the element', () => {
    fc.assert(
      fc.property(networkPlanArb, fc.nat(TOPOLOGY.length - 1), (plan, k) => {
        const b = buildNetwork(plan);
        const breakage = TOPOLOGY[k]!;
        const named = breakage.apply(b);
        const { error, ms, threw } = timed(() => simulate(b.net, { stopTime: b.stopTime, ...BUDGET }));
        expect(threw, breakage.name).toBe(true);
        expect(error).toBeInstanceOf(breakage.errorClass);
        expect((error as FluxstateError).code, breakage.name).toBe(breakage.code);
        expect((error as FluxstateError).elements).toContain(named);
        expect(ms).toBeLessThan(TIME_LIMIT_MS);
      }),
      runs(40),
    );
  });

  it('a bad number, waveform or material is refused at the builder call that gives it, naming the element', () => {
    fc.assert(
      fc.property(networkPlanArb, fc.nat(40), badNumber, fc.nat(badWaveforms.length - 1), fc.nat(badMaterials.length - 1), (plan, which, v, w, m) => {
        const b = buildNetwork(plan);
        const x = b.net.node('target');
        const cases: [string, () => unknown][] = [
          ['bad', () => badCall(b, which, v)],
          ['bad source', () => b.net.voltageSource('bad source', x, b.net.ground, badWaveforms[w]!)],
          ['bad source', () => b.net.currentSource('bad source', x, b.net.ground, badWaveforms[w]!)],
          ['bad tube', () => b.net.fluxTube('bad tube', { from: b.magneticNodes[0]!, to: b.magneticNodes[1]!, length: 0.1, area: 1e-4, material: badMaterials[m]! })],
        ];
        const [named, call] = cases[which % cases.length]!;
        const { error, ms, threw } = timed(call);
        expect(threw).toBe(true);
        expect(error).toBeInstanceOf(InputError);
        expect((error as InputError).code).toMatch(/^[a-z]+(-[a-z0-9]+)*$/);
        expect((error as InputError).elements).toContain(named);
        expect(ms).toBeLessThan(TIME_LIMIT_MS);
      }),
      runs(40),
    );
  });

  it('a corrupted plain-data description is refused with a FluxstateError, or simulates to a documented status', () => {
    const junk = fc.constantFrom<unknown>(null, -1, 0, 1e308, -1e308, 'x', [], {}, true, 7, 2.5, 'ground', { kind: 'sine' });
    fc.assert(
      fc.property(networkPlanArb, fc.nat(1000), fc.nat(1000), junk, (plan, pickEntry, pickField, value) => {
        const description = JSON.parse(JSON.stringify(buildNetwork(plan).net.describe())) as Record<string, unknown>;
        let expectedCode: string | undefined;
        // Pick a list, an entry of it and one of its fields (or the entry itself), and overwrite it with junk.
        const lists = ['electricNodes', 'magneticNodes', 'tubes', 'elements'] as const;
        const list = description[lists[pickEntry % lists.length]!] as Record<string, unknown>[];
        const entry = list[pickField % Math.max(1, list.length)];
        if (entry === undefined) {
          description[lists[pickEntry % lists.length]!] = value;
        } else {
          const fields = Object.keys(entry);
          const field = fields[pickField % fields.length]!;
          const inner = entry[field];
          if (inner !== null && typeof inner === 'object' && !Array.isArray(inner) && pickEntry % 2 === 0) {
            const innerFields = Object.keys(inner);
            (inner as Record<string, unknown>)[innerFields[pickField % innerFields.length]!] = value;
          } else {
            entry[field] = value;
            // An index field that no longer points into its list is a fault only plain data can have.
            const target = ({ from: 'magneticNodes', to: 'magneticNodes', plus: 'electricNodes', minus: 'electricNodes', tube: 'tubes' } as Record<string, string>)[field];
            const length = target ? (description[target] as unknown[]).length : 0;
            if (target && !(typeof value === 'number' && Number.isInteger(value) && value >= 0 && value < length)) expectedCode = 'bad-description';
          }
        }
        const { error, ms, threw } = timed(() => {
          const checked = validateDescription(description as unknown as NetworkDescription);
          const r = simulate(checked, { stopTime: 1e-3, ...BUDGET });
          // A run keeps its start unless it failed there (no consistent or finite initial state, e.g. a
          // capacitor's initial voltage of 1e308 V overflows the initial Newton update): then there is
          // no valid sample, and the failure says so with a NaN last valid time.
          if (r.time.length === 0) {
            expect(r.status).not.toBe('success');
            expect(r.failure?.time).toBeNaN();
          }
        });
        if (expectedCode) expect((error as FluxstateError | undefined)?.code).toBe(expectedCode);
        if (threw) {
          expect(error, String(error)).toBeInstanceOf(FluxstateError);
          expect((error as FluxstateError).message).not.toMatch(/\n/);
        }
        expect(ms).toBeLessThan(TIME_LIMIT_MS);
      }),
      runs(60),
    );
  });
});
