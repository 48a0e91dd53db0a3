/**
 * Breakpoints closer than round-off of the time (a pulse edge of 1e-18 s at
 * t = 1 ms, or of 1e-60 s at t = 0) are merged: the interval between them
 * could not be integrated (before the merge simulate stopped with
 * 'step-size-underflow' or 'singular-matrix'), and the input change across it
 * is a jump at double precision. The reference is the same run with an ideal
 * jump (rise = 0): DERIVED, the ramp differs from the jump by at most
 * V x (rise time) volt-seconds.
 */
import { describe, expect, it } from 'vitest';
import { createNetwork, demoMaterials, pulse, simulate } from '../../src/index.js';
import { NetworkInputs, BREAKPOINT_MERGE, openInterval } from '../../src/formulation/network-inputs.js';
import { maxRelativeDeviation } from '../helpers/conservation.js';

function pulsed(edge: number) {
  const net = createNetwork('fast edges');
  const m1 = net.magneticNode('m1');
  const m2 = net.magneticNode('m2');
  const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.1, area: 1e-4, material: demoMaterials.ferrite });
  net.fluxTube('yoke', { from: m2, to: m1, length: 0.1, area: 1e-4, material: demoMaterials.ferrite });
  const a = net.node('a');
  net.voltageSource('drive', a, net.ground, pulse({ low: -1, high: 1, period: 1e-3, duty: 0.5, rise: edge, fall: edge }));
  const coil = net.winding('coil', { tube: leg, turns: 50, resistance: 1, plus: a, minus: net.ground });
  return { net, leg, coil };
}

describe('NetworkInputs.breakpoints: edges closer than round-off count as one jump', () => {
  it('keeps edges that are integrable apart and merges the rest, the kept ones more than the merge gap apart', () => {
    const inputs = new NetworkInputs(pulsed(1e-18).net.describe());
    const kept = inputs.breakpoints(0, 2e-3);
    // Near t = 0 the round-off of t is tiny, so the edge [0, 1e-18] stays; later edges of 1e-18 s merge.
    expect(kept).toEqual([1e-18, 5e-4, 1e-3, 1.5e-3]);
    for (let k = 1; k < kept.length; k++) expect(kept[k]! - kept[k - 1]!).toBeGreaterThan(BREAKPOINT_MERGE * kept[k]!);
    const wide = new NetworkInputs(pulsed(1e-9).net.describe()).breakpoints(0, 2e-3);
    expect(wide).toEqual([1e-9, 5e-4, 5e-4 + 1e-9, 1e-3, 1e-3 + 1e-9, 1.5e-3, 1.5e-3 + 1e-9]);
  });

  it('gives an interval that starts at a merged edge the value after the whole edge', () => {
    const inputs = new NetworkInputs(pulsed(1e-60).net.describe());
    const first = openInterval(inputs.schedule, 0, 2e-3, 2e-3);
    expect(first.end).toBe(5e-4); // the ramp of 1e-60 s is merged into t = 0
    // At t = 0 the ramp of 1e-60 s has just begun: the right limit after the merged edge is the high level.
    expect(first.sourceValue(0, 0)).toBe(1);
    expect(first.sourceValue(0, 5e-4)).toBe(1); // left limit at the falling edge
    const second = openInterval(inputs.schedule, first.end, 2e-3, 2e-3);
    expect(second.sourceValue(0, 5e-4)).toBe(-1); // right limit after the falling edge
    expect(second.end).toBe(1e-3);
  });

  it('lets simulate run through edges of 1e-18 s and 1e-60 s like through ideal jumps', () => {
    const ideal = pulsed(0);
    const reference = simulate(ideal.net, { stopTime: 2e-3, rtol: 1e-9, sampling: { interval: 1e-4, exact: true } });
    expect(reference.status).toBe('success');
    for (const edge of [1e-18, 1e-60]) {
      const m = pulsed(edge);
      const r = simulate(m.net, { stopTime: 2e-3, rtol: 1e-9, sampling: { interval: 1e-4, exact: true } });
      expect(r.status).toBe('success');
      expect(maxRelativeDeviation(r.flux(m.leg), reference.flux(ideal.leg))).toBeLessThan(1e-5);
    }
  });
});

// An interval's inputs return a source value held over the interval without searching the waveform
// (InputSchedule.heldSources); the values must be those of the waveform's own definition at every
// time: a pulse is low before its delay, rises linearly over `rise`, holds `high`, falls over
// `fall` (the trapezoidal pulse of its spec; common practice).
describe('InputsInForce.sourceValue: held values equal the waveform everywhere in the interval', () => {
  const definition = (t: number, low: number, high: number, period: number, duty: number, rise: number, fall: number): number => {
    const s = t - Math.floor(t / period) * period;
    if (s < rise) return low + ((high - low) * s) / rise;
    if (s < duty * period) return high;
    if (s < duty * period + fall) return high - ((high - low) * (s - duty * period)) / fall;
    return low;
  };
  for (const edge of [0, 1e-5]) {
    it(`on a pulse with edges of ${edge} s (flat parts held, ramps evaluated)`, () => {
      const inputs = new NetworkInputs(pulsed(edge).net.describe());
      let t = 0;
      let intervals = 0;
      while (t < 2e-3) {
        const iv = openInterval(inputs.schedule, t, 2e-3, 2e-3);
        intervals++;
        for (const f of [0.001, 0.25, 0.5, 0.999]) {
          const ts = iv.start + f * (iv.end - iv.start);
          const expected = edge === 0 ? (ts % 1e-3 < 5e-4 ? 1 : -1) : definition(ts, -1, 1, 1e-3, 0.5, edge, edge);
          expect(Math.abs(iv.sourceValue(0, ts) - expected)).toBeLessThanOrEqual(1e-9);
          expect(iv.sourceValue(0, ts)).toBe(inputs.schedule.sourceValueAt(0, ts));
        }
        t = iv.end;
      }
      expect(intervals).toBe(edge === 0 ? 4 : 8);
    });
  }
});
