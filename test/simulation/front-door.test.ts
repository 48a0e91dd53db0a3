/**
 * One front door: simulate, createStepper, periodicSteadyState and a sweep
 * case take a builder or a plain description through the same function,
 * which checks a description once by the builder's rules. Regression of
 * issue 11, defect 2: createStepper and periodicSteadyState ran a
 * description with a negative resistance or a negative length to the end
 * (a steady state "converged" with negative energy).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  createNetwork,
  createStepper,
  FluxstateError,
  periodicSteadyState,
  simulate,
  sine,
  type NetworkDescription,
} from '../../src/index.js';
import { runSweepCase, type SweepJob } from '../../src/sweep/index.js';
import { buildNetwork, networkPlanArb, runs } from '../reliability/random-network.js';

/** A winding on a linear core with a series resistor, fed by a 50 Hz sine (our own test values). */
function rlDescription(): NetworkDescription {
  const net = createNetwork('front door');
  const [top, bottom] = [net.magneticNode('top'), net.magneticNode('bottom')];
  const material = { kind: 'linear', relativePermeability: 2000 } as const;
  const leg = net.fluxTube('leg', { from: bottom, to: top, length: 0.2, area: 1e-3, material });
  net.fluxTube('yoke', { from: top, to: bottom, length: 0.1, area: 1e-3, material });
  const [a, b] = [net.node('a'), net.node('b')];
  net.voltageSource('mains', a, net.ground, sine({ amplitude: 100, frequency: 50 }));
  net.resistor('series', a, b, 2);
  net.winding('coil', { tube: leg, turns: 100, plus: b, minus: net.ground });
  return net.describe();
}

/** A one-case sweep job of a description. */
function job(network: NetworkDescription): SweepJob {
  return { network, simulate: { stopTime: 1e-3, maxSteps: 200 }, parameters: { axes: [], cases: [{}] }, outputs: [] };
}

/** The code every entry point gives for a description (undefined when it is accepted). */
async function codes(d: NetworkDescription): Promise<Record<string, string | undefined>> {
  const code = (fn: () => unknown): string | undefined => {
    try {
      fn();
      return undefined;
    } catch (e) {
      expect(e, String(e)).toBeInstanceOf(FluxstateError);
      return (e as FluxstateError).code;
    }
  };
  const sweep = await runSweepCase(job(d), 0);
  return {
    simulate: code(() => simulate(d, { stopTime: 1e-3, maxSteps: 200 })),
    createStepper: code(() => createStepper(d, { horizon: 1e-3, maxSteps: 200 })),
    periodicSteadyState: code(() => periodicSteadyState(d, { period: 1e-3, maxSteps: 200, maxIterations: 1 })),
    sweep: sweep.status === 'error' ? sweep.error?.code : undefined,
  };
}

describe('one front door for every entry point', () => {
  it('a negative resistance in a plain description is refused by every entry point (issue 11, defect 2)', async () => {
    const d = JSON.parse(JSON.stringify(rlDescription())) as { elements: { name: string; resistance?: number }[] };
    d.elements.find((e) => e.name === 'series')!.resistance = -2;
    const all = await codes(d as unknown as NetworkDescription);
    expect(all).toEqual({ simulate: 'non-positive-value', createStepper: 'non-positive-value', periodicSteadyState: 'non-positive-value', sweep: 'non-positive-value' });
    expect(() => createStepper(d as unknown as NetworkDescription, { horizon: 1e-3 })).toThrow(/series/);
  });

  it('a negative length in a plain description is refused by every entry point (issue 11, defect 2)', async () => {
    const d = JSON.parse(JSON.stringify(rlDescription())) as { tubes: { name: string; law: { length: number } }[] };
    d.tubes.find((t) => t.name === 'yoke')!.law.length = -0.1;
    const all = await codes(d as unknown as NetworkDescription);
    expect(new Set(Object.values(all)).size).toBe(1);
    expect(all.simulate).toBe('non-positive-value');
    expect(() => periodicSteadyState(d as unknown as NetworkDescription, { period: 0.02 })).toThrow(/yoke/);
  });

  it('the untouched description is accepted by every entry point', async () => {
    expect(await codes(rlDescription())).toEqual({ simulate: undefined, createStepper: undefined, periodicSteadyState: undefined, sweep: undefined });
  });

  it('a description refused by simulate is refused by every entry point with the same code (property)', async () => {
    let refused = 0;
    const junk = fc.constantFrom<unknown>(null, -1, 0, -1e-9, 1e308, -1e308, 'x', [], {}, true, 2.5, Number.NaN);
    await fc.assert(
      fc.asyncProperty(networkPlanArb, fc.nat(1000), fc.nat(1000), junk, async (plan, pickEntry, pickField, value) => {
        // Overwrite one field of one tube or element of a random valid network's description with junk.
        const d = JSON.parse(JSON.stringify(buildNetwork(plan).net.describe())) as Record<string, Record<string, unknown>[]>;
        const list = d[pickEntry % 2 === 0 ? 'tubes' : 'elements']!;
        const entry = list[pickField % list.length]!;
        const fields = Object.keys(entry).filter((f) => f !== 'name' && f !== 'kind');
        const field = fields[pickEntry % fields.length]!;
        const inner = entry[field];
        if (inner !== null && typeof inner === 'object' && !Array.isArray(inner)) {
          const innerFields = Object.keys(inner).filter((f) => f !== 'kind');
          if (innerFields.length > 0) (inner as Record<string, unknown>)[innerFields[pickField % innerFields.length]!] = value;
        } else {
          entry[field] = value;
        }
        const description = d as unknown as NetworkDescription;
        const all = await codes(description);
        if (all.simulate === undefined) return; // accepted (the junk was a valid value there): nothing to compare
        refused++;
        expect(all, JSON.stringify({ field, value })).toEqual({ simulate: all.simulate, createStepper: all.simulate, periodicSteadyState: all.simulate, sweep: all.simulate });
      }),
      runs(30),
    );
    expect(refused).toBeGreaterThan(5); // the property compared real refusals
  });
});
