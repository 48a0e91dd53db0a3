/**
 * A tiny scenario per error code that raises it through the public API: the
 * error-catalogue test calls each one and checks that the code it documents
 * is the code thrown (not merely that some test file mentions it). Codes that
 * have no scenario here yet are listed in UNTRIGGERED: the catalogue test
 * fails when a documented code is in neither (so a new code needs a
 * scenario) and when a code in UNTRIGGERED gains one (so the list only
 * shrinks).
 */
import {
  constant,
  createNetwork,
  createStepper,
  pulse,
  simulate,
  sine,
  solveDae,
  validateDescription,
  type DaeProblem,
  type MaterialSpec,
  type NetworkDescription,
  type WaveformSpec,
} from '../../src/index.js';
import { applySweepEdits, mergeSweepResults, parseSweepJob, sweepCase, sweepResultFromJson } from '../../src/sweep/index.js';
import { angleJob } from '../sweep/rl-network.js';

const material = { kind: 'linear', relativePermeability: 1000 } as const;

/** A closed two-tube core with one resistive winding fed by a sine source. */
function base(name = 'triggers') {
  const net = createNetwork(name);
  const m1 = net.magneticNode('m1');
  const m2 = net.magneticNode('m2');
  const leg = net.fluxTube('leg', { from: m1, to: m2, length: 0.1, area: 1e-4, material });
  const yoke = net.fluxTube('yoke', { from: m2, to: m1, length: 0.1, area: 1e-4, material });
  const a = net.node('a');
  const supply = net.voltageSource('supply', a, net.ground, sine({ amplitude: 1, frequency: 50 }));
  const coil = net.winding('coil', { tube: leg, turns: 50, resistance: 1, plus: a, minus: net.ground });
  return { net, m1, m2, leg, yoke, a, supply, coil };
}

const plain = (): NetworkDescription => JSON.parse(JSON.stringify(base().net.describe())) as NetworkDescription;
const ok: DaeProblem = { size: 1, y0: [1], t0: 0, tEnd: 1, rhs: (_t, y, out) => (out[0] = -y[0]!) };

