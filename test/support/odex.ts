/** odex 2.0.4 loaded through require, typed by test/types/odex.d.ts (see there why). */
import { createRequire } from 'node:module';
import type { OdexModule } from '../types/odex.js';

const require = createRequire(import.meta.url);

/** odex's Solver class: `new Solver(n)`, tolerances as fields, `solve(f, x0, y0, xEnd)`. */
export const { Solver } = require('odex') as OdexModule;
