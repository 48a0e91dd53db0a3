import { flybackWithClamp } from '../bench/devices.js';
import { simulate } from '../src/index.js';
const r = simulate(flybackWithClamp({ forwardVoltage: 0.5, onResistance: 0.01 }), { stopTime: 20 * 10e-6 });
console.log(r.status, r.energy());
