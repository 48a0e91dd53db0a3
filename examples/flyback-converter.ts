/**
 * A flyback converter with an ideal output diode and a gate-driven switch:
 * its periodic steady state in continuous conduction against the textbook
 * relation Vout = n D Vin / (1 - D) - Vf (volt-second balance on the
 * magnetising inductance; Erickson and Maksimovic, Fundamentals of Power
 * Electronics, ch. 6), then 300 periods with 1 uH leakage inductance and an
 * RCD clamp, where every diode turn-on and turn-off is an event.
 *
 *     npx tsx examples/flyback-converter.ts
 *
 * Everything is invented (24 V in, 100 kHz, a 2:1 gapped transformer with
 * 100 uH magnetising inductance); it describes no real product.
 *
 * CAUTION: engineering estimates from a model and its inputs. The switch
 * voltage stress and the clamp's dissipation decide component ratings:
 * verify against measurements and the parts' data; local codes and licensed
 * practice govern.
 */
import { periodicSteadyState, simulate } from '../src/index.js';
import { FLYBACK, flybackConverter, idealFlybackOutput } from './scenarios/flyback.js';

const T = 1 / FLYBACK.frequency;
const D = FLYBACK.duty;
const n = FLYBACK.secondaryTurns / FLYBACK.primaryTurns;

/** Mean of f over [a, b] (midpoint rule on a fine grid of the dense output). */
function mean(f: (t: number) => number, a: number, b: number, points = 2000): number {
  let s = 0;
  for (let k = 0; k < points; k++) s += f(a + ((k + 0.5) * (b - a)) / points);
  return s / points;
}

// 1. No leakage: the periodic steady state by shooting (its period map crosses the commutations).
const ideal = flybackConverter({ clamp: false, initialOutput: idealFlybackOutput() });
const pss = periodicSteadyState(ideal.net, { period: T, rtol: 1e-8 });
if (pss.status !== 'converged') throw new Error(`periodic steady state: ${pss.message}`);
const vout = mean(pss.result.evaluator({ quantity: 'voltage', handle: ideal.output }), 0, T);
const ip = pss.result.evaluator({ quantity: 'current', handle: ideal.primary });
console.log(`periodic steady state after ${pss.iterations} Newton iterations (${pss.periods} periods simulated)`);
console.log(`CCM output (periodic steady state): ${vout.toFixed(3)} V; ideal relation n D Vin/(1 - D) - Vf = ${idealFlybackOutput().toFixed(3)} V`);
console.log(`  the difference ${(idealFlybackOutput() - vout).toFixed(3)} V is the resistive drops (switch, windings, diode)`);
console.log(`primary current ${ip(1e-9).toFixed(3)} A at turn-on, ${ip(D * T * (1 - 1e-9)).toFixed(3)} A at turn-off (ripple Vin D T / Lm = ${((FLYBACK.vin * D * T) / FLYBACK.magnetising).toFixed(3)} A)`);

// 2. With 1 uH leakage and an RCD clamp: 300 periods from the ideal output voltage.
const clamped = flybackConverter({ initialOutput: idealFlybackOutput() });
const run = simulate(clamped.net, { stopTime: 300 * T, rtol: 1e-6 });
if (run.status !== 'success') throw new Error(`flyback run: ${run.message}`);
const last = (handle: Parameters<typeof run.evaluator>[0]) => mean(run.evaluator(handle), 299 * T, 300 * T);
const vClamp = last({ quantity: 'voltage', handle: clamped.clamp!.clampCapacitor });
const vSw = run.voltage(clamped.sw);
const peakSwitch = vSw.reduce((m, v) => Math.max(m, v), 0);
const audit = run.energy();
console.log(`\nwith 1 uH leakage and an RCD clamp, 300 periods: ${run.stats.acceptedSteps} steps`);
console.log(`  output ${last({ quantity: 'voltage', handle: clamped.output }).toFixed(3)} V (the leakage delays the transfer at turn-off)`);
console.log(`  clamp capacitor ${vClamp.toFixed(2)} V above the supply; reflected output (Vout + Vf)/n = ${((idealFlybackOutput() + FLYBACK.diodeForward) / n).toFixed(2)} V`);
console.log(`  peak switch voltage ${peakSwitch.toFixed(1)} V`);
console.log(`  energy audit: relative error ${audit.relativeError.toExponential(1)}`);
console.log('\nCaution: engineering estimates from a model with invented values; verify against measurements before choosing parts.');
