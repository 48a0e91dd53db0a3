/**
 * One seed for every property test, so that `npm test` (and CI) is reproducible: a run on
 * the same tree decides the same way. Exploration is the soak's job: with FLUXSTATE_SOAK set
 * each run draws a fresh seed (printed by fast-check on a failure), and FLUXSTATE_SEED
 * replays one. Common practice for property tests in CI (fast-check's `configureGlobal`).
 */
import fc from 'fast-check';

/** The seed of plain `npm test` runs (any fixed integer; changed only on purpose). */
export const DEFAULT_PROPERTY_SEED = 20261204;

const replay = process.env.FLUXSTATE_SEED;
const soak = process.env.FLUXSTATE_SOAK;
if (replay) fc.configureGlobal({ seed: Number(replay) });
else if (soak === undefined || soak === '' || soak === '0') fc.configureGlobal({ seed: DEFAULT_PROPERTY_SEED });