/** Code -> a call that must throw a FluxstateError with that code. */
export const TRIGGERS: Readonly<Record<string, () => unknown>> = {
  'bad-name': () => base().net.node(''),
  'duplicate-name': () => base().net.node('a'),
  'threshold-chatter': () => {
    const { net, a, supply } = base();
    const load = net.resistor('load', a, net.ground, 1);
    let high = true;
    const stepper = createStepper(net, {
      horizon: 1e-3,
      thresholds: [{ name: 'flip', watch: { quantity: 'current', handle: load }, level: 0.5, onCross: (s) => { high = !high; s.setSource(supply, high ? 1 : 0); } }],
    });
    stepper.setSource(supply, 1); // 0 A -> 1 A crosses 0.5 A; each answer crosses it back
    return stepper.advanceTo(1e-3);
  },
  'not-reducible': () => {
    const { net, a } = base();
    net.diode('d', a, net.node('k'), { junction: 'exponential' }); // nonlinear on potentials without a derivative
    return simulate(net, { stopTime: 1e-3, formulation: 'reduced' });
  },
  'non-positive-value': () => {
    const { net, a } = base();
    return net.resistor('r', a, net.ground, 0);
  },
  'non-finite-value': () => {
    const { net, a } = base();
    return net.capacitor('c', a, net.ground, 1e-6, { initialVoltage: Number.NaN });
  },
  'bad-fringing-factor': () => {
    const { net, m1, m2 } = base();
    return net.airGap('gap', { from: m1, to: m2, length: 1e-3, area: 1e-4, fringingFactor: 0.8 });
  },
  'bad-orientation': () => {
    const { net, leg, a } = base();
    return net.winding('w2', { tube: leg, turns: 5, plus: a, minus: net.ground, orientation: 0 as unknown as 1 });
  },
  'bad-switch-resistance': () => {
    const { net, a } = base();
    return net.switch('s', a, net.ground, { onResistance: 10, offResistance: 1 });
  },
  'unsorted-schedule': () => {
    const { net, a } = base();
    return net.switch('s', a, net.ground, { schedule: [{ time: 2, closed: true }, { time: 1, closed: false }] });
  },
  'tube-self-loop': () => {
    const { net, m1 } = base();
    return net.fluxTube('loop', { from: m1, to: m1, length: 0.1, area: 1e-4, material });
  },
  'conflicting-initial-flux': () => {
    const { net, m1, m2 } = base();
    return net.fluxTube('limb', { from: m1, to: m2, length: 0.1, area: 1e-4, material, initialFlux: 1e-5, initialFluxDensity: 0.1 });
  },
  'missing-area': () => {
    const { net, m1, m2 } = base();
    return net.reluctance('leak', { from: m1, to: m2, reluctance: 1e7, initialFluxDensity: 0.2 });
  },
  'unknown-material-kind': () => {
    const { net, m1, m2 } = base();
    return net.fluxTube('limb', { from: m1, to: m2, length: 0.1, area: 1e-4, material: { kind: 'unobtainium' } as unknown as MaterialSpec });
  },
  'bad-saturation': () => {
    const { net, m1, m2 } = base();
    return net.fluxTube('limb', { from: m1, to: m2, length: 0.1, area: 1e-4, material: { kind: 'linear', relativePermeability: 10, saturationFluxDensity: -1 } });
  },
  'bad-polarisation': () => {
    const { net, m1, m2 } = base();
    return net.fluxTube('limb', { from: m1, to: m2, length: 0.1, area: 1e-4, material: { kind: 'frohlich-kennelly', initialRelativePermeability: 3000, saturationPolarisation: Number.NaN } });
  },
  'table-not-increasing': () => {
    const { net, m1, m2 } = base();
    return net.fluxTube('limb', { from: m1, to: m2, length: 0.1, area: 1e-4, material: { kind: 'table', name: 't', fluxDensity: [0.5, 0.4, 1.2], fieldStrength: [10, 20, 900] } });
  },
  'bad-waveform': () => {
    const { net, a } = base();
    return net.currentSource('drive', a, net.ground, pulse({ high: 1, period: 0, duty: 0.5 }) as WaveformSpec);
  },
  'empty-network': () => simulate(createNetwork('blank'), { stopTime: 1e-3 }),
  'bad-description': () => {
    const d = plain() as unknown as Record<string, unknown>;
    delete d.elements;
    return validateDescription(d as unknown as NetworkDescription);
  },
  'bad-time-span': () => simulate(base().net, { stopTime: -1 }),
  'steps-not-kept': () => simulate(base().net, { stopTime: 1e-3, sampling: { interval: 1e-4 }, keepSteps: false }).energy(),
  'bad-tolerance': () => simulate(base().net, { stopTime: 1e-3, rtol: 2 }),
  'no-area': () => {
    const { net, m1, m2 } = base();
    const leak = net.reluctance('leak', { from: m1, to: m2, reluctance: 1e8 });
    return simulate(net, { stopTime: 1e-4 }).fluxDensity(leak);
  },
  'no-length': () => {
    const { net, m1, m2 } = base();
    const leak = net.reluctance('leak', { from: m1, to: m2, reluctance: 1e8 });
    return simulate(net, { stopTime: 1e-4 }).fieldStrength(leak);
  },
  'bad-sample': () => {
    const r = simulate(base().net, { stopTime: 1e-4 });
    return r.state(r.length);
  },
  'foreign-handle': () => simulate(base().net, { stopTime: 1e-4 }).flux(base('other').leg),
  'wrong-handle-kind': () => simulate(base().net, { stopTime: 1e-4 }).current(base('other').a as never),
  'bad-problem': () => solveDae(null as unknown as DaeProblem),
  'bad-jacobian': () => solveDae({ ...ok, jacobian: 3 as never }),
  'bad-component': () => solveDae(ok).component(1),
  'outside-solution': () => solveDae(ok).at(2),
  'inconsistent-capacitor-voltages': () => {
    const { net, a } = base();
    net.capacitor('c1', a, net.ground, 1e-6, { initialVoltage: 1 });
    net.capacitor('c2', a, net.ground, 1e-6, { initialVoltage: 2 });
    return simulate(net, { stopTime: 1e-4 });
  },
  'voltage-source-loop': () => {
    const { net, a } = base();
    net.voltageSource('second', a, net.ground, constant(2));
    return simulate(net, { stopTime: 1e-4 });
  },
  'gate-with-schedule': () => {
    const { net, a } = base();
    return net.switch('Q1', a, net.ground, { gate: pulse({ high: 1, period: 1e-5, duty: 0.5 }), schedule: [{ time: 1e-3, closed: true }] });
  },
  'unknown-junction': () => {
    const { net, a } = base();
    return net.diode('D1', a, net.ground, { junction: 'zener' as 'ideal' });
  },
  'bad-diode-resistance': () => {
    const { net, a } = base();
    return net.diode('D1', a, net.ground, { onResistance: 1, offConductance: 2 });
  },
  // Carried as the failure's cause of a stopped run (numerical channel): thrown here to check its code.
  'no-freewheeling-path': () => {
    const net = createNetwork('cut inductor');
    const a = net.node('a');
    const b = net.node('b');
    net.voltageSource('V', a, net.ground, constant(12));
    net.switch('Q1', a, b, { gate: pulse({ high: 1, period: 1e-4, duty: 0.5 }) });
    net.inductor('L1', b, net.ground, 1e-4);
    throw simulate(net, { stopTime: 1e-4 }).failure?.cause;
  },
  'sweep-bad-job': () => parseSweepJob({ ...angleJob([0]), simulate: { stopTime: 'soon' } }),
  'sweep-unknown-target': () => parseSweepJob({ ...angleJob([0]), outputs: [{ quantity: 'current', of: { element: 'nobody' }, metric: 'peak' }] }),
  'sweep-unknown-field': () => applySweepEdits(angleJob([0]).network, [{ target: { element: 'coil', field: 'colour' }, value: 1 }]),
  'sweep-fixed-field': () => applySweepEdits(angleJob([0]).network, [{ target: { element: 'coil', field: 'name' }, value: 'x' }]),
  'sweep-bad-value': () => applySweepEdits(angleJob([0]).network, [{ target: { element: 'coil', field: 'resistance' }, value: 'low' }]),
  'sweep-bad-output': () => parseSweepJob({ ...angleJob([0]), outputs: [{ quantity: 'emf', of: { element: 'mains' }, metric: 'peak' }] }),
  'sweep-bad-option': () => sweepCase(angleJob([0, 1]), 7),
  'sweep-bad-result': () => sweepResultFromJson({ format: 'fluxstate-sweep-result/1' }),
  'sweep-bad-shards': () => mergeSweepResults([]),
};

