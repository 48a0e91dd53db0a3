/**
 * Threshold crossings of the stepper at input changes (issue 12): a watched
 * quantity that jumps across the level when an input changes (a scheduled
 * switch edge, a set-point from the stepper, a change made by a controller)
 * counts as a crossing with the direction of the jump; a crossing located
 * with the value exactly on the level reports the direction it came from.
 *
 * The circuits are resistive, so every quantity follows the inputs at once
 * (Ohm's law): the expected crossings are known exactly. Test values of our own.
 */
import { describe, expect, it } from 'vitest';
import { constant, createNetwork, createStepper, InputError, piecewiseLinear, type Threshold } from '../../src/index.js';

const R = 5;

/** A 10 V source through a switch into a 5 ohm load: the load current is 0 A (open) or 2 A (closed). */
function switchedLoad(schedule: readonly { time: number; closed: boolean }[]) {
  const net = createNetwork('switched load');
  const [a, b] = [net.node('a'), net.node('b')];
  const supply = net.voltageSource('supply', a, net.ground, constant(10));
  const sw = net.switch('switch', a, b, { closed: false, onResistance: 1e-6, offResistance: 1e9, schedule });
  const load = net.resistor('load', b, net.ground, R);
  return { net, supply, sw, load };
}

type Crossing = { name: string; time: number; rising: boolean };

function watcher(name: string, load: ReturnType<typeof switchedLoad>['load'], level: number, seen: Crossing[], direction?: Threshold['direction']): Threshold {
  return {
    name, watch: { quantity: 'current', handle: load }, level,
    ...(direction ? { direction } : {}),
    onCross: (_s, c) => { seen.push({ ...c }); },
  };
}

