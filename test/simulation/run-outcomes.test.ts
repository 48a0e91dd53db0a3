/**
 * Run-level outcomes (issue 15): sampling times sorted and de-duplicated,
 * never truncating; typed statuses instead of exceptions or `success` over
 * NaN; breakpoints found one edge at a time, so any period against any
 * horizon runs in bounded memory or stops at its budget.
 */
import { describe, expect, it } from 'vitest';
import {
  bipolarSquare,
  constant,
  createNetwork,
  createStepper,
  MU0,
  periodicSteadyState,
  pulse,
  simulate,
  sine,
  userFunction,
  type WaveformSpec,
} from '../../src/index.js';

// A winding on a linear core in series with a resistor: an RL circuit with L = N^2 / R_m (magnetic
// circuit law; test values of our own). Time constant L / R = 5.0 ms.
const N = 100;
const AREA = 1e-3;
const MUR = 2000;
const PATH = 0.3;
const L = (N * N) / (PATH / (MU0 * MUR * AREA));
const R = 2;

function rl(waveform: WaveformSpec) {
  const net = createNetwork('rl');
  const [top, bottom] = [net.magneticNode('top'), net.magneticNode('bottom')];
  const material = { kind: 'linear', relativePermeability: MUR } as const;
  const leg = net.fluxTube('leg', { from: bottom, to: top, length: PATH / 2, area: AREA, material });
  net.fluxTube('yoke', { from: top, to: bottom, length: PATH / 2, area: AREA, material });
  const a = net.node('a');
  const source = net.voltageSource('drive', a, net.ground, waveform);
  const coil = net.winding('coil', { tube: leg, turns: N, resistance: R, plus: a, minus: net.ground });
  return { net, leg, source, coil };
}

describe('sampling times', () => {
  it('a repeated exact sampling time is one sample and the run goes on to the stop time', () => {
    const { net, coil } = rl(constant(10));
    const r = simulate(net, { stopTime: 4e-3, sampling: { times: [0, 2e-3, 1e-3, 2e-3, 4e-3], exact: true } });
    expect(r.status).toBe('success');
    expect(Array.from(r.time)).toEqual([0, 1e-3, 2e-3, 4e-3]);
    // RL step response i = V/R (1 - exp(-t R / L)) (circuits textbook, first-order step response).
    const i = r.current(coil);
    expect(i[3]!).toBeCloseTo((10 / R) * (1 - Math.exp((-4e-3 * R) / L)), 6);
  });

  it('a sampling time outside the span is refused, not dropped', () => {
    const { net } = rl(constant(10));
    expect(() => simulate(net, { stopTime: 4e-3, sampling: { times: [0, 5e-3] } })).toThrow(expect.objectContaining({ code: 'bad-option' }));
  });
});

describe('typed statuses instead of exceptions', () => {
  it('periodicSteadyState returns the status of a first period that fails (was a ReferenceError)', () => {
    const { net } = rl(sine({ amplitude: 10, frequency: 50 }));
    const pss = periodicSteadyState(net, { period: 0.02, maxSteps: 3 });
    expect(pss.status).toBe('step-budget');
    expect(pss.iterations).toBe(0);
    expect(pss.result.status).toBe('step-budget');
  });

  it('a user function that fails exactly at a sampling instant gives rhs-error with the data before it', () => {
    const failAt = 1e-3;
    const fn = (t: number): number => {
      if (t === failAt) throw new Error('no value at 1 ms');
      return 10 * Math.sin(2 * Math.PI * 50 * t);
    };
    const { net, coil } = rl(userFunction({ fn, name: 'probe' }));
    const r = simulate(net, { stopTime: 2e-3, sampling: { times: [0, 0.5e-3, failAt, 2e-3] } });
    expect(r.status).toBe('rhs-error');
    expect(r.message).toMatch(/no value at 1 ms/);
    expect(r.time.length).toBeGreaterThanOrEqual(1);
    expect(r.time[r.time.length - 1]!).toBeLessThan(failAt);
    expect(r.current(coil).every(Number.isFinite)).toBe(true);
    expect(r.failure?.time).toBeLessThan(failAt);
  });

  it('a quantity that overflows ends the run as non-finite, naming the element and the time, keeping the data before', () => {
    // A runaway source v = exp(a t), a = 1000/s, on the winding: once the start transient has died out the
    // current is the forced response i = v / (R + a L) of the RL circuit (derived: substitute i = c exp(a t)
    // into v = R i + L di/dt), so the source's power v i = v^2 / (R + a L) overflows (above Number.MAX_VALUE)
    // at t = (ln(R + a L) + ln(MAX_VALUE)) / (2 a), long before the state itself does (about twice as late).
    const a = 1000;
    const { net, coil, source, leg } = rl(userFunction({ fn: (t) => Math.exp(a * t), name: 'runaway' }));
    const r = simulate(net, { stopTime: 0.6 });
    expect(r.status).toBe('non-finite');
    expect(r.failure?.nonFinite?.quantity).toBe('power');
    expect(r.failure?.nonFinite?.name).toBe('drive');
    const overflow = (Math.log(R + a * L) + Math.log(Number.MAX_VALUE)) / (2 * a);
    // The first recorded step past the overflow (steps are a few ms long here).
    expect(r.failure!.nonFinite!.time).toBeGreaterThanOrEqual(overflow);
    expect(r.failure!.nonFinite!.time).toBeLessThan(overflow + 0.01);
    expect(r.message).toMatch(/power of "drive" is Infinity at t = /);
    for (const series of [r.current(coil), r.power(coil), r.power(source), r.fluxDensity(leg)]) {
      expect(series.every(Number.isFinite)).toBe(true);
    }
    expect(r.time[r.time.length - 1]!).toBeLessThan(r.failure!.nonFinite!.time);
    expect(r.time[r.time.length - 1]!).toBeGreaterThan(overflow - 0.01);
  });
});

describe('breakpoints one edge at a time', () => {
  it('a pulse period of 1e-10 s against 1 s stops at its step budget (was a stack overflow)', () => {
    const { net } = rl(pulse({ high: 10, period: 1e-10, duty: 0.5 }));
    const r = simulate(net, { stopTime: 1, maxSteps: 400, sampling: { interval: 0.1 } });
    expect(r.status).toBe('step-budget');
  });

  it('a pulse period of 1e-300 s stops at its step budget (was a hang)', () => {
    const { net } = rl(pulse({ high: 10, period: 1e-300, duty: 0.5 }));
    const r = simulate(net, { stopTime: 1e-3, maxSteps: 400 });
    expect(r.status).toBe('step-budget');
  });

  it('a stepper with a 60 s horizon and a 50 kHz drive advances edge by edge (was a stack overflow at creation)', () => {
    const { net, coil } = rl(bipolarSquare({ amplitude: 10, period: 20e-6, deadTime: 1e-6 }));
    const stepper = createStepper(net, { horizon: 60, record: false });
    expect(stepper.advanceTo(1e-4)).toBe('running');
    expect(stepper.time).toBe(1e-4);
    // Five periods, four edges each: about 20 restarts, not 12 million edges up front.
    expect(stepper.stats.acceptedSteps).toBeLessThan(2000);
    expect(Number.isFinite(stepper.current(coil))).toBe(true);
  });
});
