/**
 * One test per entry of docs/errors.md that no other test file triggers:
 * each is raised through the public API and checked for its class, its
 * stable code, the names in `elements`, and a message that names the
 * element (or option) and the fix. The contract is our own (docs/errors.md);
 * entries already covered elsewhere are listed there with their test file.
 */
import { describe, expect, it } from 'vitest';
import {
  constant,
  coreConstants,
  createDaeIntegrator,
  createNetwork,
  InputError,
  piecewiseLinear,
  pulse,
  bipolarSquare,
  simulate,
  sine,
  solveDae,
  steinmetzLossDensity,
  TopologyError,
  userFunction,
  validateDescription,
  type DaeProblem,
  type MaterialLaw,
  type SimulateOptions,
  type WaveformSpec,
  type MaterialSpec,
  type NetworkDescription,
} from '../../src/index.js';
import { renderSvgPlot } from '../../src/report/index.js';
import { expectError } from './expect-error.js';

const material = { kind: 'linear', relativePermeability: 1000 } as const;

/** A closed two-tube core with one resistive winding fed by a sine source. */
function base(name = 'entries') {
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

describe('builder entries', () => {
  it('bad-name: a node without a name', () => {
    const { net } = base();
    expectError(() => net.node(''), { errorClass: InputError, code: 'bad-name', elements: [], message: [/electric node needs a non-empty name/] });
    expectError(() => net.magneticNode('  '), { errorClass: InputError, code: 'bad-name', elements: [], message: [/magnetic node/] });
  });

  it('non-finite-value: a capacitor initial voltage of NaN', () => {
    const { net, a } = base();
    expectError(() => net.capacitor('snubber', a, net.ground, 1e-6, { initialVoltage: Number.NaN }), {
      errorClass: InputError, code: 'non-finite-value', elements: ['snubber'], message: [/capacitor "snubber" initial voltage is NaN/, /give a finite number in V/],
    });
    expectError(() => net.inductor('choke', a, net.ground, 1e-3, { initialCurrent: Infinity }), {
      errorClass: InputError, code: 'non-finite-value', elements: ['choke'], message: [/inductor "choke" initial current is Infinity/],
    });
  });

  it('bad-fringing-factor: an air gap with fringing factor below 1', () => {
    const { net, m1, m2 } = base();
    expectError(() => net.airGap('gap', { from: m1, to: m2, length: 1e-3, area: 1e-4, fringingFactor: 0.8 }), {
      errorClass: InputError, code: 'bad-fringing-factor', elements: ['gap'], message: [/air gap "gap" fringing factor 0.8 is below 1/, /use 1 for none/],
    });
  });

  it('bad-orientation: a winding orientation other than +1 or -1', () => {
    const { net, leg, a } = base();
    expectError(() => net.winding('w2', { tube: leg, turns: 5, plus: a, minus: net.ground, orientation: 0 as unknown as 1 }), {
      errorClass: InputError, code: 'bad-orientation', elements: ['w2'], message: [/winding "w2" orientation 0 must be \+1 or -1/],
    });
  });

  it('conflicting-initial-flux: both initialFlux and initialFluxDensity', () => {
    const { net, m1, m2 } = base();
    expectError(() => net.fluxTube('limb', { from: m1, to: m2, length: 0.1, area: 1e-4, material, initialFlux: 1e-5, initialFluxDensity: 0.1 }), {
      errorClass: InputError, code: 'conflicting-initial-flux', elements: ['limb'], message: [/tube "limb"/, /give one/],
    });
  });

  it('missing-area: an initial flux density on a reluctance without area', () => {
    const { net, m1, m2 } = base();
    expectError(() => net.reluctance('leak', { from: m1, to: m2, reluctance: 1e7, initialFluxDensity: 0.2 }), {
      errorClass: InputError, code: 'missing-area', elements: ['leak'], message: [/tube "leak"/, /give the reluctance an area or use initialFlux/],
    });
  });

  it('unknown-material-kind: a tube whose material kind is not known names the tube', () => {
    const { net, m1, m2 } = base();
    expectError(() => net.fluxTube('limb', { from: m1, to: m2, length: 0.1, area: 1e-4, material: { kind: 'unobtainium' } as unknown as MaterialSpec }), {
      errorClass: InputError, code: 'unknown-material-kind', elements: ['limb', 'unobtainium'], message: [/tube "limb"/, /use 'linear', 'frohlich-kennelly', 'brauer' or 'table'/],
    });
    expectError(() => net.fluxTube('limb', { from: m1, to: m2, length: 0.1, area: 1e-4, material: undefined as unknown as MaterialSpec }), {
      errorClass: InputError, code: 'unknown-material-kind', elements: ['limb'], message: [/is not a material/],
    });
  });

  it('material errors keep their code and name the tube too (bad tables)', () => {
    const { net, m1, m2 } = base();
    expectError(
      () => net.fluxTube('limb', { from: m1, to: m2, length: 0.1, area: 1e-4, material: { kind: 'table', name: 'lab sample', fluxDensity: [0.5, 0.4, 1.2], fieldStrength: [10, 20, 900] } }),
      { errorClass: InputError, code: 'table-not-increasing', elements: ['limb', 'lab sample'], message: [/tube "limb"/, /material "lab sample"/, /row 1/, /increase strictly/] },
    );
    expectError(
      () => net.fluxTube('limb', { from: m1, to: m2, length: 0.1, area: 1e-4, material: { kind: 'frohlich-kennelly', initialRelativePermeability: 3000, saturationPolarisation: Number.NaN } }),
      { errorClass: InputError, code: 'bad-polarisation', elements: ['limb'], message: [/tube "limb"/, /saturation polarisation NaN T must be a positive finite number/] },
    );
  });

  it('bad-saturation: a linear material with a negative saturation flux density (checked like the other laws)', () => {
    const { net, m1, m2 } = base();
    expectError(() => net.fluxTube('limb', { from: m1, to: m2, length: 0.1, area: 1e-4, material: { kind: 'linear', relativePermeability: 10, saturationFluxDensity: -1 } }), {
      errorClass: InputError, code: 'bad-saturation', elements: ['limb', 'linear mu_r=10'], message: [/tube "limb"/, /saturation flux density -1 T is not a positive finite number; give B_sat > 0 in T or leave it out/],
    });
  });

  it('bad-material-law: a live law whose fieldSlope is not the slope of fieldStrength', () => {
    const { net, m1, m2 } = base();
    // H = 800 B, but the slope is given as 8000: the solver's Jacobian would be wrong.
    const law: MaterialLaw = { name: 'hand-written', fieldStrength: (b) => 800 * b, fieldSlope: () => 8000, energyDensity: (b) => 400 * b * b };
    expectError(() => net.fluxTube('limb', { from: m1, to: m2, length: 0.1, area: 1e-4, material: law }), {
      errorClass: InputError, code: 'bad-material-law', elements: ['limb', 'hand-written'], message: [/tube "limb"/, /fieldSlope\(0.0517\) = 8000 but the slope of fieldStrength there is 800/, /fieldSlope = dH\/dB > 0/],
    });
    const nanAbove: MaterialLaw = { name: 'nan above 1 T', fieldStrength: (b) => (Math.abs(b) > 1 ? NaN : 800 * b), fieldSlope: () => 800, energyDensity: (b) => 400 * b * b };
    expectError(() => net.fluxTube('limb', { from: m1, to: m2, length: 0.1, area: 1e-4, material: nanAbove }), {
      errorClass: InputError, code: 'bad-material-law', elements: ['limb'], message: [/fieldStrength\(1.4243\) returned NaN/],
    });
    const wrongEnergy: MaterialLaw = { name: 'energy off', fieldStrength: (b) => 800 * b, fieldSlope: () => 800, energyDensity: (b) => 800 * b * b };
    expectError(() => net.fluxTube('limb', { from: m1, to: m2, length: 0.1, area: 1e-4, material: wrongEnergy }), {
      errorClass: InputError, code: 'bad-material-law', elements: ['limb'], message: [/slope of energyDensity/],
    });
  });
});

describe('topology entries', () => {
  it('open-terminal: an inductor with a terminal connected to nothing else', () => {
    const { net } = base();
    const x = net.node('x');
    net.inductor('choke', x, net.ground, 1e-3);
    expectError(() => simulate(net, { stopTime: 1e-3 }), {
      errorClass: TopologyError, code: 'open-terminal', elements: ['choke', 'x'], message: [/inductor "choke" has its terminal node "x"/, /large resistor/],
    });
  });

  it('open-terminal: a current source with a terminal connected to nothing else', () => {
    const { net } = base();
    const x = net.node('x');
    net.currentSource('bias', x, net.ground, constant(1));
    expectError(() => simulate(net, { stopTime: 1e-3 }), {
      errorClass: TopologyError, code: 'open-terminal', elements: ['bias', 'x'], message: [/current source "bias"/],
    });
  });

  it('empty-network: nothing but ground', () => {
    expectError(() => simulate(createNetwork('blank'), { stopTime: 1e-3 }), {
      errorClass: TopologyError, code: 'empty-network', elements: ['blank'], message: [/network "blank"/, /add nodes and elements/],
    });
  });
});

describe('description entries (validateDescription)', () => {
  const plain = (): NetworkDescription => JSON.parse(JSON.stringify(base().net.describe())) as NetworkDescription;

  it('returns an equal frozen copy of a valid description', () => {
    const d = plain();
    const v = validateDescription(d);
    expect(v).toEqual(d);
    expect(Object.isFrozen(v.tubes[0]!.law)).toBe(true);
    expect(simulate(v, { stopTime: 1e-3 }).status).toBe('success');
  });

  it('bad-description: an index out of range, an unknown kind, a missing list', () => {
    const d1 = plain() as unknown as { tubes: { to: number }[] };
    d1.tubes[0]!.to = 7;
    expectError(() => validateDescription(d1 as unknown as NetworkDescription), {
      errorClass: InputError, code: 'bad-description', elements: ['leg'], message: [/"leg" field "to" = 7 is not the index of a magnetic node \(0\.\.1\)/],
    });
    const d2 = plain() as unknown as { elements: { kind: string }[] };
    d2.elements[1]!.kind = 'thyristor';
    expectError(() => validateDescription(d2 as unknown as NetworkDescription), {
      errorClass: InputError, code: 'bad-description', elements: ['coil'], message: [/element "coil" has kind "thyristor"; use 'resistor'/],
    });
    const d3 = plain() as unknown as Record<string, unknown>;
    delete d3.elements;
    expectError(() => validateDescription(d3 as unknown as NetworkDescription), {
      errorClass: InputError, code: 'bad-description', elements: ['elements'], message: [/"elements" is missing/],
    });
  });

  it('gives a bad number in a description the code the builder gives it', () => {
    const d = plain() as unknown as { elements: { turns?: number }[] };
    d.elements[1]!.turns = 0;
    expectError(() => validateDescription(d as unknown as NetworkDescription), {
      errorClass: InputError, code: 'non-positive-value', elements: ['coil'], message: [/winding "coil" turns is 0/],
    });
  });
});

describe('simulate option entries', () => {
  const cases: [string, Partial<SimulateOptions>, string, RegExp][] = [
    ['negative rtol', { rtol: -1e-6 }, 'bad-tolerance', /rtol -0.000001 must be in \(0, 1\)/],
    ['rtol of 1', { rtol: 1 }, 'bad-tolerance', /rtol 1 must be in \(0, 1\)/],
    ['negative atol', { atol: -1e-9 }, 'bad-tolerance', /atol -1e-9 must be > 0/],
    ['NaN atol per kind', { atol: { current: Number.NaN } }, 'bad-tolerance', /atol.current NaN must be > 0/],
    ['stop before start', { stopTime: 1e-3, startTime: 2e-3 }, 'bad-time-span', /stopTime 0.001 s must be a finite time after startTime 0.002 s/],
    ['stop equal to start', { stopTime: 0 }, 'bad-time-span', /stopTime 0 s must be a finite time after/],
    ['infinite stop', { stopTime: Infinity }, 'bad-time-span', /stopTime Infinity/],
    ['NaN start', { startTime: Number.NaN }, 'bad-option', /startTime NaN is not finite/],
    ['zero maxStep', { maxStep: 0 }, 'bad-option', /maxStep 0 must be > 0/],
    ['negative initialStep', { initialStep: -1e-6 }, 'bad-option', /initialStep -0.000001 must be > 0/],
    ['zero maxSteps', { maxSteps: 0 }, 'bad-option', /maxSteps 0 must be >= 1/],
    ['negative wall time', { maxWallTimeMs: -5 }, 'bad-option', /maxWallTimeMs -5 must be > 0/],
    ['zero sampling interval', { sampling: { interval: 0 } }, 'bad-option', /sampling interval 0 s must be a positive number/],
    ['NaN sampling time', { sampling: { times: [0, Number.NaN] } }, 'bad-option', /sampling times must lie in \[0, 0.001\] s/],
    ['sampling time after the stop', { sampling: { times: [0.5] } }, 'bad-option', /sampling times must lie in/],
  ];
  for (const [what, options, code, message] of cases) {
    it(`${code}: ${what}`, () => {
      expectError(() => simulate(base().net, { stopTime: 1e-3, ...options }), { errorClass: InputError, code, elements: ['options'], message: [/^simulate options: /, message] });
    });
  }

  it('a non-finite tolerance is refused with bad-tolerance', () => {
    const e = expectError(() => simulate(base().net, { stopTime: 1e-3, atol: Infinity }), { errorClass: InputError, code: 'bad-tolerance', elements: [], message: [/atol Infinity must be finite/] });
    expect(e.elements.length).toBeGreaterThan(0);
  });
});

describe('waveform entries through the builder (bad-waveform names the source)', () => {
  const cases: [string, WaveformSpec, RegExp][] = [
    ['non-finite sine amplitude', sine({ amplitude: Number.NaN, frequency: 50 }), /sine amplitude NaN is not finite/],
    ['infinite pulse level', pulse({ high: Infinity, period: 1e-3, duty: 0.5 }), /pulse high level Infinity is not a finite number/],
    ['non-finite table value', piecewiseLinear({ times: [0, 1e-3], values: [0, Number.NaN] }), /not a finite number/],
    ['pulse period zero', pulse({ high: 1, period: 0, duty: 0.5 }), /pulse period 0 s must be > 0/],
    ['bipolar square period zero', bipolarSquare({ amplitude: 1, period: 0 }), /bipolar square period 0 s must be > 0/],
    ['table period zero', piecewiseLinear({ times: [0], values: [1], period: 0 }), /piecewise-linear period 0 s must be > 0/],
    ['duty above 1', pulse({ high: 1, period: 1e-3, duty: 1.5 }), /pulse duty 1.5 is outside \[0, 1\]/],
    ['negative duty', pulse({ high: 1, period: 1e-3, duty: -0.1 }), /pulse duty -0.1 is outside \[0, 1\]/],
    ['unsorted table', piecewiseLinear({ times: [0, 2e-3, 1e-3], values: [0, 1, 2] }), /times must be strictly increasing.*sort the table/],
    ['unsorted function breakpoints', userFunction({ fn: () => 1, breakpoints: [2e-3, 1e-3], name: 'ramp' }), /breakpoints must be strictly increasing.*sort them/],
    ['sine frequency zero', sine({ amplitude: 1, frequency: 0 }), /sine frequency 0 Hz must be positive and finite/],
    ['unknown kind', { kind: 'square' } as unknown as WaveformSpec, /waveform kind "square" is not known/],
  ];
  for (const [what, spec, message] of cases) {
    it(what, () => {
      const { net, a } = base();
      expectError(() => net.currentSource('drive', a, net.ground, spec), { errorClass: InputError, code: 'bad-waveform', elements: ['drive'], message: [/^current source "drive": /, message] });
    });
  }
});

describe('result accessor entries', () => {
  function reluctanceNet() {
    const { net, m1, m2 } = base();
    const leak = net.reluctance('leak', { from: m1, to: m2, reluctance: 1e8 });
    return { net, leak, r: simulate(net, { stopTime: 1e-3 }) };
  }

  it('no-area: flux density of a reluctance without area', () => {
    const { leak, r } = reluctanceNet();
    expectError(() => r.fluxDensity(leak), { errorClass: InputError, code: 'no-area', elements: ['leak'], message: [/tube "leak" has no area/, /give the reluctance an area or read its flux/] });
  });

  it('no-length: field strength of a reluctance', () => {
    const { leak, r } = reluctanceNet();
    expectError(() => r.fieldStrength(leak), { errorClass: InputError, code: 'no-length', elements: ['leak'], message: [/tube "leak" is a reluctance without a length/, /read its mmf instead/] });
  });

  it('bad-sample: a state index past the end', () => {
    const { r } = reluctanceNet();
    expectError(() => r.state(r.length), { errorClass: InputError, code: 'bad-sample', elements: [], message: [new RegExp(`sample ${r.length} is outside 0\\.\\.${r.length - 1}`)] });
  });

  it('foreign-handle and wrong-handle-kind: reading a result with another network\'s handle or a node as an element', () => {
    const { r } = reluctanceNet();
    const other = base('other');
    expectError(() => r.flux(other.leg), { errorClass: InputError, code: 'foreign-handle', elements: ['leg'], message: [/not part of the simulated network "entries"/] });
    expectError(() => r.current(other.a as never), { errorClass: InputError, code: 'wrong-handle-kind', elements: [], message: [/expected a two-terminal element or winding handle, got a electric-node/] });
  });
});

describe('solver entries', () => {
  const ok: DaeProblem = { size: 1, y0: [1], t0: 0, tEnd: 1, rhs: (_t, y, out) => (out[0] = -y[0]!) };

  it('bad-problem and bad-jacobian', () => {
    expectError(() => solveDae(null as unknown as DaeProblem), { errorClass: InputError, code: 'bad-problem', elements: [], message: [/the problem must be an object/] });
    expectError(() => solveDae({ ...ok, jacobian: 3 as never }), { errorClass: InputError, code: 'bad-jacobian', elements: ['jacobian'], message: [/problem.jacobian must be a function/] });
  });

  it('bad-component, outside-solution and no-dense-output on a solution', () => {
    const sol = solveDae(ok);
    expectError(() => sol.component(1), { errorClass: InputError, code: 'bad-component', elements: ['index'], message: [/index must be an integer in 0\.\.0/] });
    expectError(() => sol.at(2), { errorClass: InputError, code: 'outside-solution', elements: ['t'], message: [/the solution covers \[0, 1\]/] });
    const coarse = solveDae(ok, { denseOutput: false });
    const mid = 0.5 * (coarse.t[0]! + coarse.t[1]!);
    expectError(() => coarse.at(mid), { errorClass: InputError, code: 'no-dense-output', elements: ['denseOutput'], message: [/run with denseOutput: true/] });
  });

  it('bad-stop-time, outside-last-step and bad-snapshot on the stepping integrator', () => {
    const integ = createDaeIntegrator(ok);
    expectError(() => integ.step(2), { errorClass: InputError, code: 'bad-stop-time', elements: ['tStop'], message: [/stop time 2 must be a finite time <= tEnd = 1/] });
    expectError(() => integ.advanceTo(Number.NaN), { errorClass: InputError, code: 'bad-stop-time', elements: ['tStop'], message: [/the time must lie in \[t, tEnd\]/] });
    expectError(() => integ.interpolate(0.5), { errorClass: InputError, code: 'outside-last-step', elements: ['t'], message: [/no step taken yet/] });
    integ.step();
    expectError(() => integ.interpolate(-1), { errorClass: InputError, code: 'outside-last-step', elements: ['t'], message: [/the last step covers/] });
    const two = createDaeIntegrator({ ...ok, size: 2, y0: [1, 1], rhs: (_t, y, out) => { out[0] = -y[0]!; out[1] = -y[1]!; } });
    expectError(() => integ.restore(two.snapshot()), { errorClass: InputError, code: 'bad-snapshot', elements: ['snapshot'], message: [/snapshot has 2 unknowns; this integrator has 1/] });
  });
});

describe('geometry, analysis and report entries', () => {
  it('empty-sections: core constants of no sections', () => {
    expectError(() => coreConstants([]), { errorClass: InputError, code: 'empty-sections', elements: [], message: [/no sections given; give at least one \{ length, area \}/] });
  });

  it('bad-loss-coefficients: a Steinmetz exponent that is not positive', () => {
    expectError(() => steinmetzLossDensity({ k: 1, alpha: 1.4, beta: -2 }, 1e4, 0.1, 'ferrite leg'), {
      errorClass: InputError, code: 'bad-loss-coefficients', elements: ['ferrite leg'], message: [/ferrite leg: Steinmetz beta = -2 must be a positive finite number/],
    });
  });

  it('report-series-empty and report-too-many-units', () => {
    expectError(() => renderSvgPlot({ title: 'empty', series: [{ label: 'v', unit: 'V', t: [], values: [] }] }), {
      errorClass: InputError, code: 'report-series-empty', elements: ['v'], message: [/series "v" has no samples; give at least one sample/],
    });
    const s = (label: string, unit: string) => ({ label, unit, t: [0, 1], values: [0, 1] });
    expectError(() => renderSvgPlot({ title: 'mixed', series: [s('v', 'V'), s('i', 'A'), s('b', 'T')] }), {
      errorClass: InputError, code: 'report-too-many-units', elements: ['mixed'], message: [/plot "mixed" mixes 3 units/, /split it into groups of at most two units/],
    });
  });
});
