/**
 * Source waveforms: build specs, compile them, print values, breakpoints and
 * per-period averages. Run with `npx tsx examples/waveforms.ts`.
 * All values are invented for the example.
 */
import {
  bipolarSquare,
  bipolarSquareOnTimes,
  compileWaveform,
  piecewiseLinear,
  pulse,
  userFunction,
  type Waveform,
} from '../src/index.js';

/** Exact integral of a waveform that is linear between its breakpoints (midpoint rule per interval). */
function integrate(w: Waveform, a: number, b: number): number {
  const nodes = [a, ...w.breakpoints(a, b).filter((x) => x > a && x < b), b];
  let sum = 0;
  for (let i = 0; i + 1 < nodes.length; i++) {
    const lo = nodes[i] ?? 0;
    const hi = nodes[i + 1] ?? 0;
    sum += (hi - lo) * w.value(0.5 * (lo + hi));
  }
  return sum;
}

// A 0/15 V gate drive at 20 kHz, 30 % duty, 50 ns edges, first pulse at 10 us.
const gateSpec = pulse({ low: 0, high: 15, period: 50e-6, duty: 0.3, delay: 10e-6, rise: 50e-9, fall: 50e-9 });
const gate = compileWaveform(gateSpec, 'Vgate');
console.log('gate spec (plain data):', JSON.stringify(gateSpec));
console.log('gate edges in the first 120 us:', gate.breakpoints(0, 120e-6).map((t) => (t * 1e6).toFixed(3) + ' us').join(', '));
console.log('gate mean over one period:', integrate(gate, 10e-6, 60e-6) / 50e-6, 'V (expected 0.3 * 15 = 4.5 V)');

// A 100 kHz, 48 V bridge with 200 ns dead time whose positive half conducts 20 ns longer.
const bridgeSpec = bipolarSquare({ amplitude: 48, period: 10e-6, deadTime: 200e-9, mismatch: 20e-9 });
const bridge = compileWaveform(bridgeSpec, 'Vbridge');
const on = bipolarSquareOnTimes(bridgeSpec);
console.log('bridge on-times:', on.positive * 1e9, 'ns and', on.negative * 1e9, 'ns');
console.log('volt-seconds, positive half:', integrate(bridge, 0, 5e-6), 'V s; negative half:', integrate(bridge, 5e-6, 10e-6), 'V s');
console.log('net volt-seconds per period:', integrate(bridge, 0, 10e-6), 'V s (expected 48 * 20 ns = 9.6e-7 V s)');
const late = 1_000_000 * 10e-6; // one million periods in
console.log('edges one million periods in:', bridge.breakpoints(late, late + 10e-6));

// A soft start: ramp to 10 V in 1 ms, then hold.
const soft = compileWaveform(piecewiseLinear({ times: [0, 1e-3], values: [0, 10] }), 'Vsoft');
console.log('soft start at 0.25 ms and 2 ms:', soft.value(0.25e-3), soft.value(2e-3));

// A user function with a declared breakpoint; a bad value names the source and time.
const clipped = compileWaveform(
  userFunction({ fn: (t) => (t < 0 ? 0 : Math.min(1, Math.sqrt(t / 1e-3))), breakpoints: [0, 1e-3], name: 'sqrt ramp' }),
  'Vsqrt',
);
console.log('sqrt ramp at 0.25 ms:', clipped.value(0.25e-3));
const broken = compileWaveform(userFunction({ fn: (t) => Math.log(t), name: 'log' }), 'Vlog');
try {
  broken.value(-1);
} catch (e) {
  console.log('error from a bad function:', (e as Error).message);
}
