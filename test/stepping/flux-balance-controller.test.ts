import { describe, expect, it } from 'vitest';
import { FAULT_NS, runConverter } from '../../examples/flux-balance-controller.js';

describe('examples/flux-balance-controller: a controller embedded through the stepping interface', () => {
  it('cancels the on-time fault and holds the DC flux offset at zero, where open loop walks away', () => {
    // Volt-second balance (DERIVED): a zero mean flux density with a zero mean magnetising current needs
    // a zero mean drive voltage, i.e. a correction equal and opposite to the fault. Two things keep the
    // equilibrium from being exactly that: the controller zeroes its own estimate of the mean (40 samples
    // per period), and with unequal half-cycles the mean of the odd H(B(t)) is not exactly zero, so the
    // winding resistance takes a little DC voltage. We assert the correction within 0.5 % of the fault
    // (measured -100.02 ns after 300 periods, -99.92 ns after 900).
    const closed = runConverter(true, 300);
    const open = runConverter(false, 300);
    const lastClosed = closed.meanB[closed.meanB.length - 1]!;
    const lastOpen = open.meanB[open.meanB.length - 1]!;
    expect(Math.abs(lastClosed)).toBeLessThan(1e-4);
    expect(Math.abs(closed.correction * 1e9 + FAULT_NS)).toBeLessThan(0.005 * FAULT_NS);
    expect(lastOpen).toBeGreaterThan(0.2);
    expect(closed.peakB).toBeLessThan(open.peakB);
  });
});