describe('stepper threshold crossings at input changes', () => {
  it('a jump across the level at a scheduled switch edge is a crossing, rising at closing and falling at opening', () => {
    const { net, load } = switchedLoad([{ time: 1e-3, closed: true }, { time: 2e-3, closed: false }]);
    const seen: Crossing[] = [];
    const stepper = createStepper(net, { horizon: 3e-3, thresholds: [watcher('1 A', load, 1, seen)] });
    stepper.advanceTo(3e-3);
    expect(seen.map((c) => c.rising)).toEqual([true, false]);
    expect(seen[0]!.time).toBe(1e-3);
    expect(seen[1]!.time).toBe(2e-3);
  });

  it('the callback of a jump crossing sees the stepper at the jump, after it', () => {
    const { net, load } = switchedLoad([{ time: 1e-3, closed: true }]);
    const at: { time: number; current: number }[] = [];
    const stepper = createStepper(net, {
      horizon: 3e-3,
      thresholds: [{ name: '1 A', watch: { quantity: 'current', handle: load }, level: 1, onCross: (s) => { at.push({ time: s.time, current: s.current(load) }); } }],
    });
    stepper.advanceTo(3e-3);
    expect(at).toHaveLength(1);
    expect(at[0]!.time).toBe(1e-3);
    // Ohm's law: 10 V over 5 ohm plus the 1e-6 ohm switch.
    expect(at[0]!.current).toBeCloseTo(10 / (R + 1e-6), 9);
  });

  it('direction filters apply to jumps: a rising threshold ignores the opening, a falling one the closing', () => {
    const { net, load } = switchedLoad([{ time: 1e-3, closed: true }, { time: 2e-3, closed: false }]);
    const rising: Crossing[] = [];
    const falling: Crossing[] = [];
    const stepper = createStepper(net, {
      horizon: 3e-3,
      thresholds: [watcher('up', load, 1, rising, 'rising'), watcher('down', load, 1, falling, 'falling')],
    });
    stepper.advanceTo(3e-3);
    expect(rising.map((c) => [c.time, c.rising])).toEqual([[1e-3, true]]);
    expect(falling.map((c) => [c.time, c.rising])).toEqual([[2e-3, false]]);
  });

  it('a set-point changed from the stepper between advances is a crossing at that instant', () => {
    const { net, supply, load } = switchedLoad([{ time: 0, closed: true }]);
    const seen: Crossing[] = [];
    const stepper = createStepper(net, { horizon: 3e-3, thresholds: [watcher('1 A', load, 1, seen)] });
    stepper.advanceTo(1e-3);
    expect(seen).toHaveLength(0);
    stepper.setSource(supply, 2); // 0.4 A: falls across 1 A
    stepper.advanceTo(2e-3);
    stepper.setSource(supply, 20); // 4 A: rises across 1 A
    stepper.advanceTo(3e-3);
    expect(seen.map((c) => [c.time, c.rising])).toEqual([[1e-3, false], [2e-3, true]]);
  });

  it('a change made by a controller or by another threshold callback is a crossing too', () => {
    const { net, supply, load } = switchedLoad([{ time: 0, closed: true }]);
    const seen: Crossing[] = [];
    const stepper = createStepper(net, {
      horizon: 3e-3,
      thresholds: [
        watcher('1 A', load, 1, seen),
        // Reacting to the 1 A crossing by halving the supply drops the current across 1.5 A.
        { name: 'react', watch: { quantity: 'current', handle: load }, level: 3, direction: 'rising', onCross: (s) => { s.setSource(supply, 5); } },
        watcher('1.5 A', load, 1.5, seen, 'falling'),
      ],
    });
    stepper.every(1e-3, (s) => { s.setSource(supply, 20); }, 1e-3); // 4 A at 1 ms
    stepper.advanceTo(1.5e-3);
    // At 1 ms: the controller's 4 A crosses 3 A (react), whose 5 V (1 A) then crosses 1.5 A falling;
    // the 1 A threshold sees 2 -> 4 (no crossing) then 4 -> 1 (on the level from above: falling).
    const names = seen.map((c) => [c.name, c.time, c.rising]);
    expect(names).toContainEqual(['1.5 A', 1e-3, false]);
    expect(names).toContainEqual(['1 A', 1e-3, false]);
    expect(seen).toHaveLength(2);
  });

  it('a crossing found with the value exactly on the level reports the direction it came from', () => {
    // A current source following a straight line 1 A -> 0 A over 1 ms: regula falsi on a straight line
    // lands on the root, so the located crossing has the value exactly on the 0.5 A level, coming from above.
    const net = createNetwork('table');
    const a = net.node('a');
    const source = net.currentSource('ramp', a, net.ground, piecewiseLinear({ times: [0, 1e-3, 2e-3], values: [1, 0, -1] }));
    net.resistor('load', a, net.ground, R);
    const seen: (Crossing & { value: number })[] = [];
    const stepper = createStepper(net, {
      horizon: 3e-3,
      thresholds: [{ name: 'half', watch: { quantity: 'current', handle: source }, level: 0.5, onCross: (s, c) => { seen.push({ ...c, value: s.current(source) }); } }],
    });
    stepper.advanceTo(3e-3);
    expect(seen).toHaveLength(1);
    expect(seen[0]!.value).toBe(0.5); // the case under test: the value sits on the level
    expect(seen[0]!.time).toBeCloseTo(0.5e-3, 15);
    expect(seen[0]!.rising).toBe(false);
  });

  it('the same, rising through the level', () => {
    const net = createNetwork('table');
    const a = net.node('a');
    const source = net.currentSource('ramp', a, net.ground, piecewiseLinear({ times: [0, 1e-3, 2e-3], values: [-1, 0, 1] }));
    net.resistor('load', a, net.ground, R);
    const seen: (Crossing & { value: number })[] = [];
    const stepper = createStepper(net, {
      horizon: 3e-3,
      thresholds: [{ name: 'half', watch: { quantity: 'current', handle: source }, level: 0.5, onCross: (s, c) => { seen.push({ ...c, value: s.current(source) }); } }],
    });
    stepper.advanceTo(3e-3);
    expect(seen.map((c) => [c.value, c.rising])).toEqual([[0.5, true]]);
    expect(seen[0]!.time).toBeCloseTo(1.5e-3, 15);
  });

  it('callbacks that keep flipping an input at one instant end with an error naming the thresholds', () => {
    const { net, supply, load } = switchedLoad([{ time: 0, closed: true }]);
    let high = false;
    const flip = (s: Parameters<Threshold['onCross']>[0]) => { high = !high; s.setSource(supply, high ? 10 : 2); };
    const stepper = createStepper(net, {
      horizon: 3e-3,
      thresholds: [{ name: 'flip', watch: { quantity: 'current', handle: load }, level: 1, onCross: flip }],
    });
    stepper.setSource(supply, 2); // 2 A -> 0.4 A: the callback answers 10 V (2 A), and so on
    let error: unknown;
    try {
      stepper.advanceTo(1e-3);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(InputError);
    expect((error as InputError).code).toBe('threshold-chatter');
    expect((error as InputError).message).toMatch(/"flip"/);
  });
});