/** Codes without a scenario in TRIGGERS yet (tested elsewhere through their listed test files; to be moved here). */
export const UNTRIGGERED: readonly string[] = [
  'no-consistent-device-states', 'not-gate-driven',
  'negative-value', 'shorted-element', 'unknown-leg', 'unused-magnetic-node', 'dangling-magnetic-node', 'winding-on-open-path',
  'floating-node', 'open-winding', 'open-terminal', 'current-source-cutset', 'cancelling-winding-loop', 'over-constrained-flux',
  'inconsistent-initial-flux', 'bad-option', 'outside-result', 'no-volume', 'bad-permeability', 'bad-parameter',
  'table-length-mismatch', 'table-too-short', 'table-not-finite', 'table-not-positive', 'bad-material-law', 'fit-bad-start',
  'unknown-fit-model', 'invalid-dimension', 'invalid-stacking-factor', 'radii-out-of-order', 'empty-sections', 'invalid-section',
  'gap-longer-than-leg', 'gap-longer-than-winding', 'gap-longer-than-inner-radius', 'gap-too-long-for-fringing',
  'invalid-fringing-factor', 'winding-taller-than-window', 'windings-exceed-window', 'invalid-option', 'bad-series', 'bad-window',
  'bad-loss-coefficients', 'bad-problem-size', 'bad-rhs', 'bad-initial-state', 'bad-mass-matrix', 'bad-breakpoint', 'bad-event',
  'bad-index2', 'bad-output-time', 'no-dense-output', 'bad-stop-time', 'outside-last-step', 'bad-snapshot', 'report-bad-text',
  'report-no-series', 'report-series-empty', 'report-series-length', 'report-time-not-finite', 'report-time-not-sorted',
  'report-too-many-units', 'report-bad-reference', 'report-bad-color', 'report-bad-option', 'report-bad-range', 'bad-set-point',
  'no-history', 'reentrant-advance', 'sweep-case-time-limit', 'sweep-not-transferable', 'sweep-bad-journal', 'sweep-worker-start',
  'unknown-name',
  // Codes that landed in parallel with this table (each is triggered in the test file docs/errors.md names);
  // scenarios here are owed.
  'bad-hysteresis-parameters', 'bad-hysteretic-reactor', 'bad-loop-data', 'bad-path', 'hysteretic-tube-needs-eddy',
  'no-operating-point', 'not-hysteretic', 'tube-with-memory', 'unknown-winding', 'worst-case-evaluation-failed',
];
