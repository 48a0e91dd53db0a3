/**
 * A larger network through the public API: a chain of 40 transformers (our
 * own values: saturating cores of two tubes each, 200:200 turns, a 50 ohm
 * load on every secondary, a 50 Hz, 100 V sine behind 1 ohm at the head).
 * With 163 unknowns it is above SPARSE_MIN_SIZE, so the run factors on the
 * Jacobian pattern recorded from the elements' stamps at compile time, and
 * finds the null spaces of the mass matrix from its structure (no dense
 * SVD). Each stage loads the one before: the voltage falls along the chain.
 * Run with `npx tsx examples/transformer-ladder.ts`.
 */
import { createNetwork, simulate, sine, SPARSE_MIN_SIZE } from '../src/index.js';

const stages = 40;
const net = createNetwork(`ladder of ${stages} transformers`);
const material = { kind: 'frohlich-kennelly', initialRelativePermeability: 3000, saturationPolarisation: 1.5 } as const;
const s = net.node('s');
net.voltageSource('src', s, net.ground, sine({ amplitude: 100, frequency: 50 }));
let x = net.node('x0');
net.resistor('rs', s, x, 1);
const taps = [x];
for (let j = 0; j < stages; j++) {
  const a = net.magneticNode(`a${j}`);
  const b = net.magneticNode(`b${j}`);
  const leg = net.fluxTube(`leg${j}`, { from: a, to: b, length: 0.1, area: 1e-3, material });
  net.fluxTube(`yoke${j}`, { from: b, to: a, length: 0.2, area: 1e-3, material });
  const next = net.node(`x${j + 1}`);
  net.winding(`p${j}`, { tube: leg, turns: 200, resistance: 0.5, plus: x, minus: net.ground });
  net.winding(`s${j}`, { tube: leg, turns: 200, resistance: 0.5, plus: next, minus: net.ground });
  net.resistor(`load${j}`, next, net.ground, 50);
  x = next;
  taps.push(x);
}

const result = simulate(net, { stopTime: 0.06 });
// Unknowns: 4 per stage and 3 at the head (node potentials, winding and source currents, loop fluxes).
console.log(`${stages} stages, ${4 * stages + 3} unknowns (sparse LU from ${SPARSE_MIN_SIZE})`);
console.log(`status: ${result.status}, ${result.stats.acceptedSteps} steps, ${result.stats.luFactorizations} LU factorisations`);
const last = result.time.length - 1;
const peak = (node: (typeof taps)[number]): number => {
  const v = result.potential(node);
  let m = 0;
  for (let i = 0; i < v.length; i++) if (result.time[i]! >= 0.04) m = Math.max(m, Math.abs(v[i]!));
  return m;
};
for (const j of [0, 1, 10, 40]) console.log(`peak voltage at stage ${String(j).padStart(2)} over the third cycle: ${peak(taps[j]!).toFixed(2)} V`);
console.log(`(ends at t = ${result.time[last]!.toFixed(3)} s; invented values, a solver demonstration, not a design)`);
