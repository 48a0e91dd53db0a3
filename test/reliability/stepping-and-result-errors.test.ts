import { describe, it } from 'vitest';
import { constant, createNetwork, createStepper, InputError, resultCoreLoss, simulate } from '../../src/index.js';
import { parseSweepJob } from '../../src/sweep/index.js';
import { angleJob } from '../sweep/rl-network.js';
import { expectError } from './expect-error.js';

// Catalogue entries of docs/errors.md raised by the stepping interface, results and sweep jobs.
function rl() {
  const net = createNetwork('rl');
  const m1 = net.magneticNode('m1');
  const m2 = net.magneticNode('m2');
  const material = { kind: 'linear', relativePermeability: 1000 } as const;
  const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.1, area: 1e-4, material });
  net.fluxTube('yoke', { from: m2, to: m1, length: 0.1, area: 1e-4, material });
  const leak = net.reluctance('leak', { from: m1, to: m2, reluctance: 1e8 });
  const a = net.node('a');
  const supply = net.voltageSource('supply', a, net.ground, constant(1));
  net.winding('coil', { tube: leg, turns: 10, resistance: 1, plus: a, minus: net.ground });
  return { net, leg, leak, supply };
}

describe('errors of the stepping interface, results and sweep jobs', () => {
  it("'bad-set-point': a non-finite set-point names the source", () => {
    const { net, supply } = rl();
    const s = createStepper(net, { horizon: 1 });
    expectError(() => s.setSource(supply, Number.NaN), { errorClass: InputError, code: 'bad-set-point', elements: ['supply'], message: [/supply/, /not finite/] });
  });

  it("'no-history': result() of a stepper created with record: false", () => {
    const { net } = rl();
    const s = createStepper(net, { horizon: 1, record: false });
    s.advanceTo(1e-3);
    expectError(() => s.result(), { errorClass: InputError, code: 'no-history', elements: [], message: [/record: true/] });
  });

  it("'reentrant-advance': advanceTo from a controller callback", () => {
    const { net } = rl();
    const s = createStepper(net, { horizon: 1 });
    s.every(1e-3, (x) => { x.advanceTo(0.5); });
    expectError(() => s.advanceTo(0.01), { errorClass: InputError, code: 'reentrant-advance', elements: [], message: [/callback/] });
  });

  it("'outside-result': an evaluator read outside the simulated span", () => {
    const { net, leg } = rl();
    const r = simulate(net, { stopTime: 1e-3 });
    const at = r.evaluator({ quantity: 'flux', handle: leg });
    expectError(() => at(2e-3), { errorClass: InputError, code: 'outside-result', elements: [], message: [/outside the simulated span/] });
  });

  it("'no-volume': core loss of a reluctance, which has no volume", () => {
    const { net, leak } = rl();
    const r = simulate(net, { stopTime: 1e-3 });
    expectError(() => resultCoreLoss(r, { period: 1e-3, tubes: [{ tube: leak, coefficients: { k: 1, alpha: 1.5, beta: 2.5 } }] }), {
      errorClass: InputError, code: 'no-volume', elements: ['leak'], message: [/leak/, /length and area/],
    });
  });

  it("'sweep-bad-output': an output whose quantity does not fit its entry", () => {
    const job = angleJob([0], { outputs: [{ name: 'x', quantity: 'emf', of: { element: 'mains' }, metric: 'peak' }] });
    expectError(() => parseSweepJob(job), { errorClass: InputError, code: 'sweep-bad-output', elements: ['mains'], message: [/emf/, /mains/] });
  });
});
