import { flyback } from './flyback-lib.js';
import { NetworkRun } from '../src/simulation/network-run.js';
import { acceptNetwork } from '../src/simulation/accept-network.js';
const periods = Number(process.argv[2] ?? 100);
const net = flyback(true, false);
const t0 = Date.now();
const run = new NetworkRun(acceptNetwork(net, 'x').compiled, { t0: 0, horizon: periods * 10e-6, rtol: 1e-6, atol: 1e-6 } as any);
run.advanceTo(periods * 10e-6, { steps: false, interpolants: false });
console.log(run.status, Date.now() - t0, 'ms', 'events', run.deviceEvents, 'changes', run.deviceChanges.length, run.stats);
