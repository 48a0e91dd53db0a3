/**
 * Converter circuits for the converter tests (test values of our own): a
 * flyback and a single-switch forward converter with a reset winding, each
 * on a core whose inductances follow from the magnetic circuit law
 * (L = N^2 / R_m) so that the hand formulas can use them exactly.
 */
import { constant, createNetwork, MU0, pulse, type MaterialSpec } from '../../src/index.js';

/** Core of the flyback: a linear core path in series with a constant-reluctance air gap. */
export const CORE = { length: 0.05, area: 5e-5, relativePermeability: 2000 } as const;

export interface FlybackParameters {
  readonly vin: number;
  readonly period: number;
  readonly duty: number;
  /** Primary and secondary turns. */
  readonly n1: number;
  readonly n2: number;
  /** Magnetising inductance seen from the primary, H (sets the gap). */
  readonly lm: number;
  readonly load: number;
  readonly capacitance: number;
  readonly diodeForward: number;
  readonly diodeOn: number;
  readonly switchOn: number;
  /** Series leakage inductance of the primary, H (0: none). */
  readonly leakage?: number;
  /** An RCD clamp across the primary (clamp capacitor, its bleed resistor). */
  readonly clamp?: { readonly capacitance: number; readonly resistance: number };
  /** Initial output voltage, V. */
  readonly initialVoltage?: number;
  readonly junction?: 'ideal' | 'exponential';
}

/** Reluctance of the core path, A/Wb (magnetic circuit law R = l / (mu0 mu_r A)). */
export const coreReluctance = CORE.length / (MU0 * CORE.relativePermeability * CORE.area);

/**
 * A flyback: supply, primary, gate-driven switch to ground; secondary wound
 * so that it carries the flux on when the switch opens, into a diode, an
 * output capacitor and a load resistor.
 */
export function flyback(p: FlybackParameters) {
  const net = createNetwork('flyback');
  const [m1, m2] = [net.magneticNode('m1'), net.magneticNode('m2')];
  const leg = net.fluxTube('core', { from: m1, to: m2, length: CORE.length, area: CORE.area, material: { kind: 'linear', relativePermeability: CORE.relativePermeability } });
  const gapReluctance = (p.n1 * p.n1) / p.lm - coreReluctance;
  if (!(gapReluctance > 0)) throw new Error('flyback test circuit: lm too large for the core');
  net.reluctance('gap', { from: m2, to: m1, reluctance: gapReluctance, area: CORE.area });
  const vin = net.node('vin');
  const top = p.leakage ? net.node('top') : vin;
  const drain = net.node('drain');
  const sec = net.node('sec');
  const out = net.node('out');
  const supply = net.voltageSource('supply', vin, net.ground, constant(p.vin));
  const leakage = p.leakage ? net.inductor('leakage', vin, top, p.leakage) : undefined;
  const primary = net.winding('primary', { tube: leg, turns: p.n1, plus: top, minus: drain });
  const gate = pulse({ high: 1, period: p.period, duty: p.duty });
  const sw = net.switch('Q1', drain, net.ground, { gate, onResistance: p.switchOn, offConductance: 1e-7 });
  // Wound the other way round: current entering at ground drives the flux on while the switch is off.
  const secondary = net.winding('secondary', { tube: leg, turns: p.n2, plus: net.ground, minus: sec });
  const junction = p.junction ?? 'ideal';
  const diode = net.diode('D1', sec, out, junction === 'ideal'
    ? { forwardVoltage: p.diodeForward, onResistance: p.diodeOn, offConductance: 1e-9 }
    : { junction: 'exponential', saturationCurrent: 1e-9, emissionCoefficient: 1.5, onResistance: p.diodeOn, offConductance: 1e-9 });
  const output = net.capacitor('C1', out, net.ground, p.capacitance, { initialVoltage: p.initialVoltage ?? 0 });
  const load = net.resistor('load', out, net.ground, p.load);
  let clamp;
  if (p.clamp) {
    const c = net.node('clamp');
    const clampDiode = net.diode('Dc', drain, c, junction === 'ideal'
      ? { forwardVoltage: p.diodeForward, onResistance: p.diodeOn, offConductance: 1e-9 }
      : { junction: 'exponential', saturationCurrent: 1e-9, emissionCoefficient: 1.5, onResistance: p.diodeOn, offConductance: 1e-9 });
    const clampCapacitor = net.capacitor('Cc', c, vin, p.clamp.capacitance);
    const bleed = net.resistor('Rc', c, vin, p.clamp.resistance);
    clamp = { clampDiode, clampCapacitor, bleed };
  }
  return { net, leg, supply, primary, sw, secondary, diode, output, load, leakage, clamp };
}

export interface ForwardParameters {
  readonly vin: number;
  readonly period: number;
  readonly duty: number;
  readonly n1: number;
  /** Reset winding turns. */
  readonly n3: number;
  readonly n2: number;
  readonly diodeForward: number;
  readonly material: MaterialSpec;
  readonly area: number;
  readonly length: number;
  /** Load resistance, ohm. */
  readonly load: number;
  /** Output capacitor voltage and choke current at the start (a converter already running). */
  readonly initialOutput?: { readonly voltage: number; readonly current: number };
}

/**
 * A single-switch forward converter: primary and switch; a reset winding
 * returning the magnetising energy to the supply through a diode; a
 * secondary with a rectifier, a freewheeling diode, an output inductor, a
 * capacitor and a load.
 */
export function forward(p: ForwardParameters) {
  const net = createNetwork('forward converter');
  const [m1, m2] = [net.magneticNode('m1'), net.magneticNode('m2')];
  const leg = net.fluxTube('core', { from: m1, to: m2, length: p.length / 2, area: p.area, material: p.material });
  net.fluxTube('return', { from: m2, to: m1, length: p.length / 2, area: p.area, material: p.material });
  const vin = net.node('vin');
  const drain = net.node('drain');
  const reset = net.node('reset');
  const sec = net.node('sec');
  const x = net.node('x');
  const out = net.node('out');
  const supply = net.voltageSource('supply', vin, net.ground, constant(p.vin));
  const primary = net.winding('primary', { tube: leg, turns: p.n1, resistance: 0.005, plus: vin, minus: drain });
  const sw = net.switch('Q1', drain, net.ground, { gate: pulse({ high: 1, period: p.period, duty: p.duty }), onResistance: 0.005, offConductance: 1e-7 });
  const diode = { forwardVoltage: p.diodeForward, onResistance: 0.005, offConductance: 1e-9 };
  // Reset winding: current from ground through D3 into its plus terminal keeps the flux on and returns to the supply.
  const resetWinding = net.winding('reset winding', { tube: leg, turns: p.n3, resistance: 0.005, plus: reset, minus: vin });
  const resetDiode = net.diode('D3', net.ground, reset, diode);
  const secondary = net.winding('secondary', { tube: leg, turns: p.n2, resistance: 0.005, plus: sec, minus: net.ground });
  const rectifier = net.diode('D1', sec, x, diode);
  const freewheel = net.diode('D2', net.ground, x, diode);
  const start = p.initialOutput ?? { voltage: 0, current: 0 };
  const choke = net.inductor('Lo', x, out, 20e-6, { initialCurrent: start.current });
  const output = net.capacitor('Co', out, net.ground, 47e-6, { initialVoltage: start.voltage });
  const load = net.resistor('load', out, net.ground, p.load);
  return { net, leg, supply, primary, sw, resetWinding, resetDiode, secondary, rectifier, freewheel, choke, output, load };
}
