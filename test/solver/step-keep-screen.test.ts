import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { nextStepSize, surelyKeepsStep as screenOf, type AcceptedStep } from '../../src/solver/step-size-controller.js';

const surelyKeepsStep = (h: number, err: number, newtonIterations: number, hAcc: number, errAcc: number, maxStep: number, rejected: boolean): boolean =>
  screenOf({ h, err, newtonIterations, hAcc, errAcc, maxStep, rejected });

/**
 * radau5's step-size proposal on an accepted step, written out from its
 * published source (Hairer and Wanner, radau5.f, the step-size control after
 * ESTRAD; book: Solving ODEs II, sect. IV.8, eq. 8.25): FAC = min(SAFE,
 * CFAC/(NEWT + 2 NIT)), QUOT = max(FACR, min(FACL, ERR^0.25/FAC)), the
 * predictive FACGUS = (HACC/H) (ERR^2/ERRACC)^0.25/SAFE bounded the same way,
 * QUOT = max(QUOT, FACGUS), HNEW = H/QUOT capped by HMAX and, after a
 * rejection, by H; H is kept when 1 <= HNEW/H <= 1.2 (QUOT1, QUOT2). SAFE =
 * 0.9, NIT = 7, FACR = 1/8, FACL = 5 (radau5's defaults).
 */
function radau5Next(h: number, err: number, newt: number, hAcc: number, errAcc: number, hMax: number, reject: boolean, newJacobian: boolean): number {
  const safe = 0.9;
  const nit = 7;
  const bound = (q: number) => Math.max(1 / 8, Math.min(5, q));
  const fac = Math.min(safe, (safe * (1 + 2 * nit)) / (newt + 2 * nit));
  let quot = bound(err ** 0.25 / fac);
  if (!Number.isNaN(hAcc)) quot = Math.max(quot, bound(((hAcc / h) * ((err * err) / errAcc) ** 0.25) / safe));
  let hNew = Math.min(h / quot, hMax);
  if (reject) hNew = Math.min(hNew, h);
  const qt = hNew / h;
  return !newJacobian && qt >= 1 && qt <= 1.2 ? h : hNew;
}

function radau5Keeps(h: number, err: number, newt: number, hAcc: number, errAcc: number, hMax: number, reject: boolean): boolean {
  return radau5Next(h, err, newt, hAcc, errAcc, hMax, reject, false) === h;
}

const decades = (lo: number, hi: number) => fc.double({ min: lo, max: hi, noNaN: true }).map((e) => 10 ** e);

describe('surelyKeepsStep', () => {
  it('says "keep" only where radau5 keeps h, on random errors and histories', () => {
    let kept = 0;
    let decided = 0;
    fc.assert(
      fc.property(
        decades(-1, 0).map((e) => Math.min(e, 0.999999)),
        fc.integer({ min: 1, max: 7 }),
        fc.oneof(fc.constant(Number.NaN), decades(-2, 2)),
        decades(-2, 0),
        decades(-1, 3),
        fc.boolean(),
        (err, newt, hAccRatio, errAcc, hMax, reject) => {
          const h = 0.37;
          const hAcc = hAccRatio * h;
          const exact = radau5Keeps(h, err, newt, hAcc, errAcc, hMax, reject);
          const screen = surelyKeepsStep(h, err, newt, hAcc, errAcc, hMax, reject);
          if (screen) expect(exact).toBe(true);
          if (exact) kept++;
          if (exact && screen) decided++;
        },
      ),
      { numRuns: 50000 },
    );
    // The point of the screen: nearly every kept step is decided without the powers.
    expect(decided).toBeGreaterThan(0.99 * kept);
  });

  it('nextStepSize gives the next step of radau5 exactly, with and without a fresh Jacobian', () => {
    fc.assert(
      fc.property(
        decades(-10, 0).map((e) => Math.min(e, 0.999999)),
        fc.integer({ min: 1, max: 7 }),
        fc.oneof(fc.constant(Number.NaN), decades(-2, 2)),
        decades(-2, 0),
        decades(-1, 3),
        fc.boolean(),
        fc.boolean(),
        (err, newt, hAccRatio, errAcc, hMax, reject, newJacobian) => {
          const h = 0.37;
          const s: AcceptedStep = { h, err, newtonIterations: newt, hAcc: hAccRatio * h, errAcc, maxStep: hMax, rejected: reject, recomputeJacobian: newJacobian, hNext: 0 };
          nextStepSize(s);
          expect(s.hNext).toBe(radau5Next(h, err, newt, hAccRatio * h, errAcc, hMax, reject, newJacobian));
        },
      ),
      { numRuns: 50000 },
    );
  });

  it('at the edges of the keep band, defers to the powers', () => {
    // err^0.25/0.9 = 1 exactly at err = 0.9^4: h/quot = h, on the lower edge.
    const err = 0.9 ** 4;
    expect(surelyKeepsStep(1, err, 1, Number.NaN, Number.NaN, 10, false)).toBe(false);
    // A rejection before caps hNew (1.07 h here) at h: qt = 1 exactly, kept, decided by the cap.
    expect(surelyKeepsStep(1, 0.5, 1, Number.NaN, Number.NaN, 10, true)).toBe(true);
    expect(radau5Keeps(1, 0.5, 1, Number.NaN, Number.NaN, 10, true)).toBe(true);
    // maxStep 1.1 h caps a proposal of 1.5 h: kept, decided by the cap.
    expect(surelyKeepsStep(1, 0.6 ** 4 * 0.9 ** 4, 1, Number.NaN, Number.NaN, 1.1, false)).toBe(true);
    // Clearly inside the band: err^0.25/0.9 = 0.9 gives hNew/h = 1.11.
    expect(surelyKeepsStep(1, 0.9 ** 8, 1, Number.NaN, Number.NaN, 10, false)).toBe(true);
    expect(radau5Keeps(1, 0.9 ** 8, 1, Number.NaN, Number.NaN, 10, false)).toBe(true);
  });
});
