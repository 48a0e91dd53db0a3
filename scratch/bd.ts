import { benchDevices } from '../bench/devices.js';
benchDevices(Number(process.argv[2] ?? 300));
